/**
 * Reading one cell as a number or a timestamp. Each reader returns either the
 * value or the reason in words, for the caller to prefix with row and column.
 */

export type CellResult<T> = { ok: true; value: T } | { ok: false; reason: string };

export interface NumberCell {
	value: number;
	/** The cell in plain decimal notation with a point, e.g. "1.25", for exact decimal arithmetic. */
	text: string;
}

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NOT_FINITE = /^[+-]?(nan|inf|infinity|∞)$/i;

function quote(raw: string): string {
	const shown = raw.length > 40 ? `${raw.slice(0, 37)}...` : raw;
	return `"${shown}"`;
}

/**
 * Reads a number. A decimal comma ("1,25") is read only when the file is
 * separated by semicolons or tabs; thousands separators are never read, so
 * "1.234,5" and "1,234.5" are refused rather than guessed.
 */
export function readNumber(raw: string, decimalComma: boolean): CellResult<NumberCell> {
	if (raw === '') return { ok: false, reason: 'the cell is empty; a number is needed.' };
	if (NOT_FINITE.test(raw)) return { ok: false, reason: `${quote(raw)} is not a finite number.` };
	let text = raw;
	if (raw.includes(',')) {
		const single = raw.indexOf(',') === raw.lastIndexOf(',') && !raw.includes('.');
		if (!decimalComma) {
			return {
				ok: false,
				reason: `${quote(raw)} is not a number: use a point as the decimal mark in a comma-separated file.`
			};
		}
		if (!single) return { ok: false, reason: `${quote(raw)} is not a number: leave out thousands separators.` };
		text = raw.replace(',', '.');
	}
	if (!PLAIN_NUMBER.test(text)) return { ok: false, reason: `${quote(raw)} is not a number.` };
	const value = Number(text);
	if (!Number.isFinite(value)) return { ok: false, reason: `${quote(raw)} is too large to be a number.` };
	return { ok: true, value: { value, text: text.startsWith('+') ? text.slice(1) : text } };
}

/** True when a header cell is a number: the header row is probably missing. */
export function looksNumeric(raw: string): boolean {
	return raw !== '' && PLAIN_NUMBER.test(raw.replace(',', '.'));
}

export interface TimestampCell {
	/** Milliseconds since 1970-01-01T00:00:00Z. */
	epochMs: number;
	/** True when the cell named its offset (Z or +hh:mm); false when it was read as UTC. */
	hasZone: boolean;
}

// ISO 8601 extended calendar date and time: date, "T" or a space, hh:mm, optional :ss and
// fraction, optional zone (Z, +hh:mm, +hhmm or +hh).
const ISO_TIMESTAMP =
	/^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function daysInMonth(year: number, month: number): number {
	const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
	return month === 2 && leap ? 29 : DAYS_IN_MONTH[month - 1];
}

const TIMESTAMP_HINT = 'write it as ISO 8601, e.g. 2025-03-01T00:10:00Z or 2025-03-01 00:10';

/**
 * Reads an ISO 8601 date and time. Without a zone the time is read as UTC:
 * binning uses only the differences between timestamps, so the assumption
 * moves the reported first and last times but no bin.
 */
export function readTimestamp(raw: string): CellResult<TimestampCell> {
	if (raw === '') return { ok: false, reason: 'the cell is empty; a date and time is needed.' };
	const m = ISO_TIMESTAMP.exec(raw);
	if (!m) return { ok: false, reason: `${quote(raw)} is not a date and time: ${TIMESTAMP_HINT}.` };
	const [, y, mo, d, h, mi, s = '0', frac = '', zone] = m;
	const year = Number(y);
	const month = Number(mo);
	const day = Number(d);
	const hour = Number(h);
	const minute = Number(mi);
	const second = Number(s);
	if (year < 1000 || month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) {
		return { ok: false, reason: `${quote(raw)} is not a real calendar date.` };
	}
	if (hour > 23 || minute > 59 || second > 59) {
		return { ok: false, reason: `${quote(raw)} has a time of day out of range (00:00:00 to 23:59:59).` };
	}
	let offsetMinutes = 0;
	if (zone && zone.toUpperCase() !== 'Z') {
		const sign = zone[0] === '-' ? -1 : 1;
		const digits = zone.slice(1).replace(':', '');
		const oh = Number(digits.slice(0, 2));
		const om = digits.length > 2 ? Number(digits.slice(2, 4)) : 0;
		if (oh > 18 || om > 59) return { ok: false, reason: `${quote(raw)} has a time zone offset out of range.` };
		offsetMinutes = sign * (oh * 60 + om);
	}
	const millis = frac === '' ? 0 : Math.round(Number(`0.${frac}`) * 1000);
	const epochMs =
		Date.UTC(year, month - 1, day, hour, minute, second, millis) - offsetMinutes * 60_000;
	return { ok: true, value: { epochMs, hasZone: zone !== undefined } };
}
