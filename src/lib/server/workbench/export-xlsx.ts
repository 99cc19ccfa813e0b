/**
 * XLSX export with exceljs: one sheet per table (About, Assumptions, Annual
 * table, Metrics, Warnings, Cautions), numbers as numeric cells with the
 * table's number formats, the header row bold, wrapped and frozen (and the
 * table's first columns where it asks), columns as wide as what they show.
 */
import ExcelJS from 'exceljs';
import { groupDigits } from '../../metrics/format';
import type { ExportCell, ExportTable } from './export-tables';

/** Excel's default row height for one line of 11 pt text, in points. */
const LINE_HEIGHT = 15;
const MIN_WIDTH = 10;
const MAX_WIDTH = 60;

/** The text a cell shows: a number under its format ("#,##0.00", "0.0%") as grouped digits, anything else as written. */
function shownText(cell: ExportCell, format: string | null): string {
	if (cell === null) return '';
	if (format === null) return String(cell);
	const places = /\.(0+)/.exec(format)?.[1].length ?? 0;
	return format.endsWith('%') ? `${groupDigits(Number(cell) * 100, places)}%` : groupDigits(String(cell), places);
}

function longestWord(text: string): number {
	return Math.max(0, ...text.split(/\s+/).map((w) => w.length));
}

/** Lines a header takes when wrapped at word breaks in a column `width` characters wide. */
function wrappedLines(text: string, width: number): number {
	let lines = 1;
	let used = 0;
	for (const word of text.split(/\s+/)) {
		if (used > 0 && used + 1 + word.length > width) {
			lines++;
			used = word.length;
		} else used += (used > 0 ? 1 : 0) + word.length;
	}
	return lines;
}

/** Wide enough for every cell shown under it and for the header in at most three lines. */
function columnWidth(table: ExportTable, column: number): number {
	const header = table.headers[column] ?? '';
	const shown = table.rows.map((row, r) => shownText(row[column] ?? null, table.numberFormats?.[r]?.[column] ?? null).length);
	const widest = Math.max(0, ...shown, longestWord(header), Math.ceil(header.length / 3));
	return Math.min(MAX_WIDTH, Math.max(MIN_WIDTH, widest + 2));
}

function addSheet(workbook: ExcelJS.Workbook, table: ExportTable) {
	const sheet = workbook.addWorksheet(table.title, { views: [{ state: 'frozen', xSplit: table.frozenColumns ?? 0, ySplit: 1 }] });
	const header = sheet.addRow(table.headers);
	header.font = { bold: true };
	header.alignment = { wrapText: true, vertical: 'top' };
	table.rows.forEach((row, r) => {
		const formats = table.numberFormats?.[r] ?? [];
		const added = sheet.addRow(row.map((cell, i) => (cell !== null && (table.numeric[i] || formats[i]) ? Number(cell) : cell)));
		formats.forEach((format, i) => {
			if (format) added.getCell(i + 1).numFmt = format;
		});
		if (table.headingRows?.[r]) added.font = { bold: true };
	});
	const widths = table.headers.map((_, i) => columnWidth(table, i));
	widths.forEach((width, i) => (sheet.getColumn(i + 1).width = width));
	// Excel does not fit a row to its wrapped text when it opens a file, so the header's height is set here.
	header.height = LINE_HEIGHT * Math.max(...table.headers.map((h, i) => wrappedLines(h, widths[i] - 2)));
}

export async function tablesToXlsx(tables: readonly ExportTable[], meta: { title: string }): Promise<Uint8Array<ArrayBuffer>> {
	const workbook = new ExcelJS.Workbook();
	workbook.creator = 'Tidewright';
	workbook.title = meta.title;
	for (const table of tables) addSheet(workbook, table);
	const buffer = await workbook.xlsx.writeBuffer();
	return new Uint8Array(buffer as ArrayBuffer);
}
