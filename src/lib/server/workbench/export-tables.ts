/**
 * The tables an export holds, independent of the file format: the annual
 * cash-flow table with units in every header, the metrics with their units,
 * the engine's warnings, and the cautions.
 */
import { CAUTIONS } from '../../cautions';
import { METRIC_KEYS, METRIC_UNITS, type CashFlowRow, type EngineResult } from '../engine/evaluate';

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
}

export function cashFlowColumns(currency: string): ExportColumn[] {
	const money = (key: keyof CashFlowRow, label: string): ExportColumn => ({ key, header: `${label} (${currency}, nominal)`, numeric: true });
	return [
		{ key: 't', header: 'Year t (0 = COD)', numeric: true },
		{ key: 'phase', header: 'Phase', numeric: false },
		{ key: 'energyMWh', header: 'Net energy (MWh)', numeric: true },
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

export const METRIC_LABELS: Record<(typeof METRIC_KEYS)[number], string> = {
	netAepMWh: 'Net annual energy, P50',
	p90AepMWh: 'Net annual energy, P90',
	capacityFactor: 'Capacity factor',
	lcoeReal: 'LCOE, real',
	lcoeNominal: 'LCOE, nominal',
	lcoeFcr: 'LCOE, fixed-charge-rate form',
	projectIrrPreTax: 'Project IRR, pre-tax',
	projectIrrPostTax: 'Project IRR, post-tax',
	equityIrr: 'Equity IRR',
	npv: 'NPV',
	paybackYears: 'Payback',
	minDscr: 'Minimum DSCR',
	avgDscr: 'Average DSCR',
	llcr: 'LLCR',
	debtAmount: 'Debt amount',
	breakevenTariff: 'Breakeven tariff'
};

function unitIn(currency: string, unit: string): string {
	return unit.replace(/\bcurrency\b/g, currency);
}

export function cashFlowTable(result: EngineResult): ExportTable {
	const columns = cashFlowColumns(result.currency);
	return {
		title: 'Cash flow',
		headers: columns.map((c) => c.header),
		rows: result.cashFlow.map((row) => columns.map((c) => row[c.key])),
		numeric: columns.map((c) => c.numeric)
	};
}

export function metricsTable(result: EngineResult): ExportTable {
	return {
		title: 'Metrics',
		headers: ['Metric', 'Key', 'Value', 'Unit'],
		rows: METRIC_KEYS.map((key) => [METRIC_LABELS[key], key, result.metrics[key], unitIn(result.currency, METRIC_UNITS[key])]),
		numeric: [false, false, true, false]
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
