import { describe, expect, it } from 'vitest';
import { parseScenario } from '../schemas/scenario';
import { evaluateScenario } from '../server/engine/evaluate';
import { technologies } from '../schemas/workbench';
import {
	blankDocument,
	debtWithSizing,
	decommissioningWithBasis,
	deviceKindsFor,
	deviceOfKind,
	grantWithBasis,
	opexLineWithBasis,
	resourceKindsFor,
	resourceOfKind
} from './document-defaults';

describe('blankDocument', () => {
	it.each(technologies)('gives %s a document the schema accepts and the engine evaluates', (technology) => {
		const parsed = parseScenario(blankDocument(technology, { name: 'Blank', currency: 'GBP' }));
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		expect(parsed.scenario.currency).toBe('GBP');
		const result = evaluateScenario(parsed.scenario);
		expect(Number(result.metrics.netAepMWh)).toBeGreaterThan(0);
		expect(result.metrics.lcoeReal).not.toBeNull();
	});
});

describe('switching variants', () => {
	it.each(technologies)('every resource and device offered for %s fits the technology', (technology) => {
		for (const resource of resourceKindsFor[technology]) {
			for (const device of deviceKindsFor[technology]) {
				const blank = blankDocument(technology, { name: 'x', currency: 'EUR' });
				// An assessed energy is net of losses and takes the device's rated power only: the schema asks for both (scenario.ts).
				const assessed = resource === 'assessed-energy';
				const document = {
					...blank,
					resource: resourceOfKind(resource),
					device: assessed ? { ratedPowerKW: 1000, ...deviceOfKind(device) } : deviceOfKind(device),
					array: assessed ? { deviceCount: 5 } : blank.array
				};
				const parsed = parseScenario(document);
				expect(parsed.ok ? [] : parsed.issues, `${resource} with ${device}`).toEqual([]);
			}
		}
	});

	it('offers an assessed energy to every technology, naming the losses it refuses', () => {
		for (const technology of technologies) expect(resourceKindsFor[technology]).toContain('assessed-energy');
		const parsed = parseScenario({ ...blankDocument('wave', { name: 'x', currency: 'EUR' }), resource: resourceOfKind('assessed-energy') });
		expect(parsed.ok ? [] : parsed.issues.map((i) => i.path)).toEqual(['array.arrayLoss', 'array.electricalLoss', 'array.availability']);
	});

	it('keeps an opex line’s name and amount across bases', () => {
		const line = opexLineWithBasis({ name: 'Vessels', basis: 'per-MWh', amount: 4, escalation: 0.01 }, 'periodic-overhaul');
		expect(line).toMatchObject({ name: 'Vessels', basis: 'periodic-overhaul', amount: 4, escalation: 0.01 });
		expect(opexLineWithBasis(line, 'percent-of-revenue')).toEqual({ name: 'Vessels', basis: 'percent-of-revenue', fraction: 0.02 });
	});

	it('keeps a decommissioning amount between money bases, and never reads money as a share of capex', () => {
		expect(decommissioningWithBasis({ basis: 'per-device', amount: 500_000 }, 'lump-sum')).toEqual({ basis: 'lump-sum', amount: 500_000 });
		expect(decommissioningWithBasis({ basis: 'per-device', amount: 500_000 }, 'percent-of-capex')).toEqual({ basis: 'percent-of-capex', fraction: 0 });
		expect(decommissioningWithBasis({ basis: 'percent-of-capex', fraction: 0.05 }, 'per-kW')).toEqual({ basis: 'per-kW', amount: 0 });
		const same = { basis: 'percent-of-capex' as const, fraction: 0.05 };
		expect(decommissioningWithBasis(same, 'percent-of-capex')).toBe(same);
	});

	it('keeps a grant’s name across bases, giving it the field its basis takes', () => {
		const share = grantWithBasis({ name: 'Fund', basis: 'lump-sum', amount: 2_000_000 }, 'percent-of-capex');
		expect(share).toEqual({ name: 'Fund', basis: 'percent-of-capex', fraction: 0 });
		expect(grantWithBasis(share, 'lump-sum')).toEqual({ name: 'Fund', basis: 'lump-sum', amount: 0 });
		for (const grant of [share, grantWithBasis(share, 'lump-sum')]) {
			const document = { ...blankDocument('wave', { name: 'x', currency: 'EUR' }), revenue: { tariffPerMWh: 300, supportYears: 20, grants: [grant] } };
			const parsed = parseScenario(document);
			expect(parsed.ok ? [] : parsed.issues).toEqual([]);
		}
	});

	it('keeps the loan terms when the debt sizing changes', () => {
		const geared = debtWithSizing({ sizing: 'none' }, 'gearing');
		expect(geared).toMatchObject({ sizing: 'gearing', gearing: 0.7, interestRate: 0.06 });
		const edited = { ...geared, interestRate: 0.071 } as typeof geared;
		expect(debtWithSizing(edited, 'target-dscr')).toMatchObject({ sizing: 'target-dscr', interestRate: 0.071, maxGearing: 0.7 });
		expect(debtWithSizing(edited, 'none')).toEqual({ sizing: 'none' });
	});
});
