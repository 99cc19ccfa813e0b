/**
 * Shared CSV reading for every upload kind: bytes to text (see decode.ts),
 * delimiter detection, papaparse, blank-row skipping, ragged-row and row-limit
 * checks, and header lookup. Row numbers are the ones a spreadsheet shows when
 * it opens the file: the first line is row 1, blank lines keep their numbers,
 * and a quoted cell spanning two lines is still one row.
 */
import Papa from 'papaparse';
import { decodeCsvBytes, DEFAULT_MAX_BYTES } from './decode';
import { looksNumeric } from './cells';
import type { Column } from './fields';
import { ErrorCollector, fileFailure, type UploadFailure } from './result';

export type Delimiter = ',' | ';' | '\t';

export interface CsvRow {
	/** Spreadsheet row number, 1-based. */
	row: number;
	cells: string[];
}

export interface CsvGrid {
	delimiter: Delimiter;
	/**
	 * True when cells may use a comma as decimal separator: files separated by
	 * semicolons or tabs (the usual export where the comma is the decimal mark).
	 */
	decimalComma: boolean;
	/** Non-blank rows, cells trimmed of surrounding spaces. */
	rows: CsvRow[];
}

export interface CsvTable {
	delimiter: Delimiter;
	decimalComma: boolean;
	headerRow: number;
	/** Header names as written, trimmed; trailing empty header cells dropped. */
	header: string[];
	/** Data rows, each with exactly header.length cells. */
	rows: CsvRow[];
}

export interface ReadOptions {
	/** Refuse files larger than this many bytes, before parsing (default 20 MB). */
	maxBytes?: number;
	/** Refuse files with more data rows than this (header not counted). */
	maxRows: number;
}

export type GridResult = { ok: true; grid: CsvGrid } | UploadFailure;
export type TableResult = { ok: true; table: CsvTable } | UploadFailure;

/**
 * Picks the delimiter from the first non-blank line, outside quotes: a tab if
 * there is one, else a semicolon, else a comma. Header names never hold tabs
 * or semicolons, while a semicolon-separated row may hold as many decimal
 * commas as semicolons, so counting would be a coin toss.
 */
export function detectDelimiter(text: string): Delimiter {
	const firstLine = /[^\r\n]*\S[^\r\n]*/.exec(text)?.[0] ?? '';
	let quoted = false;
	let semicolon = false;
	for (const ch of firstLine) {
		if (ch === '"') quoted = !quoted;
		else if (quoted) continue;
		else if (ch === '\t') return '\t';
		else if (ch === ';') semicolon = true;
	}
	return semicolon ? ';' : ',';
}

function isBlankRow(cells: string[]): boolean {
	return cells.every((c) => c.trim() === '');
}

/** Drops empty cells at the end of a row, as spreadsheets add them after the last used column. */
function trimTrailingEmpty(cells: string[]): string[] {
	let end = cells.length;
	while (end > 0 && cells[end - 1] === '') end--;
	return end === cells.length ? cells : cells.slice(0, end);
}

/** Reads the bytes into non-blank rows of trimmed cells, with their spreadsheet row numbers. */
export function readCsvGrid(bytes: Uint8Array, options: ReadOptions): GridResult {
	const decoded = decodeCsvBytes(bytes, options.maxBytes ?? DEFAULT_MAX_BYTES);
	if (!decoded.ok) return decoded;

	const delimiter = detectDelimiter(decoded.text);
	const parsed = Papa.parse<string[]>(decoded.text, { delimiter, skipEmptyLines: false });

	const quoteErrors = new ErrorCollector();
	for (const e of parsed.errors) {
		if (e.type !== 'Quotes' || e.row === undefined) continue;
		quoteErrors.add(
			e.row + 1,
			null,
			'a quoted cell is not closed or has a stray quote mark (").'
		);
	}
	if (quoteErrors.hasErrors) return quoteErrors.toFailure();

	const rows: CsvRow[] = [];
	parsed.data.forEach((cells, index) => {
		if (isBlankRow(cells)) return;
		rows.push({ row: index + 1, cells: cells.map((c) => c.trim()) });
	});
	if (rows.length === 0) return fileFailure('The file is empty.');

	const dataRows = rows.length - 1;
	if (dataRows > options.maxRows) {
		return fileFailure(
			`The file has ${dataRows.toLocaleString('en')} data rows, more than the limit of ` +
				`${options.maxRows.toLocaleString('en')} for this kind of upload.`
		);
	}
	return { ok: true, grid: { delimiter, decimalComma: delimiter !== ',', rows } };
}

/**
 * Checks every data row has as many cells as the header. Empty cells past the
 * last header column are ignored (spreadsheets add them); anything else is a
 * ragged row.
 */
