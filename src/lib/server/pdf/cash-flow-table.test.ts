import { describe, expect, it } from 'vitest';
import type { CashFlowRow } from '../engine/evaluate';
import { cashFlowColumns, cashFlowTableCells, NO_FIGURE, yearCell } from './cash-flow-table';

const zero = '0';
function row(overrides: Partial<CashFlowRow>): CashFlowRow {
	const base = Object.fromEntries(cashFlowColumns('EUR').map((c) => [c.key, zero])) as unknown as CashFlowRow;
	return { ...base, t: 1, phase: 'operation', dscr: null, ...overrides } as CashFlowRow;
}

describe('cashFlowTableCells', () => {
	it('shows money in thousands rounded half to even with decimal.js, and a true minus sign', () => {
		const { columns, rows } = cashFlowTableCells({
			currency: 'EUR',
			cashFlow: [row({ revenue: '10470500', opex: '3413500', equityCashFlow: '-11160123.4', energyMWh: '40258.75', pricePerMWh: '260.05', dscr: '2.275' })]
		});
		const at = (header: string) => rows[0][columns.findIndex((c) => c.header === header)];
		// Half to even: 10,470.5 k -> 10,470; 3,413.5 k -> 3,414; 260.05 -> 260.0; 2.275 -> 2.28 (decimal, not float's 2.27).
		expect(at('Revenue')).toBe('10,470');
		expect(at('Opex')).toBe('3,414');
		expect(at('Equity CF')).toBe('−11,160');
		expect(at('Energy')).toBe('40,259');
		expect(at('Price')).toBe('260.0');
		expect(at('DSCR')).toBe('2.28');
	});

	it('names each column with its unit, money in the currency in thousands', () => {
		const { columns } = cashFlowTableCells({ currency: 'USD', cashFlow: [] });
		expect(columns[0]).toMatchObject({ header: 'Year', unit: 't, 0 = COD' });
		expect(columns.find((c) => c.header === 'CFADS')?.unit).toBe('USD k');
		expect(columns.find((c) => c.header === 'Price')?.unit).toBe('USD/MWh');
		expect(columns.find((c) => c.header === 'Fees')?.unit).toBe('USD k');
		expect(columns).toHaveLength(22);
	});

	it('writes a dash where the engine has no DSCR', () => {
		const { columns, rows } = cashFlowTableCells({ currency: 'EUR', cashFlow: [row({ dscr: null })] });
		expect(rows[0][columns.findIndex((c) => c.header === 'DSCR')]).toBe(NO_FIGURE);
	});
});

describe('yearCell', () => {
	it('marks construction years and writes negative years with a minus sign', () => {
		expect(yearCell({ t: -1, phase: 'construction' })).toBe('−1 build');
		expect(yearCell({ t: 0, phase: 'construction' })).toBe('0 build');
		expect(yearCell({ t: 12, phase: 'operation' })).toBe('12');
	});
});
