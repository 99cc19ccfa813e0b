import { describe, expect, it } from 'vitest';
import { deviceSchema } from '../../schemas/scenario';
import { columnLetter, parsePowerMatrixCsv } from './power-matrix';

const csv = (...lines: string[]) => new TextEncoder().encode(lines.join('\n') + '\n');

function parsed(bytes: Uint8Array, options = {}) {
	const result = parsePowerMatrixCsv(bytes, options);
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}
function messages(bytes: Uint8Array, options = {}): string[] {
	const result = parsePowerMatrixCsv(bytes, options);
	if (result.ok) throw new Error('expected the upload to be refused');
	return result.errors.map((e) => e.message);
}

const MATRIX = csv(
	'hs_m/te_s,6,7,8',
	'0.5,5,6,5',
	'1.0,,25,22',
	'1.5,,55,50'
);

describe('columnLetter', () => {
	it('names columns as spreadsheets do', () => {
		expect([0, 1, 25, 26, 27, 51, 52, 701, 702].map(columnLetter)).toEqual([
			'A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA'
		]);
	});
});

describe('parsePowerMatrixCsv: good files', () => {
	it('reads the grid: Te across the top, Hs down the side, blank cells as 0 kW', () => {
		const { data, summary, warnings } = parsed(MATRIX);
		expect(data).toEqual({
			kind: 'power-matrix',
			periodType: 'energy-period',
			teOverTp: 0.9,
			hsM: [0.5, 1, 1.5],
			periodS: [6, 7, 8],
			powerKW: [
				[5, 6, 5],
				[0, 25, 22],
				[0, 55, 50]
			],
			lookup: 'bilinear'
		});
		expect(summary).toEqual({
			hsCount: 3,
			periodCount: 3,
			periodType: 'energy-period',
			minHsM: '0.5',
			maxHsM: '1.5',
			minPeriodS: '6',
			maxPeriodS: '8',
			ratedPowerKW: '55',
			blankCells: 2,
			operatingCells: 7
		});
		expect(warnings).toEqual([
			'2 blank cells were read as 0 kW (the device does not operate in those sea states).'
		]);
	});

	it('reads a Tp corner as peak periods, and a blank corner as Te with a warning', () => {
		expect(parsed(csv('hs_m/tp_s,8,10', '1,10,20')).data.periodType).toBe('peak-period');
		const blank = parsed(csv(',8,10', '1,10,20'));
		expect(blank.data.periodType).toBe('energy-period');
		expect(blank.warnings).toEqual([
			'The top-left cell is blank; the columns were read as energy periods Te. Write "hs_m/te_s" there (or "hs_m/tp_s" for peak periods) to say so.'
		]);
	});

	it('reads semicolons with decimal commas', () => {
		const { data } = parsed(csv('hs_m/te_s;6,5;7,5', '0,5;1,5;2', '1;;4,25'));
		expect(data.periodS).toEqual([6.5, 7.5]);
		expect(data.powerKW).toEqual([
			[1.5, 2],
			[0, 4.25]
		]);
	});

	it('produces a device the scenario schema accepts unchanged', () => {
		const { data } = parsed(MATRIX);
		expect(deviceSchema.parse(data)).toEqual(data);
	});
});

