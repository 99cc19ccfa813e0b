/**
 * Reads one typed value from a data row, adding a row-and-column error to the
 * collector when the cell is bad. Used by every upload kind so the same cell
 * problem always reads the same way.
 */
import { readNumber, readTimestamp, type NumberCell, type TimestampCell } from './cells';
import type { CsvRow } from './csv';
import type { ErrorCollector } from './result';

export interface Column {
	index: number;
	/** The header name as written in the file. */
	name: string;
}

export interface NumberRule {
	/** What the value is, in words: "a speed", "a probability". */
	what: string;
	min?: number;
	/** True when min itself is not allowed (e.g. a wave period must be above 0). */
	exclusiveMin?: boolean;
	max?: number;
	/** Added after the sentence when the value is above max. */
	aboveMaxHint?: string;
}

export function numberAt(
	r: CsvRow,
	column: Column,
	decimalComma: boolean,
	errors: ErrorCollector,
	rule: NumberRule
): NumberCell | null {
	const raw = r.cells[column.index];
	const read = readNumber(raw, decimalComma);
	if (!read.ok) {
		errors.add(r.row, column.name, read.reason);
		return null;
	}
	const { value } = read.value;
	if (rule.min !== undefined) {
		if (value < rule.min || (rule.exclusiveMin && value === rule.min)) {
			const text =
				rule.min === 0 && value < 0
					? `"${raw}" is negative; ${rule.what} cannot be below 0.`
					: `"${raw}" is too small; ${rule.what} must be ${rule.exclusiveMin ? 'above' : 'at least'} ${rule.min}.`;
			errors.add(r.row, column.name, text);
			return null;
		}
	}
	if (rule.max !== undefined && value > rule.max) {
		const hint = rule.aboveMaxHint ? ` ${rule.aboveMaxHint}` : '';
		errors.add(r.row, column.name, `"${raw}" is above ${rule.max}; ${rule.what} cannot be above ${rule.max}.${hint}`);
		return null;
	}
	return read.value;
}

export function timestampAt(r: CsvRow, column: Column, errors: ErrorCollector): TimestampCell | null {
	const read = readTimestamp(r.cells[column.index]);
	if (!read.ok) {
		errors.add(r.row, column.name, read.reason);
		return null;
	}
	return read.value;
}
