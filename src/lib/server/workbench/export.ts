/** A scenario's results as a downloadable file: CSV (one table) or XLSX (every table, one sheet each). */
import { CAUTIONS } from '../../cautions';
import type { EngineResult } from '../engine/evaluate';
import { tableToCsv } from './export-csv';
import { aboutTable, cashFlowTable, cautionsTable, metricsCsvTable, metricsSheetTable, warningsTable, type ExportContext } from './export-tables';

export const exportFormats = ['csv', 'xlsx'] as const;
export type ExportFormat = (typeof exportFormats)[number];
export const csvTables = ['cash-flow', 'metrics'] as const;
export type CsvTableName = (typeof csvTables)[number];

export interface ExportFile {
	body: Uint8Array<ArrayBuffer>;
	contentType: string;
	fileName: string;
}

/** A file name from the scenario name: letters, digits and dashes only. */
export function fileStem(name: string): string {
	const stem = name
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 80);
	return stem === '' ? 'scenario' : stem;
}

export async function buildExport(
	result: EngineResult,
	context: ExportContext,
	format: ExportFormat,
	table: CsvTableName = 'cash-flow'
): Promise<ExportFile> {
	const stem = `${fileStem(context.scenarioName)}-r${context.revision}`;
	if (format === 'csv') {
		const csv = tableToCsv(table === 'metrics' ? metricsCsvTable(result) : cashFlowTable(result), CAUTIONS);
		return { body: new TextEncoder().encode(csv), contentType: 'text/csv; charset=utf-8', fileName: `${stem}-${table}.csv` };
	}
	// exceljs takes over half a second to load: only where a workbook is built (a compute-pool thread).
	const { tablesToXlsx } = await import('./export-xlsx');
	const body = await tablesToXlsx(
		[aboutTable(result, context), cashFlowTable(result), metricsSheetTable(result), warningsTable(result), cautionsTable()],
		{ title: `${context.projectName}: ${context.scenarioName}` }
	);
	return {
		body,
		contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		fileName: `${stem}.xlsx`
	};
}
