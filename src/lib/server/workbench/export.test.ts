import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';
import { METRIC_LIST, metricUnitWithBasis, type MetricKey } from '../../metrics/catalogue';
import { formatMetric } from '../../metrics/format';
import { Decimal } from '../engine/decimal';
import { evaluateScenario } from '../engine/evaluate';
import { buildExport, exportStem, type CsvTableName } from './export';

const result = evaluateScenario(tidalDocument);
const context = { projectName: 'Skerrow Sound', scenarioName: 'Base case', revision: 3, generatedAt: new Date('2026-01-15T10:00:00Z'), document: tidalDocument };

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
		expect(file.fileName).toBe('skerrow-sound-base-case-2026-01-15-metrics.csv');
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

async function workbookOf(body: Uint8Array<ArrayBuffer>): Promise<ExcelJS.Workbook> {
	const workbook = new ExcelJS.Workbook();
	await workbook.xlsx.load(body.buffer);
	return workbook;
}

/** A CSV export's table, without the byte-order mark and the cautions after the first blank line. */
async function csvTable(table: CsvTableName): Promise<string[][]> {
	const text = new TextDecoder().decode((await buildExport(result, context, 'csv', table)).body).replace(/^\uFEFF/, '');
	return Papa.parse<string[]>(text.split('\r\n\r\n')[0], { skipEmptyLines: true }).data;
}

/** Decimals a plain number format shows: "#,##0.00" -> 2, "0" -> 0. */
const placesOf = (numFmt: string) => /\.(0+)/.exec(numFmt)?.[1].length ?? 0;

describe('file names', () => {
	it('name the project, the scenario and the day, the CSV table after them', async () => {
		expect((await buildExport(result, context, 'xlsx')).fileName).toBe('skerrow-sound-base-case-2026-01-15.xlsx');
		expect((await buildExport(result, context, 'csv', 'assumptions')).fileName).toBe('skerrow-sound-base-case-2026-01-15-assumptions.csv');
	});

	it('keep to letters, digits and dashes, safe in a Content-Disposition header, the day in UTC', () => {
		// 23:30 at UTC-02:00 is 01:30 the next day in UTC (ISO 8601 offsets).
		const stem = exportStem({ projectName: 'Cèol Bay "East" / Phase 2', scenarioName: ' ; ', generatedAt: new Date('2026-03-01T23:30:00-02:00') });
		expect(stem).toBe('ceol-bay-east-phase-2-scenario-2026-03-02');
		expect(exportStem({ projectName: '', scenarioName: 'Base', generatedAt: context.generatedAt })).toBe('project-base-2026-01-15');
	});
});

describe('the workbook', () => {
	const workbook = buildExport(result, context, 'xlsx').then((file) => workbookOf(file.body));
	const sheet = async (name: string) => (await workbook).getWorksheet(name)!;

	it('has the about, assumptions, annual table, metrics, warnings and cautions sheets, in that order', async () => {
		expect((await workbook).worksheets.map((s) => s.name)).toEqual(['About', 'Assumptions', 'Annual table', 'Metrics', 'Warnings', 'Cautions']);
	});

	it('keeps the header row of every sheet in view, and the first column of the annual table and the metrics', async () => {
		const frozen = async (name: string) => {
			const [view] = (await sheet(name)).views as { state: string; xSplit?: number; ySplit?: number }[];
			return [view.state, view.xSplit ?? 0, view.ySplit ?? 0];
		};
		expect(await frozen('Annual table')).toEqual(['frozen', 1, 1]);
		expect(await frozen('Metrics')).toEqual(['frozen', 1, 1]);
		expect(await frozen('Assumptions')).toEqual(['frozen', 0, 1]);
		expect(await frozen('Cautions')).toEqual(['frozen', 0, 1]);
	});

	it('writes the annual table with units in the headers, exact values and a number format per column', async () => {
		const annual = await sheet('Annual table');
		const headers = annual.getRow(1).values as string[];
		const column = (header: string) => headers.indexOf(header);
		for (const header of ['Year t (0 = COD)', 'Energy delivered (MWh)', 'Price (EUR/MWh, nominal)', 'Revenue (EUR, nominal)', 'DSCR (ratio)']) expect(column(header), header).toBeGreaterThan(0);
		expect(annual.rowCount).toBe(1 + result.cashFlow.length);
		// Money and energy whole, prices and DSCR to two places, as the catalogue shows NPV, energy, LCOE and cover.
		const formats: [string, string, keyof (typeof result.cashFlow)[number]][] = [
			['Year t (0 = COD)', '0', 't'],
			['Energy delivered (MWh)', '#,##0', 'energyMWh'],
			['Price (EUR/MWh, nominal)', '#,##0.00', 'pricePerMWh'],
			['Revenue (EUR, nominal)', '#,##0', 'revenue'],
			['DSCR (ratio)', '0.00', 'dscr']
		];
		result.cashFlow.forEach((flow, i) => {
			const row = annual.getRow(i + 2);
			for (const [header, numFmt, key] of formats) {
				const cell = row.getCell(column(header));
				expect(cell.value, `${header}, year ${flow.t}`).toBe(flow[key] === null ? null : Number(flow[key]));
				if (flow[key] !== null) expect(cell.numFmt, header).toBe(numFmt);
			}
		});
	});

	it('sizes columns to what they show, within 10 and 60 characters, and gives the wrapped header room', async () => {
		const annual = await sheet('Annual table');
		const revenue = (annual.getRow(1).values as string[]).indexOf('Revenue (EUR, nominal)');
		// The widest revenue as shown under "#,##0" (en-GB grouping, as a spreadsheet shows it).
		const widest = Math.max(...result.cashFlow.map((f) => Number(f.revenue).toLocaleString('en-GB', { maximumFractionDigits: 0 }).length));
		expect(annual.getColumn(revenue).width).toBeGreaterThanOrEqual(widest);
		for (const name of ['Assumptions', 'Annual table', 'Metrics']) {
			const current = await sheet(name);
			for (let i = 1; i <= current.columnCount; i++) {
				expect(current.getColumn(i).width, `${name} column ${i}`).toBeGreaterThanOrEqual(10);
				expect(current.getColumn(i).width, `${name} column ${i}`).toBeLessThanOrEqual(60);
			}
		}
		expect(annual.getRow(1).height).toBeGreaterThan(15);
		expect(annual.getRow(1).alignment?.wrapText).toBe(true);
	});

	it('lists the assumptions in words with value and unit apart, numbers as numbers, tables under bold headings', async () => {
		const assumptions = await sheet('Assumptions');
		expect((assumptions.getRow(1).values as string[]).slice(1, 5)).toEqual(['Section', 'Assumption', 'Value', 'Unit']);
		const rows = (assumptions.getSheetValues() as unknown[][]).filter(Boolean);
		const find = (label: string) => rows.findIndex((r) => r[2] === label) + 1;
		// tests/fixtures/scenario-documents.ts: a tariff of 250 EUR/MWh, availability 0.95 (95 %).
		const tariff = assumptions.getRow(find('Tariff (prices of the indexation base year)'));
		expect([tariff.getCell(1).value, tariff.getCell(3).value, tariff.getCell(4).value]).toEqual(['Revenue and grants', 250, 'EUR/MWh']);
		const availability = assumptions.getRow(find('Availability'));
		expect([availability.getCell(3).value, availability.getCell(3).numFmt, availability.getCell(4).value]).toEqual([95, '#,##0', '%']);
		const capex = assumptions.getRow(find('Capex lines (real, COD-year money)'));
		expect(capex.font?.bold).toBe(true);
		expect(assumptions.getRow(capex.number + 1).font?.bold).toBe(true);
		expect(assumptions.getRow(capex.number + 2).font?.bold).toBeFalsy();
	});

	it('holds the same assumptions as the CSV file, cell for cell', async () => {
		const assumptions = await sheet('Assumptions');
		const csv = await csvTable('assumptions');
		expect(assumptions.rowCount).toBe(csv.length);
		csv.forEach((row, r) => {
			row.forEach((text, c) => {
				const value = assumptions.getRow(r + 1).getCell(c + 1).value;
				expect(value === null ? '' : String(value), `row ${r + 1}, column ${c + 1}`).toBe(typeof value === 'number' ? String(Number(text)) : text);
			});
		});
	});
});

