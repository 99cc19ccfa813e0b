/**
 * The plain-data form of an engine decimal: normal notation, rounded half to
 * even to 10 decimal places, without trailing zeros ("0" for anything that
 * rounds to zero). The same string as decimal.js's
 * `x.toDecimalPlaces(10).toFixed()`, written straight from the decimal's
 * digits: a result carries a thousand of them, and going through a rounded
 * copy and decimal.js's general formatting cost more than the rest of turning
 * a result into plain data.
 *
 * decimal.js keeps a value as x = s x 0.d_0 d_1 ... x 10^(e + 1): `d` holds
 * the digits in words of seven (the first without leading zeros), `e` the
 * power of ten of the first digit, `s` the sign (decimal.js README,
 * "the value of a Decimal is stored in ... its digits, exponent and sign").
 */
import type { Decimal } from './decimal';

export type DecimalString = string;

const PLACES = 10;
const WORD_DIGITS = 7;

/** Digits of a whole number string plus one in its last place (carrying), e.g. "199" -> "200", "99" -> "100". */
function incremented(digits: string): string {
	let i = digits.length - 1;
	while (i >= 0 && digits[i] === '9') i--;
	if (i < 0) return '1' + '0'.repeat(digits.length);
	return digits.slice(0, i) + String.fromCharCode(digits.charCodeAt(i) + 1) + '0'.repeat(digits.length - i - 1);
}

/** Decimal as a plain string in normal notation, rounded to 10 decimal places, without trailing zeros. */
export function decimalString(x: Decimal): DecimalString {
	if (x.isZero()) return '0';
	const words = (x as { d?: unknown }).d;
	// Another number kind (float64) has no digit words: let it format itself.
	if (!Array.isArray(words) || !x.isFinite()) {
		const rounded = x.toDecimalPlaces(PLACES);
		return rounded.isZero() ? '0' : rounded.toFixed();
	}
	// The first digit stands for 10^e; the digits kept are those for 10^-10 and above.
	let e = x.e;
	const kept = e + 1 + PLACES;
	if (kept < 0) return '0';
	// The kept digits and the first one dropped; past that only whether any digit is non-zero matters.
	let digits = String(words[0]);
	let next = 1;
	while (next < words.length && digits.length <= kept) digits += String(words[next++]).padStart(WORD_DIGITS, '0');
	let head = digits;
	if (digits.length > kept) {
		let tail = false;
		for (let i = kept + 1; i < digits.length && !tail; i++) tail = digits.charCodeAt(i) !== 48;
		for (let i = next; i < words.length && !tail; i++) tail = words[i] !== 0;
		head = digits.slice(0, kept);
		const dropped = digits.charCodeAt(kept) - 48;
		const lastKept = kept > 0 ? digits.charCodeAt(kept - 1) - 48 : 0;
		if (dropped > 5 || (dropped === 5 && (tail || lastKept % 2 === 1))) {
			const up = incremented(head === '' ? '0' : head);
			// A carry out of the first digit (999.9 -> 1000) or up from nothing (0.00000000006 -> 0.0000000001) adds a place in front.
			if (up.length > head.length) e += up.length - Math.max(head.length, 1) + (head === '' ? 1 : 0);
			head = up;
		}
	}
	let end = head.length;
	while (end > 0 && head.charCodeAt(end - 1) === 48) end--;
	if (end === 0) return '0';
	digits = head.slice(0, end);

	const sign = x.isNegative() ? '-' : '';
	if (e < 0) return `${sign}0.${'0'.repeat(-e - 1)}${digits}`;
	if (digits.length <= e + 1) return sign + digits + '0'.repeat(e + 1 - digits.length);
	return `${sign}${digits.slice(0, e + 1)}.${digits.slice(e + 1)}`;
}
