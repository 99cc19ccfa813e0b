import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { BETZ_LIMIT, formatIssuePath, parseScenario, scenarioSchema } from './scenario';
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

	it('refuses an unknown schema version', () => {
		const r = withPatch((d) => (d.schemaVersion = 2));
		expect(!r.ok && r.issues[0].path).toBe('schemaVersion');
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
