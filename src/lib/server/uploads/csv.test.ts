import { describe, expect, it } from 'vitest';
import { detectDelimiter, readCsvGrid, readCsvTable, resolveColumns, type CsvTable } from './csv';

const utf8 = (text: string) => new TextEncoder().encode(text);
const LIMITS = { maxRows: 1000 };

function table(text: string): CsvTable {
	const result = readCsvTable(utf8(text), LIMITS);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result.table;
}
function errorsOf(result: { ok: boolean; errors?: { message: string }[] }): string[] {
	expect(result.ok).toBe(false);
	return (result.errors ?? []).map((e) => e.message);
}

describe('detectDelimiter', () => {
	it('finds commas, semicolons and tabs from the first line', () => {
		expect(detectDelimiter('speed_m_s,hours\n0,1;2\n')).toBe(',');
		expect(detectDelimiter('speed_m_s;hours\n0,1;2\n')).toBe(';');
		expect(detectDelimiter('speed_m_s\thours\n')).toBe('\t');
	});

	it('prefers a semicolon even when decimal commas are as many', () => {
		expect(detectDelimiter('hs_m/te_s;6,5;7,5\n')).toBe(';');
	});

	it('skips leading blank lines and ignores delimiters inside quotes', () => {
		expect(detectDelimiter('\n\n"a;b;c",d\n')).toBe(',');
	});

	it('falls back to a comma for a single column', () => {
		expect(detectDelimiter('speed\n1\n')).toBe(',');
	});
});

describe('readCsvGrid', () => {
	it('numbers rows as a spreadsheet does: blank lines keep their numbers', () => {
		const result = readCsvGrid(utf8('a,b\n\n1,2\n\n\n3,4\n'), LIMITS);
		if (!result.ok) throw new Error('expected ok');
		expect(result.grid.rows.map((r) => r.row)).toEqual([1, 3, 6]);
	});

	it('counts a quoted cell spanning two lines as one row (RFC 4180 section 2.6)', () => {
		const result = readCsvGrid(utf8('a,b\n"x\ny",2\n3,4\n'), LIMITS);
		if (!result.ok) throw new Error('expected ok');
		expect(result.grid.rows).toEqual([
			{ row: 1, cells: ['a', 'b'] },
			{ row: 2, cells: ['x\ny', '2'] },
			{ row: 3, cells: ['3', '4'] }
		]);
	});

	it('reads Windows and old Mac line endings', () => {
		for (const newline of ['\r\n', '\r']) {
			const result = readCsvGrid(utf8(['a,b', '1,2', '3,4'].join(newline)), LIMITS);
			if (!result.ok) throw new Error('expected ok');
			expect(result.grid.rows).toHaveLength(3);
		}
	});

	it('trims spaces around cells and unquotes doubled quotes (RFC 4180 section 2.7)', () => {
		const result = readCsvGrid(utf8(' a , b \n"c ""x""",d\n'), LIMITS);
		if (!result.ok) throw new Error('expected ok');
		expect(result.grid.rows[0].cells).toEqual(['a', 'b']);
		expect(result.grid.rows[1].cells).toEqual(['c "x"', 'd']);
	});

	it('refuses an unclosed quote and names its row', () => {
		expect(errorsOf(readCsvGrid(utf8('a,b\n1,2\n"3,4\n'), LIMITS))).toEqual([
			'Row 3: a quoted cell is not closed or has a stray quote mark (").'
		]);
	});

	it('refuses more data rows than the limit (header not counted)', () => {
		const rows = ['a,b', ...Array.from({ length: 11 }, (_, i) => `${i},1`)].join('\n');
		expect(readCsvGrid(utf8(rows), { maxRows: 11 }).ok).toBe(true);
		expect(errorsOf(readCsvGrid(utf8(rows + '\n11,1'), { maxRows: 11 }))).toEqual([
			'The file has 12 data rows, more than the limit of 11 for this kind of upload.'
		]);
	});

	it('marks semicolon- and tab-separated files as using decimal commas', () => {
		const result = readCsvGrid(utf8('a;b\n1,5;2\n'), LIMITS);
		if (!result.ok) throw new Error('expected ok');
		expect(result.grid).toMatchObject({ delimiter: ';', decimalComma: true });
		expect(result.grid.rows[1].cells).toEqual(['1,5', '2']);
	});
});

describe('readCsvTable', () => {
	it('refuses a header with no rows below it', () => {
		expect(errorsOf(readCsvTable(utf8('speed_m_s,hours\n\n'), LIMITS))).toEqual([
			'The file has a header (row 1) but no data rows below it.'
		]);
	});

	it('refuses ragged rows, naming each', () => {
		expect(errorsOf(readCsvTable(utf8('a,b\n1,2\n3\n4,5,6\n'), LIMITS))).toEqual([
			'Row 3: has 1 value but the header has 2 columns.',
			'Row 4: has 3 values but the header has 2 columns. If the numbers use a decimal comma, separate the columns with semicolons instead.'
		]);
	});

	it('ignores empty cells after the last column, as spreadsheets write them', () => {
		expect(table('a,b,,\n1,2,,\n3,4\n').rows).toEqual([
			{ row: 2, cells: ['1', '2'] },
			{ row: 3, cells: ['3', '4'] }
		]);
	});

	it('refuses an unnamed or repeated header column', () => {
		expect(errorsOf(readCsvTable(utf8('a,,b\n1,2,3\n'), LIMITS))).toEqual(['Row 1: column 2 of the header has no name.']);
		expect(errorsOf(readCsvTable(utf8('hours,Hours\n1,2\n'), LIMITS))).toEqual([
			'Row 1, column "Hours": the column name appears twice in the header.'
		]);
	});
});

describe('resolveColumns', () => {
	const request = { required: ['speed_m_s'], oneOf: [['hours', 'probability']] };
	const example = ['speed_m_s', 'hours'];

	it('finds columns whatever their case and order, and warns about extras', () => {
		const result = resolveColumns(table('Hours,note,SPEED_M_S\n1,x,2\n'), request, example);
		if (!result.ok) throw new Error('expected ok');
		expect(result.columns.byName.get('speed_m_s')).toEqual({ index: 2, name: 'SPEED_M_S' });
		expect(result.columns.chosen).toEqual(['hours']);
		expect(result.columns.warnings).toEqual(['Ignored column "note": not used by this upload.']);
	});

	it('names missing columns and spells out the expected header', () => {
		expect(errorsOf(resolveColumns(table('speed,hours\n1,2\n'), request, example))).toEqual([
			'Row 1 (the header) missing column "speed_m_s". It reads "speed", "hours"; the expected header is "speed_m_s", "hours".'
		]);
	});

	it('needs exactly one of a group', () => {
		expect(errorsOf(resolveColumns(table('speed_m_s,count\n1,2\n'), request, example))[0]).toMatch(
			/needs one of the columns "hours", "probability"/
		);
		expect(errorsOf(resolveColumns(table('speed_m_s,hours,probability\n1,2,0.5\n'), request, example))[0]).toMatch(
			/has both "hours", "probability"; keep only one of them/
		);
	});

	it('says when the header row is missing', () => {
		expect(errorsOf(resolveColumns(table('0.1,20\n0.2,30\n'), request, example))[0]).toMatch(
			/The first row looks like data: add the header row above it\.$/
		);
	});

	it('hints at the separator when the whole header is one cell', () => {
		expect(errorsOf(resolveColumns(table('speed_m_s|hours\n1|2\n'), request, example))[0]).toMatch(
			/Columns must be separated by commas, semicolons or tabs\.$/
		);
	});
});
