import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { METRIC_LIST, metricUnitWithBasis, type MetricKey } from '../../metrics/catalogue';
import { formatMetric } from '../../metrics/format';
import { evaluateScenario } from '../engine/evaluate';
import { buildExport } from './export';

const result = evaluateScenario(tidalDocument);
const context = { projectName: 'Skerrow Sound', scenarioName: 'Base case', revision: 3, generatedAt: new Date('2026-01-15T10:00:00Z') };

/** The editor's text of a value, as a data file writes it: no thousands separators, an ASCII minus. */
function editorDigits(key: MetricKey, value: string | null): string {
	return value === null ? '' : formatMetric(key, value).replaceAll(',', '').replace('−', '-');
}

/**
 * What a spreadsheet shows for a number under the two kinds of format the
 * export uses ("#,##0.00" and "0.0%"), written without separators: Excel
 * rounds half away from zero (common practice; ties do not occur in these values).
 */
function spreadsheetDigits(value: number, numFmt: string): string {
	const places = /\.(0+)/.exec(numFmt)?.[1].length ?? 0;
	return numFmt.endsWith('%') ? (value * 100).toFixed(places) : value.toFixed(places);
}

describe('buildExport', () => {
	it('writes the metrics CSV with the catalogue labels and units, the editor digits and the exact value', async () => {
		const file = await buildExport(result, context, 'csv', 'metrics');
		expect(file.fileName).toBe('base-case-r3-metrics.csv');
		const text = new TextDecoder().decode(file.body).replace(/^\uFEFF/, '');
		const rows = Papa.parse<string[]>(text.split('\r\n\r\n')[0], { skipEmptyLines: true }).data;
		expect(rows[0]).toEqual(['Metric', 'Key', 'Value', 'Value (exact)', 'Unit']);
		expect(rows.slice(1).map((r) => [r[0], r[1], r[4]])).toEqual(METRIC_LIST.map((m) => [m.label, m.key, metricUnitWithBasis(m.key, 'EUR')]));
		let compared = 0;
		for (const [, key, value, exact] of rows.slice(1)) {
			const engineValue = result.metrics[key as MetricKey];
			expect(value, key).toBe(editorDigits(key as MetricKey, engineValue));
			if (engineValue === null) continue;
			compared++;
			// The exact column differs from the engine value only by the per cent scale.
			const scale = METRIC_LIST.find((m) => m.key === key)!.scale === 'percent' ? 100 : 1;
			expect(Number(exact), key).toBeCloseTo(Number(engineValue) * scale, 8);
		}
		expect(compared).toBeGreaterThan(10);
	});

	it('writes the Metrics sheet with the catalogue labels, the exact values and formats that show the editor digits', async () => {
		const file = await buildExport(result, context, 'xlsx');
		const workbook = new ExcelJS.Workbook();
		await workbook.xlsx.load(file.body.buffer);
		const sheet = workbook.getWorksheet('Metrics')!;
		expect(sheet.getRow(1).values).toEqual([undefined, 'Metric', 'Key', 'Value', 'Unit']);
		METRIC_LIST.forEach((metric, i) => {
			const row = sheet.getRow(i + 2);
			expect(row.getCell(1).value).toBe(metric.label);
			expect(row.getCell(2).value).toBe(metric.key);
			expect(row.getCell(4).value).toBe(metricUnitWithBasis(metric.key, 'EUR'));
			const engineValue = result.metrics[metric.key];
			const cell = row.getCell(3);
			if (engineValue === null) {
				expect(cell.value, metric.key).toBeNull();
				return;
			}
			expect(cell.value, metric.key).toBe(Number(engineValue));
			expect(spreadsheetDigits(cell.value as number, cell.numFmt), metric.key).toBe(editorDigits(metric.key, engineValue));
		});
	});
});
