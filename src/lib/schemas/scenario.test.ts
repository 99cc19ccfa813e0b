import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { BETZ_LIMIT, formatIssuePath, parseScenario, scenarioSchema, SCHEMA_VERSION } from './scenario';
import { SCENARIO_LIMITS } from './scenario-limits';
import { atbCaseInput } from '../server/engine/testing/fixtures';

const withPatch = (patch: (doc: Record<string, any>) => void) => {
	const doc = structuredClone(atbCaseInput) as Record<string, any>;
	patch(doc);
	return parseScenario(doc);
};

describe('parseScenario', () => {
	it('fills the stated defaults', () => {
		const r = parseScenario(atbCaseInput);
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.scenario.site.waterDensityKgPerM3).toBe(1025);
		expect(r.scenario.site.gravityMPerS2).toBe(9.80665);
		expect(r.scenario.hoursPerYear).toBe(8760);
		expect(r.scenario.finance.debt).toEqual({ sizing: 'none' });
		expect(r.scenario.uncertainty.exceedanceLevels).toEqual([90]);
	});

	it('refuses a power coefficient above the Betz limit, naming it', () => {
		// Lanchester-Betz: Cp <= 16/27 = 0.5926 for any open rotor.
		const r = withPatch((d) => (d.device = { kind: 'rotor', rotorDiameterM: 20, powerCoefficient: 0.6, ratedPowerKW: 1000, cutOutSpeedMPerS: 4 }));
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.issues).toEqual([{ path: 'device.powerCoefficient', message: expect.stringMatching(/Betz limit 16\/27/) }]);
		const atLimit = withPatch((d) => (d.device = { kind: 'rotor', rotorDiameterM: 20, powerCoefficient: BETZ_LIMIT, ratedPowerKW: 1000, cutOutSpeedMPerS: 4 }));
		expect(atLimit.ok).toBe(true);
	});

	it('names the field path of each problem with dotted keys and indices', () => {
		const r = withPatch((d) => {
			d.capex.lines = [{ name: 'a', basis: 'lump-sum', amount: 1 }, { name: 'b', basis: 'lump-sum', amount: 1 }, { name: 'c', basis: 'lump-sum', amount: -5 }];
			d.array.availability = 1.5;
		});
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.issues.map((i) => i.path).sort()).toEqual(['array.availability', 'capex.lines[2].amount']);
	});

	it('checks that resource and device fit the technology', () => {
		const r = withPatch((d) => (d.technology = 'wave'));
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.issues.map((i) => i.path)).toEqual(['resource.kind', 'device.kind']);
	});

	it('checks phasing length and sum, matrix shape and loan terms', () => {
		const phasing = withPatch((d) => {
			d.timeline.constructionYears = 2;
			d.capex.phasing = [0.5, 0.6];
		});
		expect(!phasing.ok && phasing.issues[0]).toEqual({ path: 'capex.phasing', message: 'phasing must sum to 1, sums to 1.1' });
		const tenor = withPatch((d) => (d.finance.debt = { sizing: 'gearing', gearing: 0.5, interestRate: 0.05, tenorYears: 30 }));
		expect(!tenor.ok && tenor.issues[0].path).toBe('finance.debt.tenorYears');
		const matrix = withPatch((d) => {
			d.technology = 'wave';
			d.resource = { kind: 'sea-state', hsM: 2, periodS: 8 };
			d.device = { kind: 'power-matrix', hsM: [1, 2], periodS: [6, 7, 8], powerKW: [[1, 2, 3], [4, 5]] };
		});
		expect(!matrix.ok && matrix.issues[0].path).toBe('device.powerKW[1]');
	});

	it('refuses a schema version newer than the code reads, a missing one and a malformed one, saying which', () => {
		const newer = withPatch((d) => (d.schemaVersion = SCHEMA_VERSION + 1));
		expect(!newer.ok && newer.issues).toEqual([{ path: 'schemaVersion', message: expect.stringMatching(new RegExp(`^schemaVersion ${SCHEMA_VERSION + 1} is newer than this Tidewright reads \\(versions 1 to ${SCHEMA_VERSION}\\)`)) }]);
		const missing = withPatch((d) => delete d.schemaVersion);
		expect(!missing.ok && missing.issues).toEqual([{ path: 'schemaVersion', message: expect.stringMatching(/^schemaVersion is missing/) }]);
		for (const bad of ['2', 1.5, 0, null]) {
			const r = withPatch((d) => (d.schemaVersion = bad));
			expect(!r.ok && r.issues[0].message).toMatch(new RegExp(`^schemaVersion must be a whole number from 1 to ${SCHEMA_VERSION}`));
		}
		const notObject = parseScenario([1, 2]);
		expect(!notObject.ok && notObject.issues).toEqual([{ path: '(document)', message: 'a scenario document must be a JSON object' }]);
	});

	it('upgrades a version 1 document before checking it, and says which steps ran', () => {
		const r = withPatch((d) => {
			d.schemaVersion = 1;
			d.decommissioning = { basis: 'percent-of-capex', amount: 0.05 };
		});
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.upgradedFrom).toBe(1);
		expect(r.upgradeNotes).toEqual(['decommissioning.amount moved to decommissioning.fraction (percent-of-capex)']);
		expect(r.scenario.schemaVersion).toBe(SCHEMA_VERSION);
		expect(r.scenario.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		const current = parseScenario(atbCaseInput);
		expect(current.ok && current.upgradedFrom).toBeNull();
		expect(current.ok && current.upgradeNotes).toEqual([]);
	});

	it('refuses in version 2 an amount on a share-of-capex basis, and a fraction on a money basis', () => {
		const amount = withPatch((d) => (d.decommissioning = { basis: 'percent-of-capex', amount: 0.05 }));
		expect(!amount.ok && amount.issues).toEqual([{ path: 'decommissioning.amount', message: '"amount" is not a field here; the fields here are basis, fraction' }]);
		const fraction = withPatch((d) => (d.revenue.grants = [{ name: 'Fund', basis: 'lump-sum', fraction: 0.2 }]));
		expect(!fraction.ok && fraction.issues.map((i) => i.path).sort()).toEqual(['revenue.grants[0].amount', 'revenue.grants[0].fraction']);
		const share = withPatch((d) => (d.revenue.grants = [{ name: 'Fund', basis: 'percent-of-capex', fraction: 1.2 }]));
		expect(!share.ok && share.issues[0].path).toBe('revenue.grants[0].fraction');
	});
});

