/** A scenario's results as a downloadable file: CSV (one table) or XLSX (every table, one sheet each). */
import { CAUTIONS } from '../../cautions';
import type { EngineResult } from '../engine/evaluate';
import { assumptionsTable } from './export-assumptions';
import { tableToCsv } from './export-csv';
import {
	aboutTable,
	cashFlowCsvTable,
	cashFlowTable,
	cautionsTable,
	metricsCsvTable,
	metricsSheetTable,
	warningsTable,
	type ExportContext,
	type ExportTable
} from './export-tables';

export const exportFormats = ['csv', 'xlsx'] as const;
export type ExportFormat = (typeof exportFormats)[number];
export const csvTables = ['cash-flow', 'metrics', 'assumptions'] as const;
export type CsvTableName = (typeof csvTables)[number];

export interface ExportFile {
	body: Uint8Array<ArrayBuffer>;
	contentType: string;
	fileName: string;
}

/** A file name part from a name: letters, digits and dashes only (`fallback` when nothing is left). */
export function fileStem(name: string, fallback = 'scenario'): string {
	const stem = name
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 80)
		.replace(/-+$/, '');
	return stem === '' ? fallback : stem;
}

/** "<project>-<scenario>-<YYYY-MM-DD>", the date of the export in UTC; safe in a Content-Disposition header as it stands. */
export function exportStem(context: Pick<ExportContext, 'projectName' | 'scenarioName' | 'generatedAt'>): string {
	return `${fileStem(context.projectName, 'project')}-${fileStem(context.scenarioName)}-${context.generatedAt.toISOString().slice(0, 10)}`;
}

function csvTable(result: EngineResult, context: ExportContext, table: CsvTableName): ExportTable {
	switch (table) {
		case 'cash-flow':
			return cashFlowCsvTable(result);
		case 'metrics':
			return metricsCsvTable(result);
		case 'assumptions':
			return assumptionsTable(context.document, result);
	}
}

export async function buildExport(
	result: EngineResult,
	context: ExportContext,
	format: ExportFormat,
	table: CsvTableName = 'cash-flow'
): Promise<ExportFile> {
	const stem = exportStem(context);
	if (format === 'csv') {
		const csv = tableToCsv(csvTable(result, context, table), CAUTIONS);
		return { body: new TextEncoder().encode(csv), contentType: 'text/csv; charset=utf-8', fileName: `${stem}-${table}.csv` };
	}
	// exceljs takes over half a second to load: only where a workbook is built (a compute-pool thread).
	const { tablesToXlsx } = await import('./export-xlsx');
	const body = await tablesToXlsx(
		[
			aboutTable(result, context),
			assumptionsTable(context.document, result),
			cashFlowTable(result),
			metricsSheetTable(result),
			warningsTable(result),
			cautionsTable()
		],
		{ title: `${context.projectName}: ${context.scenarioName}` }
	);
	return {
		body,
		contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		fileName: `${stem}.xlsx`
	};
}
