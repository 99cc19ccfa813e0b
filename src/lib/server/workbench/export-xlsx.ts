/**
 * XLSX export with exceljs: one sheet per table (About, Cash flow, Metrics,
 * Warnings, Cautions), numbers as numeric cells (with the table's number
 * formats where it gives them), headers bold and frozen.
 */
import ExcelJS from 'exceljs';
import type { ExportTable } from './export-tables';

function addSheet(workbook: ExcelJS.Workbook, table: ExportTable) {
	const sheet = workbook.addWorksheet(table.title, { views: [{ state: 'frozen', ySplit: 1 }] });
	sheet.addRow(table.headers).font = { bold: true };
	table.rows.forEach((row, r) => {
		const added = sheet.addRow(row.map((cell, i) => (cell !== null && table.numeric[i] ? Number(cell) : cell)));
		table.numberFormats?.[r]?.forEach((format, i) => {
			if (format !== null) added.getCell(i + 1).numFmt = format;
		});
	});
	table.headers.forEach((header, i) => {
		const longest = Math.max(header.length, ...table.rows.map((r) => String(r[i] ?? '').length));
		sheet.getColumn(i + 1).width = Math.min(80, Math.max(10, longest + 2));
	});
}

export async function tablesToXlsx(tables: readonly ExportTable[], meta: { title: string }): Promise<Uint8Array<ArrayBuffer>> {
	const workbook = new ExcelJS.Workbook();
	workbook.creator = 'Tidewright';
	workbook.title = meta.title;
	for (const table of tables) addSheet(workbook, table);
	const buffer = await workbook.xlsx.writeBuffer();
	return new Uint8Array(buffer as ArrayBuffer);
}
