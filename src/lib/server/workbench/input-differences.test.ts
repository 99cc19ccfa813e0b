import { describe, expect, it } from 'vitest';
import { tidalDocument, waveDocument } from '../../../../tests/fixtures/scenario-documents';
import type { Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { inputDifferences, MAX_TABLE_DIFFERENCES, type InputDifferenceSection } from './input-differences';

const compared = (...documents: Scenario[]) => documents.map((document) => ({ document, result: evaluateScenario(document) }));
const section = (sections: InputDifferenceSection[], title: string) => sections.find((s) => s.title === title);
const rowOf = (sections: InputDifferenceSection[], title: string, label: string) => section(sections, title)?.rows.find((r) => r.label === label);

/** The fixture with capex up by a factor and availability down by some points, as the demo's downside case is built. */
function downside(base: Scenario, capexFactor: number, availabilityDrop: number): Scenario {
	return {
		...base,
		capex: { ...base.capex, lines: base.capex.lines.map((line) => ({ ...line, amount: Math.round(line.amount * capexFactor * 100) / 100 })) },
		array: { ...base.array, availability: Math.round((base.array.availability - availabilityDrop) * 1e6) / 1e6 }
	};
}

describe('inputDifferences', () => {
	it('is empty for identical scenarios and for a single one', () => {
		expect(inputDifferences(compared(tidalDocument, structuredClone(tidalDocument)))).toEqual([]);
		expect(inputDifferences(compared(tidalDocument))).toEqual([]);
	});

	it('lists each differing input with its unit and both values, grouped by section', () => {
		const sections = inputDifferences(compared(tidalDocument, downside(tidalDocument, 1.15, 0.05)));
		expect(sections.map((s) => s.title)).toEqual(['Array, losses and uncertainty', 'Capital costs']);
		// Availability 0.95 in the fixture, 5 points lower is 0.90; the summary reads shares as per cent.
		expect(rowOf(sections, 'Array, losses and uncertainty', 'Availability')).toEqual({ table: null, label: 'Availability', unit: '%', values: ['95', '90'] });
		// Turbines 4,000 EUR/kW x 1.15 = 4,600 EUR/kW; cables 6,000,000 EUR x 1.15 = 6,900,000 EUR (hand calculation).
		expect(rowOf(sections, 'Capital costs', 'Turbines, Amount')).toEqual({
			table: 'Capex lines (real, COD-year money)',
			label: 'Turbines, Amount',
			unit: 'EUR/kW',
			values: ['4,000', '4,600']
		});
		expect(rowOf(sections, 'Capital costs', 'Cables and grid, Amount')?.values).toEqual(['6,000,000', '6,900,000']);
	});

	it('leaves out what the engine worked out from the inputs', () => {
		const sections = inputDifferences(compared(tidalDocument, downside(tidalDocument, 1.15, 0.05)));
		const labels = sections.flatMap((s) => s.rows.map((r) => r.label));
		// The capex total and the line totals with contingency change with capex, and the debt with both, but none was typed.
		expect(labels.some((l) => l.startsWith('Capex total'))).toBe(false);
		expect(labels.some((l) => l.includes('Total with contingency'))).toBe(false);
		expect(labels).not.toContain('Debt at COD');
		expect(labels.some((l) => l.startsWith('Gross annual energy'))).toBe(false);
		expect(sections.some((s) => s.rows.some((r) => r.table?.startsWith('Net annual energy at each exceedance level')))).toBe(false);
	});

	it('shows an input only one scenario has, with null for the other', () => {
		const equity: Scenario = { ...tidalDocument, finance: { ...tidalDocument.finance, debt: { sizing: 'none' } } };
		const sections = inputDifferences(compared(tidalDocument, equity));
		expect(rowOf(sections, 'Finance and debt', 'Senior debt')?.values).toEqual(['Sized by gearing', 'None: the project is funded by equity']);
		// The fixture's gearing is 0.6 and its interest rate 0.06 (tests/fixtures/scenario-documents.ts).
		expect(rowOf(sections, 'Finance and debt', 'Gearing')).toEqual({ table: null, label: 'Gearing', unit: '%', values: ['60', null] });
		expect(rowOf(sections, 'Finance and debt', 'Interest rate')?.values).toEqual(['6', null]);
	});

	it('names a table row one scenario adds, in words, and compares three scenarios at once', () => {
		const withInsurance: Scenario = {
			...tidalDocument,
			opex: { lines: [...tidalDocument.opex.lines, { name: 'Insurance', basis: 'percent-of-capex', fraction: 0.01, escalation: 0 }] }
		};
		const sections = inputDifferences(compared(tidalDocument, tidalDocument, withInsurance));
		const insurance = rowOf(sections, 'Operating costs and decommissioning', 'Insurance');
		expect(insurance?.values[0]).toBeNull();
		expect(insurance?.values[1]).toBeNull();
		expect(insurance?.values[2]).toContain('1 % of capex');
		expect(section(sections, 'Operating costs and decommissioning')?.rows).toHaveLength(1);
	});

	it('matches rows of numbers by position and sums up a long table after its first differences', () => {
		const bins = Array.from({ length: 20 }, (_, i) => ({ speedMPerS: 0.25 + i * 0.2, occurrence: 0.05 }));
		const histogram = (factor: number): Scenario => ({
			...tidalDocument,
			resource: { kind: 'speed-histogram', occurrenceBasis: 'probability', bins: bins.map((b) => ({ ...b, speedMPerS: Math.round(b.speedMPerS * factor * 1e6) / 1e6 })) }
		});
		const rows = section(inputDifferences(compared(histogram(1), histogram(1.1))), 'Site and resource')!.rows.filter((r) => r.table !== null);
		// Every one of the 20 speeds moves; the first MAX_TABLE_DIFFERENCES are listed, then one row for the rest.
		expect(rows).toHaveLength(MAX_TABLE_DIFFERENCES + 1);
		expect(rows[0]).toEqual({ table: 'Flow speed histogram', label: 'row 1, Flow speed', unit: 'm/s', values: ['0.25', '0.275'] });
		expect(rows[MAX_TABLE_DIFFERENCES].label).toBe(`${20 - MAX_TABLE_DIFFERENCES} more values differ`);
		expect(rows[MAX_TABLE_DIFFERENCES].values).toEqual(['20 rows in all', '20 rows in all']);
	});

	it('reads wave inputs too', () => {
		const bigger: Scenario = { ...waveDocument, array: { ...waveDocument.array, deviceCount: 12 } };
		expect(rowOf(inputDifferences(compared(waveDocument, bigger)), 'Array, losses and uncertainty', 'Devices in the array')).toEqual({
			table: null,
			label: 'Devices in the array',
			unit: 'devices',
			values: ['10', '12']
		});
	});
});
