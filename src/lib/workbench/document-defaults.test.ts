import { describe, expect, it } from 'vitest';
import { parseScenario } from '../schemas/scenario';
import { evaluateScenario } from '../server/engine/evaluate';
import { technologies } from '../schemas/workbench';
import { blankDocument, debtWithSizing, deviceKindsFor, deviceOfKind, opexLineWithBasis, resourceKindsFor, resourceOfKind } from './document-defaults';

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
				const document = { ...blankDocument(technology, { name: 'x', currency: 'EUR' }), resource: resourceOfKind(resource), device: deviceOfKind(device) };
				const parsed = parseScenario(document);
				expect(parsed.ok ? [] : parsed.issues, `${resource} with ${device}`).toEqual([]);
			}
		}
	});

	it('keeps an opex line’s name and amount across bases', () => {
		const line = opexLineWithBasis({ name: 'Vessels', basis: 'per-MWh', amount: 4, escalation: 0.01 }, 'periodic-overhaul');
		expect(line).toMatchObject({ name: 'Vessels', basis: 'periodic-overhaul', amount: 4, escalation: 0.01 });
		expect(opexLineWithBasis(line, 'percent-of-revenue')).toEqual({ name: 'Vessels', basis: 'percent-of-revenue', fraction: 0.02 });
	});

	it('keeps the loan terms when the debt sizing changes', () => {
		const geared = debtWithSizing({ sizing: 'none' }, 'gearing');
		expect(geared).toMatchObject({ sizing: 'gearing', gearing: 0.7, interestRate: 0.06 });
		const edited = { ...geared, interestRate: 0.071 } as typeof geared;
		expect(debtWithSizing(edited, 'target-dscr')).toMatchObject({ sizing: 'target-dscr', interestRate: 0.071, maxGearing: 0.7 });
		expect(debtWithSizing(edited, 'none')).toEqual({ sizing: 'none' });
	});
});
