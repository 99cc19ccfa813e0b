/**
 * The tables an export holds: the annual cash-flow table with units in every
 * header, the metrics with the catalogue's labels, units and precision (one
 * form for CSV, one for a spreadsheet), the engine's warnings, and the
 * cautions.
 */
import { CAUTIONS } from '../../cautions';
import { METRIC_LIST, metricUnitWithBasis } from '../../metrics/catalogue';
import { exactMetric, roundedMetric, spreadsheetNumberFormat } from '../../metrics/format';
import type { CashFlowRow, EngineResult } from '../engine/evaluate';

export interface ExportColumn {
	key: keyof CashFlowRow;
	header: string;
	numeric: boolean;
}

export interface ExportTable {
	title: string;
	headers: string[];
	/** Cells as text; numbers stay exact decimal strings, null is an empty cell. */
	rows: (string | number | null)[][];
	/** Which columns hold numbers (for spreadsheet cell types). */
	numeric: boolean[];
	/** Spreadsheet number formats by row and column (null: general); absent, every cell is general. */
	numberFormats?: (string | null)[][];
}

export function cashFlowColumns(currency: string): ExportColumn[] {
	const money = (key: keyof CashFlowRow, label: string): ExportColumn => ({ key, header: `${label} (${currency}, nominal)`, numeric: true });
	return [
		{ key: 't', header: 'Year t (0 = COD)', numeric: true },
		{ key: 'phase', header: 'Phase', numeric: false },
		{ key: 'energyMWh', header: 'Energy delivered (MWh)', numeric: true },
		{ key: 'pricePerMWh', header: `Price (${currency}/MWh, nominal)`, numeric: true },
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
		{ key: 'dscr', header: 'DSCR (ratio)', numeric: true },
		money('projectCashFlowPreTax', 'Project cash flow pre-tax'),
		money('projectCashFlowPostTax', 'Project cash flow post-tax'),
		money('cumulativeProjectCashFlow', 'Cumulative project cash flow post-tax'),
		money('equityCashFlow', 'Equity cash flow'),
		money('cumulativeEquityCashFlow', 'Cumulative equity cash flow')
	];
}

export function cashFlowTable(result: EngineResult): ExportTable {
	const columns = cashFlowColumns(result.currency);
	return {
		title: 'Cash flow',
		headers: columns.map((c) => c.header),
		// A result stored before a column existed leaves its cells empty.
		rows: result.cashFlow.map((row) => columns.map((c) => row[c.key] ?? null)),
		numeric: columns.map((c) => c.numeric)
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
		numberFormats: METRIC_LIST.map(({ key }) => [null, null, spreadsheetNumberFormat(key), null])
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
