/**
 * Power matrix upload, laid out as a grid: the first row holds the energy
 * periods Te (s) after a corner cell, the first column holds the significant
 * wave heights Hs (m), and each cell the mean electrical power in kW.
 * A blank cell means the device does not operate in that sea state: 0 kW.
 * Both axes must increase (the engine interpolates between neighbours).
 * A corner cell naming Tp (e.g. "hs_m/tp_s") marks the columns as peak periods.
 * Produces the scenario's `power-matrix` device.
 */
import { Decimal } from '../engine/decimal';
import { looksNumeric, readNumber } from './cells';
import { checkRowWidths, readCsvGrid } from './csv';
import { DEFAULT_MAX_BYTES } from './decode';
import { numberAt, type Column } from './fields';
import { beyondScenarioLimit } from './limits';
import { DEFAULT_TE_OVER_TP, plain, type PowerMatrixDevice } from './fragments';
import { ErrorCollector, fileFailure, type UploadResult } from './result';

export const POWER_MATRIX_CORNER = 'hs_m/te_s';
export const DEFAULT_MATRIX_MAX_ROWS = 500;
export const DEFAULT_MATRIX_MAX_COLUMNS = 500;

export interface PowerMatrixOptions {
	maxBytes?: number;
	/** Most Hs rows (default 500). */
	maxRows?: number;
	/** Most Te columns (default 500). */
	maxColumns?: number;
}

export interface PowerMatrixSummary {
	hsCount: number;
	periodCount: number;
	periodType: 'energy-period' | 'peak-period';
	minHsM: string;
	maxHsM: string;
	minPeriodS: string;
	maxPeriodS: string;
	/** Highest power in the matrix. */
	ratedPowerKW: string;
	/** Cells left blank, read as 0 kW (not operating). */
	blankCells: number;
	/** Cells with power above 0. */
	operatingCells: number;
}

/** The spreadsheet letter of a 0-based column: 0 -> A, 26 -> AA. */
export function columnLetter(index: number): string {
	let n = index + 1;
	let out = '';
	while (n > 0) {
		const rem = (n - 1) % 26;
		out = String.fromCharCode(65 + rem) + out;
		n = Math.floor((n - 1) / 26);
	}
	return out;
}

function periodTypeOfCorner(corner: string): 'energy-period' | 'peak-period' | null {
	const tokens = corner.toLowerCase().split(/[^a-z]+/);
	if (tokens.includes('tp')) return 'peak-period';
	if (tokens.includes('te')) return 'energy-period';
	return null;
}