describe('parsePowerMatrixCsv: bad files', () => {
	it('non-numeric period headers', () => {
		expect(messages(csv('hs_m/te_s,6,Te=7,8 s', '0.5,5,6,5'))).toEqual([
			'Row 1, column "C": "Te=7" is not a number; the first row holds the wave periods Te in seconds.',
			'Row 1, column "D": "8 s" is not a number; the first row holds the wave periods Te in seconds.'
		]);
	});

	it('periods not increasing, or not above 0', () => {
		expect(messages(csv('hs_m/te_s,6,6,5,0', '0.5,5,6,5,1'))).toEqual([
			'Row 1, column "C": Te 6 s repeats the period on its left; periods must increase from left to right.',
			'Row 1, column "D": Te 5 s is below 6 s on its left; periods must increase from left to right.',
			'Row 1, column "E": "0" is not above 0; a wave period must be above 0 s.'
		]);
	});

	it('duplicate Hs rows', () => {
		expect(messages(csv('hs_m/te_s,6,7', '0.5,5,6', '1.0,20,25', '1.00,21,26'))).toEqual([
			'Row 4, column "Hs": Hs 1.00 m already has a row (row 3); each Hs may appear once.'
		]);
	});

	it('Hs not increasing down the first column', () => {
		expect(messages(csv('hs_m/te_s,6,7', '1.0,20,25', '0.5,5,6'))).toEqual([
			'Row 3, column "Hs": Hs 0.5 m is below Hs 1.0 m on row 2; Hs must increase down the first column.'
		]);
	});

	it('text, negative and non-finite cells, named by their period', () => {
		expect(messages(csv('hs_m/te_s,6,7.5', '0.5,x,-2', '1.0,Infinity,3'))).toEqual([
			'Row 2, column "Te 6 s": "x" is not a number.',
			'Row 2, column "Te 7.5 s": "-2" is negative; a power cannot be below 0.',
			'Row 3, column "Te 6 s": "Infinity" is not a finite number.'
		]);
	});

	it('a missing header row (a number in the top-left cell)', () => {
		expect(messages(csv('0.5,5,6', '1.0,20,25'))).toEqual([
			'Row 1, column "A": the top-left cell holds the number "0.5". The first row must list the wave periods from column B on, with a label such as "hs_m/te_s" (or nothing) in the top-left cell.'
		]);
	});

	it('ragged rows', () => {
		expect(messages(csv('hs_m/te_s,6,7', '0.5,5', '1.0,20,25,30'))).toEqual([
			'Row 2: has 2 values but the header has 3 columns.',
			'Row 3: has 4 values but the header has 3 columns. If the numbers use a decimal comma, separate the columns with semicolons instead.'
		]);
	});

	it('no periods, no Hs rows, nothing producing', () => {
		expect(messages(csv('hs_m/te_s', '0.5'))).toEqual([
			'Row 1 must list the wave periods Te (s) to the right of the top-left cell; it has none.'
		]);
		expect(messages(csv('hs_m/te_s,6,7'))).toEqual(['The file has the period row (row 1) but no Hs rows below it.']);
		expect(messages(csv('hs_m/te_s,6,7', '0.5,,0'))).toEqual([
			'Every cell of the power matrix is 0 or blank: the device never produces power.'
		]);
	});

	it('too many rows or columns, empty file, wrong encoding', () => {
		expect(messages(MATRIX, { maxRows: 2 })).toEqual(['The file has 3 data rows, more than the limit of 2 for this kind of upload.']);
		expect(messages(MATRIX, { maxColumns: 2 })).toEqual(['The matrix has 3 period columns, more than the limit of 2.']);
		expect(messages(new Uint8Array(0))).toEqual(['The file is empty.']);
		expect(messages(Uint8Array.from([0xff, 0xfe, 0x68, 0x00]))[0]).toMatch(/UTF-16/);
	});
});

describe('parsePowerMatrixCsv: the scenario’s bounds on the matrix', () => {
	const matrix = (hsCount: number, periodCount: number) =>
		csv(
			['hs_m/te_s', ...Array.from({ length: periodCount }, (_, j) => 2 + j * 0.5)].join(','),
			...Array.from({ length: hsCount }, (_, i) => [i * 0.25, ...Array.from({ length: periodCount }, () => 100)].join(','))
		);

	it('takes a matrix of 100 x 100 cells, and the result fits the schema', () => {
		const result = parsed(matrix(100, 100));
		expect(result.data.powerKW).toHaveLength(100);
		expect(result.data.powerKW[99]).toHaveLength(100);
		expect(deviceSchema.safeParse(result.data).success).toBe(true);
	});

	it('refuses a row or a column more, in the schema’s words', () => {
		expect(messages(matrix(101, 3))).toEqual(['The file has 101 Hs rows; a scenario takes at most 100 Hs values.']);
		expect(messages(matrix(3, 101))).toEqual(['The file has 101 period columns; a scenario takes at most 100 period values.']);
	});
});
