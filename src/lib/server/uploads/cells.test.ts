import { describe, expect, it } from 'vitest';
import { looksNumeric, readNumber, readTimestamp } from './cells';

function value<T>(result: { ok: true; value: T } | { ok: false; reason: string }): T {
	if (!result.ok) throw new Error(result.reason);
	return result.value;
}
function reason(result: { ok: true } | { ok: false; reason: string }): string {
	if (result.ok) throw new Error('expected a refusal');
	return result.reason;
}

describe('readNumber', () => {
	it('reads plain decimal and exponent notation', () => {
		expect(value(readNumber('1.25', false))).toEqual({ value: 1.25, text: '1.25' });
		expect(value(readNumber('+0.5', false))).toEqual({ value: 0.5, text: '0.5' });
		expect(value(readNumber('.5', false)).value).toBe(0.5);
		expect(value(readNumber('2.5e3', false)).value).toBe(2500);
		expect(value(readNumber('-3', false)).value).toBe(-3);
	});

	it('refuses text in a number cell', () => {
		expect(reason(readNumber('abc', false))).toBe('"abc" is not a number.');
		expect(reason(readNumber('1.2 m/s', false))).toBe('"1.2 m/s" is not a number.');
		expect(reason(readNumber('0x10', false))).toBe('"0x10" is not a number.');
	});

	it('refuses NaN and infinities by name, and numbers too large for float64', () => {
		expect(reason(readNumber('NaN', false))).toBe('"NaN" is not a finite number.');
		expect(reason(readNumber('Infinity', false))).toBe('"Infinity" is not a finite number.');
		expect(reason(readNumber('-inf', false))).toBe('"-inf" is not a finite number.');
		// float64 tops out near 1.8e308 (IEEE 754 binary64).
		expect(reason(readNumber('1e400', false))).toBe('"1e400" is too large to be a number.');
	});

	it('refuses an empty cell', () => {
		expect(reason(readNumber('', false))).toBe('the cell is empty; a number is needed.');
	});

	it('reads a decimal comma only where the file is separated by semicolons or tabs', () => {
		expect(value(readNumber('1,25', true))).toEqual({ value: 1.25, text: '1.25' });
		expect(reason(readNumber('1,25', false))).toBe(
			'"1,25" is not a number: use a point as the decimal mark in a comma-separated file.'
		);
	});

	it('never guesses at thousands separators', () => {
		expect(reason(readNumber('1.234,5', true))).toBe('"1.234,5" is not a number: leave out thousands separators.');
		expect(reason(readNumber('1,234,5', true))).toMatch(/leave out thousands separators/);
	});
});

describe('looksNumeric', () => {
	it('tells numbers from header names', () => {
		expect(looksNumeric('1.5')).toBe(true);
		expect(looksNumeric('7,5')).toBe(true);
		expect(looksNumeric('speed_m_s')).toBe(false);
		expect(looksNumeric('')).toBe(false);
	});
});

describe('readTimestamp', () => {
	it('reads ISO 8601 extended format with Z', () => {
		// ISO 8601-1:2019 section 5.4.2: extended format date and time of day; "Z" is UTC.
		expect(value(readTimestamp('2025-03-01T00:10:00Z'))).toEqual({
			epochMs: Date.UTC(2025, 2, 1, 0, 10, 0),
			hasZone: true
		});
	});

	it('applies a zone offset: 00:10+01:00 is 23:10 UTC the day before', () => {
		// Hand calculation: local time minus offset = UTC; 2025-03-01 00:10 - 1 h = 2025-02-28 23:10.
		expect(value(readTimestamp('2025-03-01T00:10:00+01:00')).epochMs).toBe(Date.UTC(2025, 1, 28, 23, 10));
		expect(value(readTimestamp('2025-03-01T00:10:00-0230')).epochMs).toBe(Date.UTC(2025, 2, 1, 2, 40));
		expect(value(readTimestamp('2025-03-01T00:10+05')).epochMs).toBe(Date.UTC(2025, 1, 28, 19, 10));
	});

	it('reads a timestamp without a zone as UTC and says so', () => {
		expect(value(readTimestamp('2025-03-01T00:10:00'))).toEqual({
			epochMs: Date.UTC(2025, 2, 1, 0, 10),
			hasZone: false
		});
	});

	it('accepts a space for the "T", omitted seconds and fractions of a second', () => {
		// RFC 3339 section 5.6 allows a space in place of "T"; spreadsheets export that form.
		expect(value(readTimestamp('2025-03-01 00:10')).epochMs).toBe(Date.UTC(2025, 2, 1, 0, 10));
		expect(value(readTimestamp('2025-03-01T00:10:00.250Z')).epochMs).toBe(Date.UTC(2025, 2, 1, 0, 10, 0, 250));
		expect(value(readTimestamp('2025-03-01T00:10:00,5Z')).epochMs).toBe(Date.UTC(2025, 2, 1, 0, 10, 0, 500));
	});

	it('follows the Gregorian leap-year rule', () => {
		// Leap years: divisible by 4, except centuries unless divisible by 400 (ISO 8601 uses the Gregorian calendar).
		expect(readTimestamp('2024-02-29T00:00Z').ok).toBe(true);
		expect(readTimestamp('2000-02-29T00:00Z').ok).toBe(true);
		expect(reason(readTimestamp('2025-02-29T00:00Z'))).toBe('"2025-02-29T00:00Z" is not a real calendar date.');
		expect(readTimestamp('2100-02-29T00:00Z').ok).toBe(false);
		expect(readTimestamp('2025-04-31T00:00Z').ok).toBe(false);
	});

	it('refuses times of day out of range', () => {
		expect(reason(readTimestamp('2025-03-01T24:00:00Z'))).toMatch(/time of day out of range/);
		expect(readTimestamp('2025-03-01T12:60Z').ok).toBe(false);
	});

	it('refuses what is not ISO 8601', () => {
		const hint = 'write it as ISO 8601, e.g. 2025-03-01T00:10:00Z or 2025-03-01 00:10.';
		expect(reason(readTimestamp('01/03/2025 00:10'))).toBe(`"01/03/2025 00:10" is not a date and time: ${hint}`);
		expect(readTimestamp('1740787800').ok).toBe(false);
		expect(readTimestamp('2025-03-01').ok).toBe(false);
		expect(readTimestamp('yesterday').ok).toBe(false);
		expect(reason(readTimestamp(''))).toBe('the cell is empty; a date and time is needed.');
	});
});