describe('the CSV files', () => {
	it('round the annual table to the decimals the workbook shows, within half a unit of the engine value', async () => {
		const rows = await csvTable('cash-flow');
		const annual = (await workbookOf((await buildExport(result, context, 'xlsx')).body)).getWorksheet('Annual table')!;
		expect(rows[0]).toEqual((annual.getRow(1).values as string[]).slice(1));
		let checked = 0;
		rows.slice(1).forEach((row, r) => {
			row.forEach((text, c) => {
				const cell = annual.getRow(r + 2).getCell(c + 1);
				if (typeof cell.value !== 'number') return;
				const places = placesOf(cell.numFmt);
				expect(text, `row ${r + 2}, column ${c + 1}`).toMatch(places === 0 ? /^-?\d+$/ : new RegExp(`^-?\\d+\\.\\d{${places}}$`));
				// Rounded to n places, a value moves by at most half a unit in the last place (common practice);
				// the workbook's cell holds the engine's value (checked above), to a double's precision.
				const halfUnit = new Decimal(0.5).times(new Decimal(10).pow(-places)).plus(1e-6);
				expect(new Decimal(text).minus(String(cell.value)).abs().lte(halfUnit), `row ${r + 2}, column ${c + 1}`).toBe(true);
				checked++;
			});
		});
		expect(checked).toBeGreaterThan(400);
	});

	it('write the assumptions as a rectangle, the cautions after them', async () => {
		const text = new TextDecoder().decode((await buildExport(result, context, 'csv', 'assumptions')).body).replace(/^\uFEFF/, '');
		const [table, cautions] = text.split('\r\n\r\n');
		const rows = Papa.parse<string[]>(table, { skipEmptyLines: true }).data;
		expect(rows[0].slice(0, 4)).toEqual(['Section', 'Assumption', 'Value', 'Unit']);
		expect(new Set(rows.map((r) => r.length)).size).toBe(1);
		expect(rows.find((r) => r[1] === 'Tariff (prices of the indexation base year)')?.slice(0, 4)).toEqual(['Revenue and grants', 'Tariff (prices of the indexation base year)', '250', 'EUR/MWh']);
		expect(rows.find((r) => r[1] === 'Interest rate')?.slice(2, 4)).toEqual(['6', '%/yr (nominal)']);
		expect(cautions).toContain('Caution: ');
	});

	it('carry no float noise in any table (no 1.3499999999)', async () => {
		// A run of six zeros before a last digit, or of six nines, is what binary floats leave in decimal text (0.1 + 0.2 = 0.30000000000000004).
		const noise = /\d\.\d*(?:0{6,}[1-9]|9{6,})\d*$/;
		expect(String(0.1 + 0.2)).toMatch(noise);
		expect('1.3499999999').toMatch(noise);
		for (const table of ['cash-flow', 'metrics', 'assumptions'] as const) {
			for (const cell of (await csvTable(table)).flat()) expect(cell, table).not.toMatch(noise);
		}
	});
});
