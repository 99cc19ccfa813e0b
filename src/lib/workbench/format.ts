/**
 * Display formatting of the engine's decimal strings. The engine's exact
 * values stay in the API answer and the exports; these are for reading, in
 * the active locale (src/lib/locale/active.svelte.ts).
 */
import { activeLocale } from '$lib/locale/active';

const numberFormats = new Map<string, Intl.NumberFormat>();
/** A grouping formatter per locale and number of digits, built once (building one is far dearer than using it). */
function grouped(digits: number): Intl.NumberFormat {
	const locale = activeLocale();
	const key = `${locale}|${digits}`;
	let format = numberFormats.get(key);
	if (!format) {
		format = new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits });
		numberFormats.set(key, format);
	}
	return format;
}

function toNumber(value: string | number | null | undefined): number | null {
	if (value === null || value === undefined || value === '') return null;
	const n = typeof value === 'number' ? value : Number(value);
	return Number.isFinite(n) ? n : null;
}

/** 1234567.8 -> "1,234,568" (digits 0), with a true minus sign. */
export function formatNumber(value: string | number | null | undefined, digits = 0): string {
	const n = toNumber(value);
	if (n === null) return '—';
	const text = grouped(digits).format(Math.abs(n) < 0.5 * 10 ** -digits ? 0 : n);
	return text.replace('-', '−');
}

/** A fraction as a percentage: 0.0691 -> "6.91 %". */
export function formatPercent(value: string | number | null | undefined, digits = 2): string {
	const n = toNumber(value);
	return n === null ? '—' : `${formatNumber(n * 100, digits)} %`;
}

/** A number for a chart axis (floats are fine there). */
export function chartNumber(value: string | null | undefined): number | null {
	return toNumber(value);
}

// One formatter per locale and style: `toLocaleString` with options builds a new one per call, and
// that cost showed as the largest single item in a profile of the project page.
const dateFormats = new Map<string, Intl.DateTimeFormat>();
function dateFormat(style: 'date' | 'minutes' | 'seconds'): Intl.DateTimeFormat {
	const locale = activeLocale();
	const key = `${locale}|${style}`;
	let format = dateFormats.get(key);
	if (!format) {
		const timeStyle = style === 'date' ? undefined : style === 'minutes' ? 'short' : 'medium';
		format = new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle });
		dateFormats.set(key, format);
	}
	return format;
}

const asDate = (iso: string | Date) => (typeof iso === 'string' ? new Date(iso) : iso);

/** "9 Dec 2026, 14:05" in the house style; the same on the server and in the browser for one locale. */
export function formatDateTime(iso: string | Date): string {
	return dateFormat('minutes').format(asDate(iso));
}

/** With seconds: two runs started in the same minute still read apart. */
export function formatDateTimeSeconds(iso: string | Date): string {
	return dateFormat('seconds').format(asDate(iso));
}

/** A day: "9 Dec 2026" in the house style, never an ambiguous 12/9/2026. */
export function formatDate(iso: string | Date): string {
	return dateFormat('date').format(asDate(iso));
}

export function formatBytes(bytes: number): string {
	if (bytes >= 1024 * 1024) return `${formatNumber(bytes / (1024 * 1024), 1)} MB`;
	if (bytes >= 1024) return `${formatNumber(bytes / 1024, 1)} kB`;
	return `${bytes} B`;
}
