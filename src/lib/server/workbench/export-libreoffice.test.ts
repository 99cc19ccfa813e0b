/**
 * The exports opened by a real spreadsheet: LibreOffice Calc, headless
 * (Debian's libreoffice-calc-nogui, which scripts/test.ts installs), turns
 * every sheet of the workbook into CSV as its cells show, and each CSV file
 * into a workbook that exceljs reads back. A conversion takes seconds.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { METRIC_LIST } from '../../metrics/catalogue';
import { parseScenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { buildExport, csvTables, type CsvTableName } from './export';

const SOFFICE = '/usr/bin/soffice';
const CONVERSION_TIMEOUT = 120_000;

const parsed = parseScenario(JSON.parse(readFileSync('examples/lender-case-skerrow-sound.json', 'utf8')));
if (!parsed.ok) throw new Error('examples/lender-case-skerrow-sound.json should parse');
const document = parsed.scenario;
const result = evaluateScenario(document);
const context = { projectName: 'Skerrow Sound', scenarioName: 'Lender case', revision: 2, generatedAt: new Date('2026-01-15T10:00:00Z'), document };

let dir: string;

beforeAll(() => {
	if (!existsSync(SOFFICE)) throw new Error(`${SOFFICE} is missing: apt-get install libreoffice-calc-nogui (npm test installs it as root)`);
	dir = mkdtempSync(join(tmpdir(), 'tidewright-soffice-'));
});
afterAll(() => {
	if (dir) rmSync(dir, { recursive: true, force: true });
});

/**
 * soffice with a profile of its own (no clash with another run) and en-US
 * number display, at the lowest CPU priority so that tests timing this
 * process's event loop in the same run are not slowed by it.
 */
function soffice(args: string[]) {
	const profile = pathToFileURL(join(dir, 'profile')).href;
	execFileSync('nice', ['-n', '19', SOFFICE, `-env:UserInstallation=${profile}`, '--headless', ...args], {
		timeout: CONVERSION_TIMEOUT,
		stdio: 'pipe',
		env: { ...process.env, LC_ALL: 'en_US.UTF-8', LANG: 'en_US.UTF-8' }
	});
}

async function exported(format: 'xlsx' | 'csv', table?: CsvTableName): Promise<{ path: string; fileName: string; text: string }> {
	const file = await buildExport(result, context, format, table);
	const path = join(dir, file.fileName);
	writeFileSync(path, file.body);
	return { path, fileName: file.fileName, text: new TextDecoder().decode(file.body) };
}

/** CSV text as rows, without a byte-order mark, blank lines or the empty cells that close a row. */
function rowsOf(text: string): string[][] {
	const rows = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
	return rows.map((row) => {
		const end = row.findLastIndex((cell) => cell !== '');
		return row.slice(0, end + 1);
	});
}

/** A figure as a spreadsheet shows it ("−24,222,969", "33.1%") without its grouping, so it reads as the CSV export writes it. */
const ungrouped = (cell: string) => (/^-?[\d,]+(\.\d+)?%?$/.test(cell) ? cell.replaceAll(',', '') : cell);

/** The table of a CSV export, before the cautions. */
const exportTable = (text: string) => rowsOf(text.replace(/^\uFEFF/, '').split('\r\n\r\n')[0]);

