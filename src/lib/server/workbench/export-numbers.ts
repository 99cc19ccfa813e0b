/**
 * Numbers for the export files, through decimal.js and never through floats:
 * the spreadsheet format that shows a number at so many decimals, the same
 * number as CSV text at those decimals, and the number inside a figure the
 * assumptions give as grouped text ("3,200,000", "−1.5").
 */
import DecimalJs from 'decimal.js';

const Decimal = DecimalJs.clone({ precision: 40, rounding: DecimalJs.ROUND_HALF_EVEN });

/** The spreadsheet number format for `places` decimals, with thousands grouped: "#,##0", "#,##0.00". */
export function numberFormat(places: number): string {
	return places > 0 ? `#,##0.${'0'.repeat(places)}` : '#,##0';
}

/** A decimal string at `places` decimals, half to even, ASCII minus, no grouping, never "-0": "1250000.50". */
export function roundedText(value: string | number, places: number): string {
	const d = new Decimal(value).toDecimalPlaces(places, Decimal.ROUND_HALF_EVEN);
	return (d.isZero() ? d.abs() : d).toFixed(places);
}

/** The number in a figure written as grouped text ("3,200,000" -> 3200000 at 0 places, "−1.5" -> -1.5 at 1); null for anything else. */
export function numberInText(text: string): { value: string; places: number } | null {
	const match = /^([−-]?)(\d{1,3}(?:,\d{3})*|\d+)(?:\.(\d+))?$/.exec(text);
	if (!match) return null;
	const [, sign, whole, fraction = ''] = match;
	const value = `${sign === '' ? '' : '-'}${whole.replaceAll(',', '')}${fraction === '' ? '' : `.${fraction}`}`;
	return { value: roundedText(value, fraction.length), places: fraction.length };
}

/** A figure with its unit after it ("40,498,975 EUR", "67.9 %"); null for words, or a unit with a figure in it ("35 % / 65 %"). */
export function figureInText(text: string): { value: string; places: number; unit: string } | null {
	const match = /^(\S+) (\D+)$/.exec(text);
	const number = match && numberInText(match[1]);
	return match && number ? { ...number, unit: match[2] } : null;
}
