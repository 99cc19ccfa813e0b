/**
 * The annual cash-flow table as the summary prints it: the columns the app's
 * table shows (src/lib/components/workbench/CashFlowTable.svelte), money in
 * thousands, every cell rounded from the engine's decimal string with
 * decimal.js (never through floats).
 */
import DecimalJs from 'decimal.js';
import { groupDigits } from '../../metrics/format';
import type { CashFlowRow, EngineResult } from '../engine/evaluate';
import type { TableColumn } from './tables';

/** Enough digits that dividing a money amount by a thousand never rounds it. */
const Decimal = DecimalJs.clone({ precision: 40, rounding: DecimalJs.ROUND_HALF_EVEN });

interface CashFlowColumn extends TableColumn {
	key: keyof CashFlowRow;
	places: number;
	/** The shown figure is the engine's divided by this. */
	divisor: number;
}

/** Shown where the engine has no value (DSCR in a year without debt service). */
export const NO_FIGURE = '—';

export function cashFlowColumns(currency: string): CashFlowColumn[] {
	const thousands = `${currency} k`;
	const money = (key: keyof CashFlowRow, header: string): CashFlowColumn => ({ key, header, unit: thousands, places: 0, divisor: 1000, align: 'right' });
	return [
		{ key: 'energyMWh', header: 'Energy', unit: 'MWh', places: 0, divisor: 1, align: 'right' },
		{ key: 'pricePerMWh', header: 'Price', unit: `${currency}/MWh`, places: 1, divisor: 1, align: 'right' },
		money('revenue', 'Revenue'),
		money('opex', 'Opex'),
		money('ebitda', 'EBITDA'),
		money('capex', 'Capex'),
		money('grants', 'Grants'),
		money('decommissioning', 'Decom.'),
		money('depreciation', 'Depreciation'),
		money('tax', 'Tax'),
		money('cfads', 'CFADS'),
		money('debtDrawdown', 'Drawdown'),
		money('interest', 'Interest'),
		money('financingFees', 'Fees'),
		money('principal', 'Principal'),
		money('debtBalance', 'Debt balance'),
		{ key: 'dscr', header: 'DSCR', unit: 'ratio', places: 2, divisor: 1, align: 'right' },
		money('projectCashFlowPostTax', 'Post-tax project CF'),
		money('cumulativeProjectCashFlow', 'Cumulative project CF'),
		money('equityCashFlow', 'Equity CF'),
		money('cumulativeEquityCashFlow', 'Cumulative equity CF')
	];
}

/** The first column: the year t, with construction years marked. */
export const YEAR_COLUMN: TableColumn = { header: 'Year', unit: 't, 0 = COD', align: 'left' };

export function yearCell(row: Pick<CashFlowRow, 't' | 'phase'>): string {
	const t = row.t < 0 ? `−${-row.t}` : String(row.t);
	return row.phase === 'construction' ? `${t} build` : t;
}

function cell(row: CashFlowRow, column: CashFlowColumn): string {
	const value = row[column.key];
	if (value === null || value === undefined) return NO_FIGURE;
	return groupDigits(new Decimal(String(value)).dividedBy(column.divisor), column.places);
}

/** Header columns and text rows, one row per year of the result. */
export function cashFlowTableCells(result: Pick<EngineResult, 'cashFlow' | 'currency'>): { columns: TableColumn[]; rows: string[][] } {
	const columns = cashFlowColumns(result.currency);
	return {
		columns: [YEAR_COLUMN, ...columns.map(({ header, unit, align }) => ({ header, unit, align }))],
		rows: result.cashFlow.map((row) => [yearCell(row), ...columns.map((column) => cell(row, column))])
	};
}
