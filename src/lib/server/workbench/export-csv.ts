/**
 * CSV export (RFC 4180: comma-separated, CRLF line ends, fields with a comma,
 * quote or line break quoted, quotes doubled), with a UTF-8 byte-order mark so
 * spreadsheets read the currency symbols and dashes right.
 */
import type { ExportTable } from './export-tables';

const BOM = '\uFEFF';

/**
 * Text cells that a spreadsheet would run as a formula get a leading apostrophe (common practice against CSV injection).
 * The one rule for every CSV the app hands out: exports here, and uploaded files downloaded back (upload-download.ts).
 */
export function neutralise(cell: string): string {
	return /^[=+\-@\t\r]/.test(cell) && !/^-?\d/.test(cell) ? `'${cell}` : cell;
}

export function csvField(value: string | number | null): string {
	if (value === null) return '';
	const cell = typeof value === 'number' ? String(value) : neutralise(value);
	return /[",\r\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

export function csvLines(table: ExportTable): string[] {
	return [table.headers, ...table.rows].map((row) => row.map(csvField).join(','));
}

/**
 * One table as a CSV file. The cautions follow the table after one blank
 * line, so a reader sees them and a script can stop at the first blank line.
 */
export function tableToCsv(table: ExportTable, cautions: readonly string[] = []): string {
	const lines = csvLines(table);
	if (cautions.length > 0) lines.push('', ...cautions.map((c) => csvField(`Caution: ${c}`)));
	return BOM + lines.join('\r\n') + '\r\n';
}
