import { describe, expect, it } from 'vitest';
import { Decimal } from '../server/engine/decimal';
import { parseScenario } from './scenario';
import { OLDEST_SCHEMA_VERSION, SCHEMA_VERSION, upgradeScenarioDocument, upgradeSteps, upgradeV1ToV2, upgradeV2ToV3 } from './scenario-upgrades';
import { evaluateScenario } from '../server/engine/evaluate';
import { atbCaseInput } from '../server/engine/testing/fixtures';

/** The fixed-charge-rate check case written in version 1, with every share of capex the format had. */
const version1 = {
	...atbCaseInput,
	schemaVersion: 1,
	decommissioning: { basis: 'percent-of-capex', amount: 0.08 },
	revenue: {
		...atbCaseInput.revenue,
		grants: [
			{ name: 'Demonstration grant', basis: 'percent-of-capex', amount: 0.25 },
			{ name: 'Regional prize', basis: 'lump-sum', amount: 1_000_000 }
		]
	}
};

/** The same case as a version 2 author writes it. */
const version2 = {
	...version1,
	schemaVersion: 2,
	decommissioning: { basis: 'percent-of-capex', fraction: 0.08 },
	revenue: {
		...version1.revenue,
		grants: [
			{ name: 'Demonstration grant', basis: 'percent-of-capex', fraction: 0.25 },
			{ name: 'Regional prize', basis: 'lump-sum', amount: 1_000_000 }
		]
	}
};

describe('upgradeSteps', () => {
	it('runs from the oldest version to the current one, one version a step', () => {
		expect(upgradeSteps.map((s) => s.from)).toEqual(Array.from({ length: SCHEMA_VERSION - OLDEST_SCHEMA_VERSION }, (_, i) => OLDEST_SCHEMA_VERSION + i));
	});
});

describe('upgradeV1ToV2', () => {
	it('moves a share of capex from amount to fraction, in decommissioning and in grants, and leaves money alone', () => {
		const { document, notes } = upgradeV1ToV2.upgrade(structuredClone(version1));
		expect(document).toEqual(version2);
		expect(notes).toEqual([
			'decommissioning.amount moved to decommissioning.fraction (percent-of-capex)',
			'revenue.grants[0].amount moved to revenue.grants[0].fraction (percent-of-capex)'
		]);
	});

	it('writes out the basis version 1 read a decommissioning object without one with', () => {
		const { document, notes } = upgradeV1ToV2.upgrade({ schemaVersion: 1, decommissioning: { amount: 2_000_000 } });
		expect(document).toEqual({ schemaVersion: 2, decommissioning: { basis: 'lump-sum', amount: 2_000_000 } });
		expect(notes).toEqual(['decommissioning.basis set to "lump-sum", the version 1 default']);
	});

	it('invents nothing: a missing decommissioning stays missing, a share with no amount stays without one', () => {
		expect(upgradeV1ToV2.upgrade({ schemaVersion: 1 })).toEqual({ document: { schemaVersion: 2 }, notes: [] });
		const bare = upgradeV1ToV2.upgrade({ schemaVersion: 1, decommissioning: { basis: 'percent-of-capex' } });
		expect(bare).toEqual({ document: { schemaVersion: 2, decommissioning: { basis: 'percent-of-capex' } }, notes: [] });
	});

	it('leaves a document it cannot read as version 1 for the schema to refuse, never guessing', () => {
		const both = { schemaVersion: 1, decommissioning: { basis: 'percent-of-capex', amount: 0.1, fraction: 0.2 }, revenue: { grants: 'none' } };
		expect(upgradeV1ToV2.upgrade(both).document).toEqual({ ...both, schemaVersion: 2 });
		const parsed = parseScenario({ ...version1, decommissioning: both.decommissioning });
		expect(!parsed.ok && parsed.issues).toEqual([{ path: 'decommissioning.amount', message: '"amount" is not a field here; the fields here are basis, fraction' }]);
	});

	it('does not change the document it was given', () => {
		const input = structuredClone(version1);
		upgradeV1ToV2.upgrade(input);
		expect(input).toEqual(version1);
	});

	it('gives the engine the same figures for a version 1 document and its upgraded form', () => {
		const fromVersion1 = parseScenario(version1);
		const fromVersion2 = parseScenario(version2);
		if (!fromVersion1.ok || !fromVersion2.ok) throw new Error('the check case does not validate');
		expect(fromVersion1.upgradedFrom).toBe(1);
		expect(fromVersion1.scenario).toEqual(fromVersion2.scenario);
		const before = evaluateScenario(fromVersion1.scenario);
		const after = evaluateScenario(fromVersion2.scenario);
		expect(before.metrics).toEqual(after.metrics);
		expect(before.costs).toEqual(after.costs);
		// What version 1 meant: with no inflation, decommissioning is 8 % of capex and the grants 25 % of capex plus 1,000,000.
		const capex = new Decimal(before.costs.capexRealTotal);
		expect(new Decimal(before.costs.decommissioningNominal).eq(capex.times(0.08))).toBe(true);
		expect(new Decimal(before.costs.grantsRealTotal).eq(capex.times(0.25).plus(1_000_000))).toBe(true);
	});
});