export function parsePowerMatrixCsv(
	bytes: Uint8Array,
	options: PowerMatrixOptions = {}
): UploadResult<PowerMatrixDevice, PowerMatrixSummary> {
	const maxColumns = options.maxColumns ?? DEFAULT_MATRIX_MAX_COLUMNS;
	const read = readCsvGrid(bytes, {
		maxBytes: options.maxBytes ?? DEFAULT_MAX_BYTES,
		maxRows: options.maxRows ?? DEFAULT_MATRIX_MAX_ROWS
	});
	if (!read.ok) return read;
	const { grid } = read;
	const [headerRow] = grid.rows;
	let headerCells = headerRow.cells;
	while (headerCells.length > 1 && headerCells[headerCells.length - 1] === '') headerCells = headerCells.slice(0, -1);

	const warnings: string[] = [];
	const corner = headerCells[0];
	if (looksNumeric(corner)) {
		return fileFailure(
			`Row ${headerRow.row}, column "A": the top-left cell holds the number "${corner}". The first row must list the ` +
				`wave periods from column B on, with a label such as "${POWER_MATRIX_CORNER}" (or nothing) in the top-left cell.`
		);
	}
	const periodType = periodTypeOfCorner(corner) ?? 'energy-period';
	if (periodTypeOfCorner(corner) === null) {
		warnings.push(
			`The top-left cell ${corner === '' ? 'is blank' : `reads "${corner}"`}; the columns were read as energy periods Te. ` +
				`Write "${POWER_MATRIX_CORNER}" there (or "hs_m/tp_s" for peak periods) to say so.`
		);
	}
	const periodName = periodType === 'peak-period' ? 'Tp' : 'Te';
	if (headerCells.length < 2) {
		return fileFailure(
			`Row ${headerRow.row} must list the wave periods ${periodName} (s) to the right of the top-left cell; it has none.`
		);
	}
	const tooWide = beyondScenarioLimit('powerMatrixPeriodValues', headerCells.length - 1, 'period columns');
	if (tooWide) return tooWide;
	if (headerCells.length - 1 > maxColumns) {
		return fileFailure(
			`The matrix has ${headerCells.length - 1} period columns, more than the limit of ${maxColumns}.`
		);
	}
	if (grid.rows.length === 1) {
		return fileFailure(`The file has the period row (row ${headerRow.row}) but no Hs rows below it.`);
	}
	const tooTall = beyondScenarioLimit('powerMatrixHsValues', grid.rows.length - 1, 'Hs rows');
	if (tooTall) return tooTall;

	const errors = new ErrorCollector();
	const periods: { text: string; value: number }[] = [];
	for (let i = 1; i < headerCells.length; i++) {
		const raw = headerCells[i];
		const letter = columnLetter(i);
		const read = readNumber(raw, grid.decimalComma);
		if (!read.ok) {
			const reason =
				raw === ''
					? `the cell is empty; the first row must give a wave period ${periodName} in seconds above every column.`
					: `${read.reason.replace(/\.$/, '')}; the first row holds the wave periods ${periodName} in seconds.`;
			errors.add(headerRow.row, letter, reason);
			continue;
		}
		if (read.value.value <= 0) {
			errors.add(headerRow.row, letter, `"${raw}" is not above 0; a wave period must be above 0 s.`);
			continue;
		}
		const previous = periods[periods.length - 1];
		if (previous && read.value.value <= previous.value) {
			const problem =
				read.value.value === previous.value ? `repeats the period on its left` : `is below ${previous.text} s on its left`;
			errors.add(headerRow.row, letter, `${periodName} ${read.value.text} s ${problem}; periods must increase from left to right.`);
		}
		periods.push(read.value);
	}
	if (errors.hasErrors) return errors.toFailure();

	const rows = checkRowWidths(grid, headerCells.length, errors);
	if (errors.hasErrors) return errors.toFailure();

	// Cells are named by their axis value, as the grid has no header names: column "Te 7.5 s".
	const hsColumn: Column = { index: 0, name: 'Hs' };
	const periodColumns: Column[] = periods.map((p, i) => ({ index: i + 1, name: `${periodName} ${p.text} s` }));
	const hsValues: { row: number; text: string; value: number }[] = [];
	const powers: number[][] = [];
	let blankCells = 0;
	let operatingCells = 0;
	let ratedText = '0';
	let rated = 0;
	const firstRowOfHs = new Map<number, number>();
	for (const r of rows) {
		const hs = numberAt(r, hsColumn, grid.decimalComma, errors, { what: 'a wave height', min: 0 });
		if (hs) {
			const duplicateOf = firstRowOfHs.get(hs.value);
			const previous = hsValues[hsValues.length - 1];
			if (duplicateOf !== undefined) {
				errors.add(r.row, hsColumn.name, `Hs ${hs.text} m already has a row (row ${duplicateOf}); each Hs may appear once.`);
			} else if (previous && hs.value < previous.value) {
				errors.add(
					r.row,
					hsColumn.name,
					`Hs ${hs.text} m is below Hs ${previous.text} m on row ${previous.row}; Hs must increase down the first column.`
				);
			} else {
				firstRowOfHs.set(hs.value, r.row);
			}
			hsValues.push({ row: r.row, text: hs.text, value: hs.value });
		}
		const rowPowers: number[] = [];
		for (const column of periodColumns) {
			if (r.cells[column.index] === '') {
				blankCells++;
				rowPowers.push(0);
				continue;
			}
			const power = numberAt(r, column, grid.decimalComma, errors, { what: 'a power', min: 0 });
			if (!power) continue;
			if (power.value > 0) operatingCells++;
			if (power.value > rated) {
				rated = power.value;
				ratedText = power.text;
			}
			rowPowers.push(power.value);
		}
		powers.push(rowPowers);
	}
	if (errors.hasErrors) return errors.toFailure();
	if (operatingCells === 0) return fileFailure('Every cell of the power matrix is 0 or blank: the device never produces power.');
	if (blankCells > 0) {
		warnings.push(`${blankCells} blank ${blankCells === 1 ? 'cell was' : 'cells were'} read as 0 kW (the device does not operate in those sea states).`);
	}
	if (periodType === 'peak-period') {
		warnings.push(
			`Columns are peak periods Tp; energy is computed with Te = ${DEFAULT_TE_OVER_TP} x Tp unless the scenario sets another ratio.`
		);
	}

	const d = (text: string) => plain(new Decimal(text));
	return {
		ok: true,
		data: {
			kind: 'power-matrix',
			periodType,
			teOverTp: DEFAULT_TE_OVER_TP,
			hsM: hsValues.map((h) => h.value),
			periodS: periods.map((p) => p.value),
			powerKW: powers,
			lookup: 'bilinear'
		},
		summary: {
			hsCount: hsValues.length,
			periodCount: periods.length,
			periodType,
			minHsM: d(hsValues[0].text),
			maxHsM: d(hsValues[hsValues.length - 1].text),
			minPeriodS: d(periods[0].text),
			maxPeriodS: d(periods[periods.length - 1].text),
			ratedPowerKW: d(ratedText),
			blankCells,
			operatingCells
		},
		warnings
	};
}
