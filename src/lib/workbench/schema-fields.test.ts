import { describe, expect, it } from 'vitest';
import { BETZ_LIMIT } from '../schemas/scenario';
import { fieldFacts } from './schema-fields';

const rotorDocument = { device: { kind: 'rotor' }, resource: { kind: 'weibull' }, finance: { debt: { sizing: 'target-dscr' } } };

describe('fieldFacts', () => {
	it('reads bounds, defaults and descriptions from the scenario schema', () => {
		const density = fieldFacts(['site', 'waterDensityKgPerM3'], rotorDocument)!;
		expect(density.defaultValue).toBe(1025);
		expect(density.min).toBe(0);
		expect(density.minExclusive).toBe(true);
		expect(density.description).toMatch(/kg\/m\^3/);
	});

	it('follows a union to the branch the document chose', () => {
		// Betz: no open rotor extracts more than 16/27 of the flow's kinetic power (Betz 1920).
		expect(fieldFacts(['device', 'powerCoefficient'], rotorDocument)!.max).toBe(BETZ_LIMIT);
		expect(fieldFacts(['device', 'captureWidthRatio'], rotorDocument)).toBeNull();
		expect(fieldFacts(['device', 'captureWidthRatio'], { device: { kind: 'capture-width' } })).not.toBeNull();
		expect(fieldFacts(['finance', 'debt', 'targetDscr'], rotorDocument)!.min).toBe(1);
	});

	it('knows whole numbers, optional fields and the allowed choices', () => {
		expect(fieldFacts(['array', 'deviceCount'], rotorDocument)!.integer).toBe(true);
		expect(fieldFacts(['device', 'rotorDiameterM'], rotorDocument)!.optional).toBe(true);
		expect(fieldFacts(['device', 'ratedPowerKW'], rotorDocument)!.optional).toBe(false);
		expect(fieldFacts(['capex', 'lines', 0, 'basis'], rotorDocument)!.options).toEqual(['lump-sum', 'per-kW', 'per-device']);
		expect(fieldFacts(['uncertainty', 'exceedanceLevels', 0], rotorDocument)).toMatchObject({ min: 0, max: 100, minExclusive: true });
	});

	it('answers null for a path the schema does not have', () => {
		expect(fieldFacts(['array', 'nothing'], rotorDocument)).toBeNull();
	});
});
