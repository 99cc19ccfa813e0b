/**
 * The tables an export holds: the annual cash-flow table with units in every
 * header (exact values with number formats for a spreadsheet, rounded to the
 * same decimals for CSV), the metrics with the catalogue's labels, units and
 * precision (one form for CSV, one for a spreadsheet), the engine's warnings,
 * and the cautions.
 */
import { CAUTIONS } from '../../cautions';
import { METRIC_LIST, metricUnitWithBasis } from '../../metrics/catalogue';
import { exactMetric, roundedMetric, spreadsheetNumberFormat } from '../../metrics/format';
import type { Scenario } from '../../schemas/scenario';
import type { CashFlowRow, EngineResult } from '../engine/evaluate';
import { numberFormat, roundedText } from './export-numbers';

export interface ExportColumn {
	key: keyof CashFlowRow;
	header: string;
	/** Decimals a number is shown with (the catalogue's for money, energy, prices and cover); null for text. */
	places: number | null;
	/** Thousands grouped in the spreadsheet (not for the year). */
	grouped?: boolean;
}

export type ExportCell = string | number | null;

export interface ExportTable {
	title: string;
	headers: string[];
	/** Cells as text; numbers as decimal strings, null is an empty cell. */
	rows: ExportCell[][];
	/** Which columns hold numbers (for spreadsheet cell types). */
	numeric: boolean[];
	/** Spreadsheet number formats by row and column (null: general); a cell with a format holds a number whatever its column. */
	numberFormats?: (string | null)[][];
	/** Rows set in bold under the header: the title and header of a small table within the sheet. */
	headingRows?: boolean[];
	/** Columns kept in view at the left as the sheet scrolls (the header row always is). */
	frozenColumns?: number;
}

/** The columns of the annual table, each with the decimals of its figures: money and energy whole, prices and DSCR to two places (as the catalogue shows NPV, energy, LCOE and cover). */
export function cashFlowColumns(currency: string): ExportColumn[] {
	const money = (key: keyof CashFlowRow, label: string): ExportColumn => ({ key, header: `${label} (${currency}, nominal)`, places: 0, grouped: true });
	return [
		{ key: 't', header: 'Year t (0 = COD)', places: 0, grouped: false },
		{ key: 'phase', header: 'Phase', places: null },
		{ key: 'energyMWh', header: 'Energy delivered (MWh)', places: 0, grouped: true },
		{ key: 'pricePerMWh', header: `Price (${currency}/MWh, nominal)`, places: 2, grouped: true },
		money('revenue', 'Revenue'),
		money('opex', 'Opex'),
		money('ebitda', 'EBITDA'),
		money('capex', 'Capex'),
		money('grants', 'Grants'),
		money('decommissioning', 'Decommissioning'),
		money('depreciation', 'Tax depreciation'),
		money('taxableIncome', 'Taxable income'),
		money('tax', 'Tax'),
		money('cfads', 'CFADS'),
		money('debtDrawdown', 'Debt drawdown'),
		money('interest', 'Interest'),
		money('financingFees', 'Financing fees (commitment and upfront)'),
		money('principal', 'Principal'),
		money('debtService', 'Debt service'),
		money('debtBalance', 'Debt balance at year end'),
		{ key: 'dscr', header: 'DSCR (ratio)', places: 2, grouped: false },
		money('projectCashFlowPreTax', 'Project cash flow pre-tax'),
		money('projectCashFlowPostTax', 'Project cash flow post-tax'),
		money('cumulativeProjectCashFlow', 'Cumulative project cash flow post-tax'),
		money('equityCashFlow', 'Equity cash flow'),
		money('cumulativeEquityCashFlow', 'Cumulative equity cash flow')
	];
}

function columnFormat(column: ExportColumn): string | null {
	if (column.places === null) return null;
	return column.grouped ? numberFormat(column.places) : column.places > 0 ? `0.${'0'.repeat(column.places)}` : '0';
}

/** The annual table for a spreadsheet: the engine's exact values, each column's number format showing its decimals; the year column kept in view. */
export function cashFlowTable(result: EngineResult): ExportTable {
	const columns = cashFlowColumns(result.currency);
	const formats = columns.map(columnFormat);
	return {
		title: 'Annual table',
		headers: columns.map((c) => c.header),
		// A result stored before a column existed leaves its cells empty.
		rows: result.cashFlow.map((row) => columns.map((c) => row[c.key] ?? null)),
		numeric: columns.map((c) => c.places !== null),
		numberFormats: result.cashFlow.map(() => formats),
		frozenColumns: 1
	};
}

/** The annual table for a CSV file: every figure rounded to its column's decimals, as the spreadsheet shows it. */
export function cashFlowCsvTable(result: EngineResult): ExportTable {
	const columns = cashFlowColumns(result.currency);
	const sheet = cashFlowTable(result);
	return {
		title: sheet.title,
		headers: sheet.headers,
		rows: sheet.rows.map((row) =>
			row.map((cell, i) => {
				const places = columns[i].places;
				return cell === null || places === null ? cell : roundedText(cell, places);
			})
		),
		numeric: sheet.numeric
	};
}

/**
 * The metrics for a CSV file: the value rounded as the screen shows it, in
 * the display unit (per cent figures as per cent), and every digit of it in
 * "Value (exact)", in the same unit.
 */
export function metricsCsvTable(result: EngineResult): ExportTable {
	return {
		title: 'Metrics',
		headers: ['Metric', 'Key', 'Value', 'Value (exact)', 'Unit'],
		rows: METRIC_LIST.map(({ key, label }) => [
			label,
			key,
			roundedMetric(key, result.metrics[key]),
			exactMetric(key, result.metrics[key]),
			metricUnitWithBasis(key, result.currency)
		]),
		numeric: [false, false, true, true, false]
	};
}

/**
 * The metrics for a spreadsheet: each cell holds the engine's value (per cent
 * figures as fractions) with a number format that shows it as the screen does.
 */
export function metricsSheetTable(result: EngineResult): ExportTable {
	return {
		title: 'Metrics',
		headers: ['Metric', 'Key', 'Value', 'Unit'],
		rows: METRIC_LIST.map(({ key, label }) => [label, key, result.metrics[key], metricUnitWithBasis(key, result.currency)]),
		numeric: [false, false, true, false],
		numberFormats: METRIC_LIST.map(({ key }) => [null, null, spreadsheetNumberFormat(key), null]),
		frozenColumns: 1
	};
}

export function warningsTable(result: EngineResult): ExportTable {
	return { title: 'Warnings', headers: ['Warning'], rows: result.warnings.map((w) => [w]), numeric: [false] };
}

export function cautionsTable(): ExportTable {
	return { title: 'Cautions', headers: ['Caution'], rows: CAUTIONS.map((c) => [c]), numeric: [false] };
}

export interface ExportContext {
	projectName: string;
	scenarioName: string;
	revision: number;
	generatedAt: Date;
	/** The saved document the result is of: the assumptions sheet lists its inputs. */
	document: Scenario;
}

export function aboutTable(result: EngineResult, context: ExportContext): ExportTable {
	return {
		title: 'About',
		headers: ['Item', 'Value'],
		rows: [
			['Project', context.projectName],
			['Scenario', context.scenarioName],
			['Revision', String(context.revision)],
			['Technology', result.technology],
			['Currency', result.currency],
			['Generated (UTC)', context.generatedAt.toISOString()],
			['Time convention', result.timeConvention]
		],
		numeric: [false, false]
	};
}