describe('parseScenario: reserves and covenants', () => {
	const issuesOf = (patch: (doc: Record<string, any>) => void) => {
		const r = withPatch(patch);
		return r.ok ? [] : r.issues;
	};

	it('leaves both out when absent, and fills the stated defaults when present', () => {
		const absent = parseScenario(atbCaseInput);
		expect(absent.ok && [absent.scenario.finance.reserves, absent.scenario.finance.covenants]).toEqual([undefined, undefined]);
		const r = withPatch((d) => {
			d.finance.reserves = { debtService: {}, maintenance: {} };
			d.finance.covenants = { cashSweep: { share: 0.5 } };
		});
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.scenario.finance.reserves).toEqual({ debtService: { months: 6, funding: 'from-funding' }, maintenance: {} });
		expect(r.scenario.finance.covenants).toEqual({ cashSweep: { share: 0.5, when: 'always' } });
	});

	it('refuses a default DSCR above the lock-up DSCR, naming the default', () => {
		expect(issuesOf((d) => (d.finance.covenants = { lockUpDscr: 1.1, defaultDscr: 1.2 }))).toEqual([
			{ path: 'finance.covenants.defaultDscr', message: 'the default DSCR (1.2) must not exceed the lock-up DSCR (1.1)' }
		]);
		expect(issuesOf((d) => (d.finance.covenants = { lockUpDscr: 1.2, defaultDscr: 1.2 }))).toEqual([]);
		expect(issuesOf((d) => (d.finance.covenants = { defaultDscr: 0.9 }))[0].path).toBe('finance.covenants.defaultDscr');
	});

	it('refuses a sweep in lock-up without a lock-up DSCR', () => {
		expect(issuesOf((d) => (d.finance.covenants = { cashSweep: { share: 1, when: 'in-lock-up' } }))).toEqual([
			{ path: 'finance.covenants.cashSweep.when', message: 'a sweep in lock-up needs a lock-up DSCR (finance.covenants.lockUpDscr)' }
		]);
	});

	it('bounds the reserve sizes and funding years, naming the field', () => {
		expect(issuesOf((d) => (d.finance.reserves = { debtService: { months: 25 } }))[0].path).toBe('finance.reserves.debtService.months');
		expect(issuesOf((d) => (d.finance.reserves = { maintenance: { fundingYears: 2.5 } }))[0].path).toBe('finance.reserves.maintenance.fundingYears');
		expect(issuesOf((d) => (d.finance.reserves = { decommissioning: { fundingYears: 21 } }))).toEqual([
			{ path: 'finance.reserves.decommissioning.fundingYears', message: 'funding years (21) must not exceed the operating life (20 years)' }
		]);
	});
});