describe('upgradeV2ToV3', () => {
	const debt = { sizing: 'gearing', gearing: 0.6, interestRate: 0.06, tenorYears: 10 };

	it('writes out the pro-rata funding version 2 used, on debt only', () => {
		const { document, notes } = upgradeV2ToV3.upgrade({ schemaVersion: 2, finance: { taxRate: 0.2, debt } });
		expect(document).toEqual({ schemaVersion: 3, finance: { taxRate: 0.2, debt: { ...debt, fundingOrder: 'pro-rata' } } });
		expect(notes).toEqual(['finance.debt.fundingOrder set to "pro-rata", how version 2 funded construction']);
		expect(upgradeV2ToV3.upgrade({ schemaVersion: 2, finance: { debt: { sizing: 'none' } } }).notes).toEqual([]);
		expect(upgradeV2ToV3.upgrade({ schemaVersion: 2, finance: { debt: { ...debt, fundingOrder: 'equity-first' } } }).notes).toEqual([]);
	});

	it('keeps a partly indexed tariff growing at a share of inflation; full or no indexation needs nothing', () => {
		const partly = upgradeV2ToV3.upgrade({ schemaVersion: 2, revenue: { tariffPerMWh: 200, tariffIndexation: 0.5 } });
		expect(partly.document).toEqual({ schemaVersion: 3, revenue: { tariffPerMWh: 200, tariffIndexation: 0.5, indexationMethod: 'scaled-inflation' } });
		expect(partly.notes).toEqual(['revenue.indexationMethod set to "scaled-inflation": version 2 grew the tariff at 0.5 x inflation']);
		for (const share of [0, 1, undefined]) {
			expect(upgradeV2ToV3.upgrade({ schemaVersion: 2, revenue: { tariffPerMWh: 200, tariffIndexation: share } }).notes).toEqual([]);
		}
	});

	it('does not change the document it was given', () => {
		const input = { schemaVersion: 2, finance: { debt: { ...debt } }, revenue: { tariffIndexation: 0.3 } };
		const copy = structuredClone(input);
		upgradeV2ToV3.upgrade(input);
		expect(input).toEqual(copy);
	});
});

describe('upgradeScenarioDocument', () => {
	it('runs every step from the document’s own version and reports which', () => {
		const outcome = upgradeScenarioDocument(version1);
		const version3 = upgradeV2ToV3.upgrade(version2).document;
		expect(outcome).toEqual({ ok: true, document: version3, upgradedFrom: 1, notes: expect.arrayContaining([expect.stringMatching(/^decommissioning/)]) });
	});

	it('returns a current document as it is', () => {
		const version3 = { ...version2, schemaVersion: 3 };
		expect(upgradeScenarioDocument(version3)).toEqual({ ok: true, document: version3, upgradedFrom: null, notes: [] });
	});

	it('refuses a missing, malformed or newer version, and anything but an object', () => {
		expect(upgradeScenarioDocument({ name: 'x' })).toMatchObject({ ok: false, path: 'schemaVersion', message: expect.stringMatching(/missing/) });
		expect(upgradeScenarioDocument({ schemaVersion: 'two' })).toMatchObject({ ok: false, path: 'schemaVersion', message: expect.stringMatching(/not "two"$/) });
		expect(upgradeScenarioDocument({ schemaVersion: 99 })).toMatchObject({ ok: false, path: 'schemaVersion', message: expect.stringMatching(/^schemaVersion 99 is newer/) });
		expect(upgradeScenarioDocument('{}')).toMatchObject({ ok: false, path: null });
	});
});
