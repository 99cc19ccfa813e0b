/**
 * How the editor's number fields read and are typed: fractions as per cent
 * (0.87 shows and is typed as 87, beside "%"), thousands grouped
 * (12,000,000), and arrow keys that step by an amount that fits the field
 * (0.1 of a per cent, a whole device, a hundredth of a money amount's
 * magnitude) rather than the browser's 1, in the active locale's marks.
 * Safe to import in the browser.
 */
import { activeLocale } from '$lib/locale/active';
import { numberMarks, type NumberLocale } from '$lib/locale/locales';

/** Display units per stored unit: a fraction unit ("fraction/yr (nominal)") shows as per cent ("%/yr (nominal)"), times 100. */
export function entryUnit(unit: string): { unit: string; scale: number } {
	if (!unit.startsWith('fraction')) return { unit, scale: 1 };
	return { unit: `%${unit.slice('fraction'.length)}`, scale: 100 };
}

/** Float noise away (0.87 * 100 = 87.00000000000001 -> 87), twelve significant digits kept. */
export function tidy(x: number): number {
	return x === 0 ? 0 : Number(x.toPrecision(12));
}

const formats = new Map<string, Intl.NumberFormat>();
function grouping(locale: NumberLocale, places: number): Intl.NumberFormat {
	const key = `${locale}|${places}`;
	let format = formats.get(key);
	if (!format) formats.set(key, (format = new Intl.NumberFormat(locale, { maximumFractionDigits: places, useGrouping: true })));
	return format;
}

/** Decimals a field shows while it is not being typed in: 288.6666666666667 hours of a bin read 288.6667. */
export const RESTING_PLACES = 4;

/**
 * A stored value as the field shows it: scaled, grouped, a true minus sign,
 * at most `places` decimals (all of them, to twelve significant digits, while
 * the field is being typed in); empty for none.
 */
export function formatEntry(value: number | undefined | null, scale: number, places = 10, locale: NumberLocale = activeLocale()): string {
	if (value === undefined || value === null || !Number.isFinite(value)) return '';
	return grouping(locale, places).format(tidy(value * scale)).replace('-', '−');
}

const escapeForPattern = (mark: string) => mark.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * Typed text to a stored value, read in the locale's marks: spaces and
 * group marks dropped (12,000,000 or 12.000.000), the decimal mark as the
 * decimal point (0.87 or 0,87), a true or ASCII minus. Undefined for an
 * empty field, NaN for text that is not a number.
 */
export function parseEntry(text: string, scale: number, locale: NumberLocale = activeLocale()): number | undefined {
	const { group, decimal } = numberMarks(locale);
	const cleaned = text
		.replace(/[\s\u00a0\u202f]/g, '')
		.replace(new RegExp(escapeForPattern(group.trim() || ' '), 'g'), '')
		.replace(decimal, '.')
		.replace(/[−–]/g, '-');
	if (cleaned === '') return undefined;
	if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(cleaned)) return NaN;
	return tidy(Number(cleaned) / scale);
}

/**
 * The arrow-key step in display units: 0.1 for a per cent, 1 for whole
 * numbers, otherwise a hundredth of the value's order of magnitude (0.01
 * for 3.5, 100,000 for 12,000,000), at least 0.01.
 */
export function entryStep(displayValue: number | undefined, scale: number, integer: boolean): number {
	if (integer) return 1;
	if (scale === 100) return 0.1;
	const magnitude = displayValue === undefined || displayValue === 0 ? 1 : Math.abs(displayValue);
	return Math.max(0.01, 10 ** (Math.floor(Math.log10(magnitude)) - 2));
}

/** One arrow-key press: the displayed value moved by one step and kept inside the field's bounds (display units). */
export function stepped(displayValue: number | undefined, direction: 1 | -1, step: number, bounds: { min?: number; max?: number }): number {
	const from = displayValue ?? 0;
	// Land on the step grid (8.13 up by 0.1 gives 8.2, not 8.23), as spin buttons do.
	const onGrid = direction > 0 ? Math.floor(from / step + 1e-9) * step + step : Math.ceil(from / step - 1e-9) * step - step;
	const next = tidy(onGrid);
	return Math.min(bounds.max ?? Infinity, Math.max(bounds.min ?? -Infinity, next));
}
