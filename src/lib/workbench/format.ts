/**
 * Display formatting of the engine's decimal strings. The engine's exact
 * values stay in the API answer and the exports; these are for reading.
 */

const numberFormats = new Map<number, Intl.NumberFormat>();
/** A grouping formatter per number of digits, built once (building one is far dearer than using it). */
function grouped(digits: number): Intl.NumberFormat {
	let format = numberFormats.get(digits);
	if (!format) {
		format = new Intl.NumberFormat('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
		numberFormats.set(digits, format);
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

// One formatter for every date: `toLocaleString` with options builds a new one per call, and that
// cost showed as the largest single item in a profile of the project page.
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export function formatDateTime(iso: string | Date): string {
	const date = typeof iso === 'string' ? new Date(iso) : iso;
	return dateTimeFormat.format(date);
}

const dateTimeSecondsFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium' });
const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' });

/** With seconds: two runs started in the same minute still read apart. */
export function formatDateTimeSeconds(iso: string | Date): string {
	return dateTimeSecondsFormat.format(typeof iso === 'string' ? new Date(iso) : iso);
}

/** A day: "9 Dec 2026", the same on the server and in every browser (never 12/9/2026). */
export function formatDate(iso: string | Date): string {
	return dateFormat.format(typeof iso === 'string' ? new Date(iso) : iso);
}

export function formatBytes(bytes: number): string {
	if (bytes >= 1024 * 1024) return `${formatNumber(bytes / (1024 * 1024), 1)} MB`;
	if (bytes >= 1024) return `${formatNumber(bytes / 1024, 1)} kB`;
	return `${bytes} B`;
}