describe('LibreOffice Calc', () => {
	it(
		'opens the workbook and shows every sheet, each figure under its number format as the CSV export writes it',
		async () => {
			const workbook = await exported('xlsx');
			const out = join(dir, 'sheets');
			mkdirSync(out);
			// CSV filter options (LibreOffice's documented token list): comma, double quote, UTF-8 (76), from line 1,
			// cell contents as shown (token 9), every sheet to a file of its own (token 12: -1).
			soffice(['--convert-to', 'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,true,false,false,-1', '--outdir', out, workbook.path]);
			const stem = workbook.fileName.replace(/\.xlsx$/, '');
			const sheet = (name: string) => rowsOf(readFileSync(join(out, `${stem}-${name}.csv`), 'utf8'));
			for (const name of ['About', 'Assumptions', 'Annual table', 'Metrics', 'Warnings', 'Cautions']) expect(existsSync(join(out, `${stem}-${name}.csv`)), name).toBe(true);

			const annual = sheet('Annual table');
			const cashFlow = exportTable((await exported('csv', 'cash-flow')).text);
			expect(annual[0]).toEqual(cashFlow[0]);
			expect(annual.length).toBe(cashFlow.length);
			// Calc rounds for display half away from zero, the export half to even: ties do not occur in these values (common practice).
			annual.slice(1).forEach((row, r) => expect(row.map(ungrouped), `year row ${r + 1}`).toEqual(cashFlow[r + 1].slice(0, row.length)));
			expect(annual[3].some((cell) => /^\d{1,3}(,\d{3})+$/.test(cell))).toBe(true);

			const metrics = sheet('Metrics');
			const metricsCsv = exportTable((await exported('csv', 'metrics')).text);
			METRIC_LIST.forEach((metric, i) => {
				const shown = metrics[i + 1][2] ?? '';
				const written = metricsCsv[i + 1][2] ?? '';
				expect(ungrouped(shown), metric.key).toBe(written === '' ? '' : metric.scale === 'percent' ? `${written}%` : written);
			});

			const assumptions = sheet('Assumptions');
			const assumptionsCsv = exportTable((await exported('csv', 'assumptions')).text);
			expect(assumptions.map((row) => row.map(ungrouped))).toEqual(assumptionsCsv.map((row) => row.map(ungrouped)));
			expect(assumptions.find((row) => row[1] === 'Tariff (prices of the indexation base year)')).toEqual(['Revenue and grants', 'Tariff (prices of the indexation base year)', '330', 'EUR/MWh']);
		},
		CONVERSION_TIMEOUT
	);

	it(
		'opens each CSV export as a sheet: headers as written, figures as numbers, the cautions below',
		async () => {
			const files = await Promise.all(csvTables.map((table) => exported('csv', table)));
			const out = join(dir, 'books');
			mkdirSync(out);
			// Import as comma-separated UTF-8 from line 1, then save as XLSX.
			soffice(['--infilter=CSV:44,34,76,1', '--convert-to', 'xlsx', '--outdir', out, ...files.map((f) => f.path)]);
			for (const [i, file] of files.entries()) {
				const book = new ExcelJS.Workbook();
				await book.xlsx.readFile(join(out, file.fileName.replace(/\.csv$/, '.xlsx')));
				const sheet = book.worksheets[0];
				const written = exportTable(file.text);
				// The byte-order mark is read as the encoding's mark, not as part of the first header.
				expect((sheet.getRow(1).values as unknown[]).slice(1, written[0].length + 1), csvTables[i]).toEqual(written[0].map((h) => (h === '' ? undefined : h)));
				const last = sheet.getRow(sheet.rowCount).getCell(1).value;
				expect(String(last), csvTables[i]).toMatch(/^Caution: /);
			}
			const [cashFlow, , assumptions] = await Promise.all(files.map(async (file) => {
				const book = new ExcelJS.Workbook();
				await book.xlsx.readFile(join(out, file.fileName.replace(/\.csv$/, '.xlsx')));
				return book.worksheets[0];
			}));
			const revenue = (cashFlow.getRow(1).values as string[]).indexOf('Revenue (EUR, nominal)');
			const firstOperating = result.cashFlow.findIndex((f) => f.phase === 'operation') + 2;
			expect(typeof cashFlow.getRow(firstOperating).getCell(revenue).value).toBe('number');
			expect(cashFlow.getRow(firstOperating).getCell(revenue).value).toBe(Math.round(Number(result.cashFlow[firstOperating - 2].revenue)));
			const density = (assumptions.getSheetValues() as unknown[][]).find((row) => row?.[2] === 'Seawater density');
			// examples/lender-case-skerrow-sound.json gives no density: the schema's default, 1025 kg/m³, read with its superscript intact.
			expect(density?.slice(3, 5)).toEqual([1025, 'kg/m³']);
		},
		CONVERSION_TIMEOUT
	);
});