export function checkRowWidths(grid: CsvGrid, headerWidth: number, errors: ErrorCollector): CsvRow[] {
	const [, ...data] = grid.rows;
	const out: CsvRow[] = [];
	for (const r of data) {
		const cells = r.cells.length > headerWidth ? trimTrailingEmpty(r.cells) : r.cells;
		if (cells.length === headerWidth) {
			out.push({ row: r.row, cells });
			continue;
		}
		const has = `${cells.length} ${cells.length === 1 ? 'value' : 'values'}`;
		let text = `has ${has} but the header has ${headerWidth} columns.`;
		if (cells.length > headerWidth && grid.delimiter === ',') {
			text += ' If the numbers use a decimal comma, separate the columns with semicolons instead.';
		}
		errors.add(r.row, null, text);
	}
	return out;
}

/** Reads a table whose first non-blank row is the header. Ragged rows fail the whole upload. */
export function readCsvTable(bytes: Uint8Array, options: ReadOptions): TableResult {
	const read = readCsvGrid(bytes, options);
	if (!read.ok) return read;
	const { grid } = read;
	const [headerRow] = grid.rows;
	const header = trimTrailingEmpty(headerRow.cells);

	const errors = new ErrorCollector();
	header.forEach((name, i) => {
		if (name === '') errors.add(headerRow.row, null, `column ${i + 1} of the header has no name.`);
	});
	const seen = new Map<string, number>();
	header.forEach((name, i) => {
		const key = name.toLowerCase();
		if (key === '') return;
		if (seen.has(key)) errors.add(headerRow.row, name, `the column name appears twice in the header.`);
		else seen.set(key, i);
	});
	if (errors.hasErrors) return errors.toFailure();

	if (grid.rows.length === 1) {
		return fileFailure(`The file has a header (row ${headerRow.row}) but no data rows below it.`);
	}
	const rows = checkRowWidths(grid, header.length, errors);
	if (errors.hasErrors) return errors.toFailure();

	return {
		ok: true,
		table: {
			delimiter: grid.delimiter,
			decimalComma: grid.decimalComma,
			headerRow: headerRow.row,
			header,
			rows
		}
	};
}

export interface ColumnRequest {
	/** Columns that must be present, by exact name (compared without case). */
	required: readonly string[];
	/** Groups of which exactly one must be present, e.g. ["hours", "probability"]. */
	oneOf?: readonly (readonly string[])[];
}

export interface ResolvedColumns {
	/** Each found column by its requested name in lower case. */
	byName: Map<string, Column>;
	/** Chosen member of each oneOf group, in order. */
	chosen: string[];
	warnings: string[];
}

function describeHeader(names: readonly string[]): string {
	return names.map((n) => `"${n}"`).join(', ');
}

/**
 * Finds the requested columns in the header. Missing columns fail the upload
 * with the expected header spelled out; columns nobody asked for are ignored
 * with a warning.
 */
export function resolveColumns(
	table: CsvTable,
	request: ColumnRequest,
	exampleHeader: readonly string[]
): { ok: true; columns: ResolvedColumns } | UploadFailure {
	const byName = new Map<string, number>();
	table.header.forEach((name, i) => byName.set(name.toLowerCase(), i));

	const problems: string[] = [];
	const found = new Map<string, Column>();
	const use = (name: string) => {
		const index = byName.get(name.toLowerCase())!;
		found.set(name.toLowerCase(), { index, name: table.header[index] });
	};

	const missing = request.required.filter((name) => !byName.has(name.toLowerCase()));
	if (missing.length > 0) {
		problems.push(`missing ${missing.length === 1 ? 'column' : 'columns'} ${describeHeader(missing)}`);
	}
	request.required.filter((name) => byName.has(name.toLowerCase())).forEach(use);

	const chosen: string[] = [];
	for (const group of request.oneOf ?? []) {
		const present = group.filter((name) => byName.has(name.toLowerCase()));
		if (present.length === 0) problems.push(`needs one of the columns ${describeHeader(group)}`);
		else if (present.length > 1) problems.push(`has both ${describeHeader(present)}; keep only one of them`);
		else {
			use(present[0]);
			chosen.push(present[0].toLowerCase());
		}
	}

	if (problems.length > 0) {
		let note = '';
		if (table.header.every(looksNumeric)) {
			note = ' The first row looks like data: add the header row above it.';
		} else if (table.header.length === 1) {
			note = ' Columns must be separated by commas, semicolons or tabs.';
		}
		return fileFailure(
			`Row ${table.headerRow} (the header) ${problems.join('; ')}. ` +
				`It reads ${describeHeader(table.header)}; the expected header is ${describeHeader(exampleHeader)}.` +
				note
		);
	}

	const used = new Set([...found.values()].map((c) => c.index));
	const extra = table.header.filter((_, i) => !used.has(i));
	const warnings =
		extra.length > 0
			? [`Ignored ${extra.length === 1 ? 'column' : 'columns'} ${describeHeader(extra)}: not used by this upload.`]
			: [];
	return { ok: true, columns: { byName: found, chosen, warnings } };
}
