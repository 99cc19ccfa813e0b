import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { csvField, tableToCsv } from './export-csv';

describe('csvField', () => {
	// RFC 4180 section 2: fields containing commas, double quotes or line breaks
	// are enclosed in double quotes, and a double quote inside is doubled.
	it('quotes per RFC 4180', () => {
		expect(csvField('plain')).toBe('plain');
		expect(csvField('a,b')).toBe('"a,b"');
		expect(csvField('say "hi"')).toBe('"say ""hi"""');
		expect(csvField('two\nlines')).toBe('"two\nlines"');
		expect(csvField(null)).toBe('');
		expect(csvField(-12.5)).toBe('-12.5');
	});

	it('keeps negative numbers as numbers but defuses text a spreadsheet would run as a formula', () => {
		expect(csvField('-1234.5')).toBe('-1234.5');
		expect(csvField('=HYPERLINK("x")')).toBe('"\'=HYPERLINK(""x"")"');
		expect(csvField('@SUM(A1)')).toBe("'@SUM(A1)");
	});
});

describe('tableToCsv', () => {
	it('writes a table papaparse reads back cell for cell, cautions after a blank line', () => {
		const csv = tableToCsv(
			{ title: 'T', headers: ['Year t (0 = COD)', 'Revenue (EUR, nominal)'], rows: [['0', '0'], ['1', '1250000.5']], numeric: [true, true] },
			['Estimates, for screening.']
		);
		expect(csv.startsWith('\uFEFF')).toBe(true);
		expect(csv.endsWith('\r\n')).toBe(true);
		const [table, cautions] = csv.slice(1).split('\r\n\r\n');
		const parsed = Papa.parse<string[]>(table, { skipEmptyLines: true });
		expect(parsed.data).toEqual([['Year t (0 = COD)', 'Revenue (EUR, nominal)'], ['0', '0'], ['1', '1250000.5']]);
		expect(Papa.parse<string[]>(cautions, { skipEmptyLines: true }).data).toEqual([['Caution: Estimates, for screening.']]);
	});
});
