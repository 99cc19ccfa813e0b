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

	it('offers every branch of a union as the choices of its discriminator', () => {
		const document = { ...rotorDocument, opex: { lines: [{ basis: 'per-MWh' }] }, decommissioning: { basis: 'per-kW' }, revenue: { grants: [{ basis: 'lump-sum' }] } };
		expect(fieldFacts(['device', 'kind'], document)!.options).toEqual(['rotor', 'power-curve', 'power-matrix', 'capture-width']);
		expect(fieldFacts(['finance', 'debt', 'sizing'], document)!.options).toEqual(['none', 'gearing', 'target-dscr']);
		expect(fieldFacts(['opex', 'lines', 0, 'basis'], document)!.options).toHaveLength(6);
		expect(fieldFacts(['decommissioning', 'basis'], document)!.options).toEqual(['lump-sum', 'per-device', 'per-kW', 'percent-of-capex']);
		expect(fieldFacts(['revenue', 'grants', 0, 'basis'], document)!.options).toEqual(['lump-sum', 'percent-of-capex']);
	});

	it('reads the field a basis takes: an amount of money, or a fraction of capex', () => {
		expect(fieldFacts(['decommissioning', 'fraction'], { decommissioning: { basis: 'percent-of-capex' } })).toMatchObject({ min: 0, max: 1 });
		expect(fieldFacts(['decommissioning', 'amount'], { decommissioning: { basis: 'percent-of-capex' } })).toBeNull();
		expect(fieldFacts(['revenue', 'grants', 0, 'fraction'], { revenue: { grants: [{ basis: 'lump-sum' }] } })).toBeNull();
		expect(fieldFacts(['revenue', 'grants', 0, 'amount'], { revenue: { grants: [{ basis: 'lump-sum' }] } })).toMatchObject({ min: 0, max: null });
	});

	it('answers null for a path the schema does not have', () => {
		expect(fieldFacts(['array', 'nothing'], rotorDocument)).toBeNull();
	});
});
