/**
 * The "hours or probability" column shared by the speed histogram and the
 * sea-state table. Values are kept as given (the engine normalises them to
 * sum to 1); probabilities must already sum to 1 within a tolerance, so a
 * column of percentages or a missing row is caught on upload.
 */
import { Decimal, sum } from '../engine/decimal';
import type { CsvRow } from './csv';
import { numberAt, type Column } from './fields';
import { plain } from './fragments';
import type { ErrorCollector, UploadError } from './result';

export type OccurrenceBasis = 'hours' | 'probability';

/** Probabilities may sum to 1 within this (rounded spreadsheet values) before the upload is refused. */
export const DEFAULT_PROBABILITY_TOLERANCE = 0.01;

export interface Occurrence {
	value: number;
	exact: Decimal;
}

export function readOccurrence(
	r: CsvRow,
	column: Column,
	basis: OccurrenceBasis,
	decimalComma: boolean,
	errors: ErrorCollector
): Occurrence | null {
	const rule =
		basis === 'hours'
			? { what: 'a number of hours', min: 0 }
			: {
					what: 'a probability',
					min: 0,
					max: 1,
					aboveMaxHint: 'Give probabilities as fractions (0.125), not percentages (12.5).'
				};
	const cell = numberAt(r, column, decimalComma, errors, rule);
	return cell ? { value: cell.value, exact: new Decimal(cell.text) } : null;
}

/**
 * Checks the column as a whole: hours must not all be zero; probabilities
 * must sum to 1 within tolerance. Returns the exact sum.
 */
export function checkOccurrenceTotal(
	values: readonly Occurrence[],
	basis: OccurrenceBasis,
	column: Column,
	tolerance: number,
	warnings: string[]
): { ok: true; total: Decimal } | { ok: false; error: UploadError } {
	const total = sum(values.map((v) => v.exact));
	const fail = (message: string) => ({ ok: false as const, error: { row: null, column: column.name, message } });
	if (basis === 'hours') {
		if (total.isZero()) return fail(`Column "${column.name}": every value is 0, so there is no time to share out.`);
		return { ok: true, total };
	}
	if (total.isZero()) return fail(`Column "${column.name}": every probability is 0.`);
	if (total.minus(1).abs().greaterThan(tolerance)) {
		return fail(
			`Column "${column.name}": the probabilities add up to ${plain(total)}, not 1 (allowed difference ${tolerance}). ` +
				'Check for a missing or doubled row, or give hours instead.'
		);
	}
	if (!total.equals(1)) {
		warnings.push(`The probabilities add up to ${plain(total)}; they are scaled to add up to 1 when energy is computed.`);
	}
	return { ok: true, total };
}

/** p_i = x_i / sum(x): the share of time of each row, for summaries and charts. */
export function shares(values: readonly Occurrence[], total: Decimal): Decimal[] {
	return values.map((v) => v.exact.div(total));
}