describe('parseScenario: assessed energy and uncertainty kinds', () => {
	const assessed = (resource: Record<string, unknown>, patch: (doc: Record<string, any>) => void = () => {}) => {
		const r = withPatch((d) => {
			d.resource = { kind: 'assessed-energy', p50MWh: 30_000, ...resource };
			d.device.ratedPowerKW = 10_000;
			patch(d);
		});
		return r.ok ? [] : r.issues;
	};

	it('accepts a given P50 with a P90, a sigma, or the split, for every technology', () => {
		expect(assessed({ p90MWh: 26_000 })).toEqual([]);
		expect(assessed({ sigma: 0.1 })).toEqual([]);
		expect(assessed({ interAnnualSigma: 0.05, longTermSigma: 0.08 })).toEqual([]);
		const wave = assessed({ sigma: 0.1 }, (d) => {
			d.technology = 'wave';
			d.device = { kind: 'capture-width', captureWidthRatio: 0.2, characteristicWidthM: 20, ratedPowerKW: 750 };
		});
		expect(wave).toEqual([]);
	});

	it('asks for exactly one form of the uncertainty, naming the field', () => {
		expect(assessed({})).toEqual([{ path: 'resource.p90MWh', message: expect.stringMatching(/give the assessment's uncertainty/) }]);
		expect(assessed({ p90MWh: 26_000, sigma: 0.1 })).toEqual([{ path: 'resource.sigma', message: expect.stringMatching(/only one form/) }]);
		expect(assessed({ interAnnualSigma: 0.05 })).toEqual([{ path: 'resource.longTermSigma', message: expect.stringMatching(/give longTermSigma with interAnnualSigma/) }]);
	});

	it('refuses a P90 above the P50 and a negative P50', () => {
		expect(assessed({ p90MWh: 31_000 })).toEqual([{ path: 'resource.p90MWh', message: 'P90 (31000 MWh) must not exceed P50 (30000 MWh)' }]);
		expect(assessed({ p50MWh: -1, sigma: 0.1 }).map((i) => i.path)).toEqual(['resource.p50MWh']);
		expect(assessed({ sigma: 1.5 }).map((i) => i.path)).toEqual(['resource.sigma']);
	});

	it('refuses losses on a net figure, naming each loss', () => {
		const issues = assessed({ sigma: 0.1 }, (d) => (d.array = { deviceCount: 1, arrayLoss: 0.05, availability: 0.95 }));
		expect(issues.map((i) => i.path)).toEqual(['array.arrayLoss', 'array.availability']);
		expect(issues[0].message).toMatch(/must be 0 with an assessed-energy resource/);
		expect(issues[1].message).toMatch(/must be 1 with an assessed-energy resource/);
	});

	it('asks a power curve or matrix for its rated power', () => {
		const issues = assessed({ sigma: 0.1 }, (d) => delete d.device.ratedPowerKW);
		expect(issues).toEqual([{ path: 'device.ratedPowerKW', message: expect.stringMatching(/sets the installed capacity/) }]);
	});

	it('reads an uncertainty component without a kind as long-term, and refuses an unknown kind', () => {
		const r = withPatch((d) => (d.uncertainty = { components: [{ name: 'Model', sigma: 0.05 }, { name: 'Year to year', sigma: 0.04, kind: 'inter-annual' }] }));
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.scenario.uncertainty.components.map((c) => c.kind)).toEqual(['long-term', 'inter-annual']);
		const bad = withPatch((d) => (d.uncertainty = { components: [{ name: 'x', sigma: 0.05, kind: 'yearly' }] }));
		expect(!bad.ok && bad.issues.map((i) => i.path)).toEqual(['uncertainty.components[0].kind']);
	});
});

describe('parseScenario: depreciation and the carry-forward cap', () => {
	// IRS Publication 946, Table A-1, 5-year property, as fractions
	const fiveYear = [0.2, 0.32, 0.192, 0.1152, 0.1152, 0.0576];
	const issuesOf = (patch: (doc: Record<string, any>) => void) => {
		const r = withPatch(patch);
		return r.ok ? [] : r.issues;
	};

	it('leaves the new fields out of a document that does not give them', () => {
		// existing documents keep their numbers: no convention, schedule, classes or cap appear
		const r = parseScenario(atbCaseInput);
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.scenario.finance.depreciation.firstYearConvention).toBeUndefined();
		expect(r.scenario.finance.depreciation.assetClasses).toBeUndefined();
		expect(r.scenario.finance.taxLossCarryForwardCap).toBeUndefined();
	});

	it('accepts a schedule summing to 1, asset classes and a cap', () => {
		const r = withPatch((d) => {
			d.finance.depreciation = {
				method: 'schedule',
				schedule: fiveYear,
				assetClasses: [
					{ name: 'Devices', share: 0.7, method: 'declining-balance', lifeYears: 7, firstYearConvention: 'half-year' },
					{ name: 'Export cable', method: 'schedule', schedule: fiveYear }
				]
			};
			d.finance.taxLossCarryForwardCap = 0.6;
		});
		if (!r.ok) throw new Error(JSON.stringify(r.issues));
		expect(r.scenario.finance.depreciation.assetClasses?.[0].decliningBalanceFactor).toBe(2);
	});

	it('refuses a schedule that does not sum to 1, or is missing, naming its path', () => {
		expect(issuesOf((d) => (d.finance.depreciation = { method: 'schedule', schedule: [0.5, 0.4] }))).toEqual([
			{ path: 'finance.depreciation.schedule', message: 'schedule must sum to 1, sums to 0.9' }
		]);
		expect(issuesOf((d) => (d.finance.depreciation = { method: 'schedule' }))).toEqual([
			{ path: 'finance.depreciation.schedule', message: expect.stringMatching(/needs a schedule/) }
		]);
		const inClass = issuesOf((d) => (d.finance.depreciation = { assetClasses: [{ name: 'A', method: 'schedule', schedule: [0.6] }] }));
		expect(inClass).toEqual([{ path: 'finance.depreciation.assetClasses[0].schedule', message: 'schedule must sum to 1, sums to 0.6' }]);
	});

	it('ignores a schedule left behind when the method is no longer schedule', () => {
		// nothing already entered is lost when the method is switched back
		expect(issuesOf((d) => (d.finance.depreciation = { method: 'straight-line', schedule: [0.5] }))).toEqual([]);
	});

	it('refuses asset-class shares that do not add up, or two classes taking the rest', () => {
		expect(issuesOf((d) => (d.finance.depreciation = { assetClasses: [{ name: 'A', share: 0.5 }, { name: 'B', share: 0.4 }] }))).toEqual([
			{ path: 'finance.depreciation.assetClasses', message: expect.stringMatching(/^asset-class shares must sum to 1, sum to 0.9/) }
		]);
		expect(issuesOf((d) => (d.finance.depreciation = { assetClasses: [{ name: 'A' }, { name: 'B' }] }))).toEqual([
			{ path: 'finance.depreciation.assetClasses[1].share', message: expect.stringMatching(/only one asset class/) }
		]);
		expect(issuesOf((d) => (d.finance.depreciation = { assetClasses: [{ name: 'A', share: 0.8 }, { name: 'B', share: 0.3 }, { name: 'C' }] }))).toEqual([
			{ path: 'finance.depreciation.assetClasses', message: expect.stringMatching(/more than 1/) }
		]);
		// one class alone, without a share, takes the whole base
		expect(issuesOf((d) => (d.finance.depreciation = { assetClasses: [{ name: 'All' }] }))).toEqual([]);
	});

	it('bounds the cap, the schedule length and the number of classes', () => {
		expect(issuesOf((d) => (d.finance.taxLossCarryForwardCap = 1.2))[0].path).toBe('finance.taxLossCarryForwardCap');
		const long = Array.from({ length: SCENARIO_LIMITS.depreciationScheduleYears + 1 }, () => 1 / (SCENARIO_LIMITS.depreciationScheduleYears + 1));
		expect(issuesOf((d) => (d.finance.depreciation = { method: 'schedule', schedule: long }))).toEqual([
			{ path: 'finance.depreciation.schedule', message: 'at most 100 years in a depreciation schedule' }
		]);
		const many = Array.from({ length: SCENARIO_LIMITS.depreciationAssetClasses + 1 }, (_, i) => ({ name: `C${i}` }));
		expect(issuesOf((d) => (d.finance.depreciation = { assetClasses: many }))).toEqual([
			{ path: 'finance.depreciation.assetClasses', message: 'at most 20 asset classes' }
		]);
	});
});

describe('parseScenario: unknown keys', () => {
	const refusal = (patch: (doc: Record<string, any>) => void) => {
		const r = withPatch(patch);
		if (r.ok) throw new Error('accepted a document with an unknown key');
		return r.issues;
	};

	it('refuses a misspelt key in a nested object instead of falling back to the default, naming the key meant', () => {
		expect(refusal((d) => (d.array.availabilty = 0.5))).toEqual([
			{ path: 'array.availabilty', message: '"availabilty" is not a field here; did you mean "availability"?' }
		]);
	});

	it('refuses unknown keys at the top level, each at its own path', () => {
		expect(refusal((d) => Object.assign(d, { techology: 'wave', colour: 'blue' }))).toEqual([
			{ path: 'techology', message: '"techology" is not a field here; did you mean "technology"?' },
			{ path: 'colour', message: '"colour" is not a field here' }
		]);
	});

	it('refuses unknown keys inside array items', () => {
		expect(refusal((d) => (d.capex.lines[0].phasng = [1]))).toEqual([
			{ path: 'capex.lines[0].phasng', message: '"phasng" is not a field here; did you mean "phasing"?' }
		]);
		expect(refusal((d) => (d.resource.bins[1].Occurrence = 0.3))).toEqual([
			{ path: 'resource.bins[1].Occurrence', message: '"Occurrence" is not a field here; did you mean "occurrence"?' }
		]);
	});

	it('refuses unknown keys inside the member of a discriminated union, judged by that member’s own fields', () => {
		expect(refusal((d) => (d.opex.lines[0].amount = 5))).toEqual([
			{ path: 'opex.lines[0].amount', message: '"amount" is not a field here; the fields here are name, basis, fraction, escalation' }
		]);
		expect(refusal((d) => (d.finance.debt = { sizing: 'gearing', gearing: 0.5, interestRate: 0.05, tenorYears: 10, tenor: 10 }))).toEqual([
			{ path: 'finance.debt.tenor', message: '"tenor" is not a field here; did you mean "tenorYears"?' }
		]);
		expect(refusal((d) => (d.device.ratedPower = 10000))).toEqual([
			{ path: 'device.ratedPower', message: '"ratedPower" is not a field here; did you mean "ratedPowerKW"?' }
		]);
	});

	it('reports unknown keys beside the other problems of the same document', () => {
		const issues = refusal((d) => {
			d.array.availabilty = 0.5;
			d.array.otherLoss = 2;
		});
		expect(issues.map((i) => i.path).sort()).toEqual(['array.availabilty', 'array.otherLoss']);
	});
});

/** A tidal document with `n` entries in one list, every entry valid. */
const tidal = (patch: (doc: Record<string, any>, n: number) => void) => (n: number) => {
	const doc = structuredClone(atbCaseInput) as Record<string, any>;
	patch(doc, n);
	return doc;
};
const count = (n: number) => Array.from({ length: n }, (_, i) => i);
const wave = (n: number, m: number) => ({
	...structuredClone(atbCaseInput),
	technology: 'wave',
	resource: { kind: 'sea-state', hsM: 2, periodS: 8 },
	device: {
		kind: 'power-matrix',
		hsM: count(n).map((i) => i * 0.25),
		periodS: count(m).map((j) => 2 + j * 0.5),
		powerKW: count(n).map(() => count(m).map(() => 100))
	}
});

describe('parseScenario: list bounds', () => {
	const cases: { name: string; limit: number; path: string; message: string; build: (n: number) => unknown }[] = [
		{
			name: 'speed bins',
			limit: SCENARIO_LIMITS.speedBins,
			path: 'resource.bins',
			message: 'at most 1000 speed bins',
			build: tidal((d, n) => (d.resource.bins = count(n).map((i) => ({ speedMPerS: i * 0.01, occurrence: 1 }))))
		},
		{
			name: 'sea states',
			limit: SCENARIO_LIMITS.seaStates,
			path: 'resource.states',
			message: 'at most 2000 sea states',
			build: (n) => ({
				...wave(2, 2),
				resource: { kind: 'sea-state-table', states: count(n).map((i) => ({ hsM: (i % 40) * 0.25, periodS: 2 + Math.floor(i / 40) * 0.5, occurrence: 1 })) }
			})
		},
		{
			name: 'power-curve points',
			limit: SCENARIO_LIMITS.powerCurvePoints,
			path: 'device.points',
			message: 'at most 500 power-curve points',
			build: tidal((d, n) => (d.device.points = count(n).map((i) => ({ speedMPerS: i * 0.01, powerKW: i }))))
		},
		{ name: 'Hs values and matrix rows', limit: 100, path: 'device.hsM', message: 'at most 100 Hs values', build: (n) => wave(n, 3) },
		{ name: 'period values', limit: 100, path: 'device.periodS', message: 'at most 100 period values', build: (n) => wave(3, n) },
		{
			name: 'capex lines',
			limit: SCENARIO_LIMITS.capexLines,
			path: 'capex.lines',
			message: 'at most 100 capex lines',
			build: tidal((d, n) => (d.capex.lines = count(n).map((i) => ({ name: `Line ${i}`, basis: 'lump-sum', amount: 1000 }))))
		},
		{
			name: 'opex lines',
			limit: SCENARIO_LIMITS.opexLines,
			path: 'opex.lines',
			message: 'at most 100 opex lines',
			build: tidal((d, n) => (d.opex.lines = count(n).map((i) => ({ name: `Line ${i}`, basis: 'fixed-per-year', amount: 10 }))))
		},
		{
			name: 'grants',
			limit: SCENARIO_LIMITS.grants,
			path: 'revenue.grants',
			message: 'at most 50 grants',
			build: tidal((d, n) => (d.revenue.grants = count(n).map((i) => ({ name: `Grant ${i}`, basis: 'percent-of-capex', fraction: 0.01 }))))
		},
		{
			name: 'uncertainty components',
			limit: SCENARIO_LIMITS.uncertaintyComponents,
			path: 'uncertainty.components',
			message: 'at most 50 uncertainty components',
			build: tidal((d, n) => (d.uncertainty = { components: count(n).map((i) => ({ name: `Source ${i}`, sigma: 0.01 })) }))
		},
		{
			name: 'exceedance levels',
			limit: SCENARIO_LIMITS.exceedanceLevels,
			path: 'uncertainty.exceedanceLevels',
			message: 'at most 20 exceedance levels',
			build: tidal((d, n) => (d.uncertainty = { exceedanceLevels: count(n).map((i) => 50 + i) }))
		},
		{
			name: 'phasing shares',
			limit: SCENARIO_LIMITS.constructionYears,
			path: 'capex.phasing',
			message: 'at most 20 phasing shares (one per construction year)',
			build: tidal((d, n) => {
				d.timeline.constructionYears = Math.min(n, SCENARIO_LIMITS.constructionYears);
				d.capex.phasing = count(n).map(() => 1 / n);
			})
		},
		{
			name: 'phasing shares of one line',
			limit: SCENARIO_LIMITS.constructionYears,
			path: 'capex.lines[0].phasing',
			message: 'at most 20 phasing shares (one per construction year)',
			build: tidal((d, n) => {
				d.timeline.constructionYears = Math.min(n, SCENARIO_LIMITS.constructionYears);
				d.capex.lines[0].phasing = count(n).map(() => 1 / n);
			})
		}
	];

	it.each(cases)('accepts as many $name as the bound and refuses one more, naming the field and the bound', ({ limit, path, message, build }) => {
		const atLimit = parseScenario(build(limit));
		expect(atLimit.ok ? [] : atLimit.issues).toEqual([]);
		const over = parseScenario(build(limit + 1));
		expect(over.ok).toBe(false);
		if (over.ok) return;
		expect(over.issues).toContainEqual({ path, message });
	});

	it('bounds the rows of a power matrix and the cells in each row, so at most 100 x 100 cells', () => {
		const tooManyRows = wave(3, 3) as Record<string, any>;
		tooManyRows.device.powerKW = count(101).map(() => [1, 2, 3]);
		const rows = parseScenario(tooManyRows);
		expect(!rows.ok && rows.issues).toContainEqual({ path: 'device.powerKW', message: 'at most 100 rows (one per Hs value)' });
		const tooWide = wave(3, 3) as Record<string, any>;
		tooWide.device.powerKW[1] = count(101);
		const cells = parseScenario(tooWide);
		expect(!cells.ok && cells.issues).toContainEqual({ path: 'device.powerKW[1]', message: 'at most 100 cells in a row (one per period value)' });
		const full = parseScenario(wave(100, 100));
		expect(full.ok ? [] : full.issues).toEqual([]);
	});

	it('bounds construction years, operating years and the depreciation life', () => {
		const long = withPatch((d) => {
			d.timeline = { constructionYears: 21, operatingYears: 61 };
			d.finance.depreciation = { lifeYears: 101 };
		});
		expect(!long.ok && long.issues).toEqual([
			{ path: 'timeline.constructionYears', message: 'at most 20 construction years' },
			{ path: 'timeline.operatingYears', message: 'at most 60 operating years' },
			{ path: 'finance.depreciation.lifeYears', message: 'at most 100 years of depreciation life' }
		]);
	});

	it('bounds every free-text field', () => {
		const wordy = withPatch((d) => {
			d.name = 'x'.repeat(201);
			d.description = 'x'.repeat(4001);
			d.site = { name: 'x'.repeat(201) };
			d.capex.lines[0].name = 'x'.repeat(121);
		});
		expect(!wordy.ok && wordy.issues.map((i) => i.path)).toEqual(['name', 'description', 'site.name', 'capex.lines[0].name']);
	});
});

describe('formatIssuePath', () => {
	it('joins keys with dots and indices in brackets', () => {
		expect(formatIssuePath(['capex', 'lines', 2, 'amount'])).toBe('capex.lines[2].amount');
		expect(formatIssuePath(['device', 'powerKW', 1, 0])).toBe('device.powerKW[1][0]');
		expect(formatIssuePath([])).toBe('(document)');
	});
});

describe('JSON Schema export', () => {
	it('carries the field descriptions with their units', () => {
		const schema = JSON.stringify(z.toJSONSchema(scenarioSchema, { io: 'input' }));
		expect(schema).toContain('Seawater density, kg/m^3');
		expect(schema).toContain('Betz limit');
	});
});

describe('docs/scenario.schema.json', () => {
	it('is the current export of the schema (regenerate with scripts/export-schema.ts)', async () => {
		const { readFileSync } = await import('node:fs');
		const committed = JSON.parse(readFileSync('docs/scenario.schema.json', 'utf8'));
		delete committed.$id;
		delete committed.title;
		expect(committed).toEqual(JSON.parse(JSON.stringify(z.toJSONSchema(scenarioSchema, { io: 'input', target: 'draft-2020-12' }))));
	});
});
