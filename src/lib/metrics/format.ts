/**
 * How the catalogue's metrics read: a value, a difference, a relative change,
 * a verdict, a chart number and a spreadsheet number format, each at the
 * catalogue's precision in its display unit. The engine sends decimals as
 * strings; these round them with decimal.js (half to even), never through
 * floats, except chart numbers, which are floats for drawing only.
 * Safe to import in the browser.
 */
import DecimalJs from 'decimal.js';
import { figureDefinition, METRICS, metricUnit, type FigureKey, type MetricKey } from './catalogue';
import { activeLocale } from '$lib/locale/active';
import { numberMarks } from '$lib/locale/locales';

/** Enough digits that scaling an engine value by 100 never rounds it. */
const Decimal = DecimalJs.clone({ precision: 40, rounding: DecimalJs.ROUND_HALF_EVEN });
type Decimal = InstanceType<typeof Decimal>;

/** How a missing value reads (the engine could not compute it; its warnings say why). */
export const NO_VALUE = '–';

/** "1234567.891" -> "1,234,567.89" at `places` decimals, half to even, with a real minus sign, in the active locale's marks. */
export function groupDigits(value: DecimalJs.Value, places: number): string {
	const { group, decimal } = numberMarks(activeLocale());
	const rounded = new Decimal(value).toDecimalPlaces(places, Decimal.ROUND_HALF_EVEN);
	const [whole, fraction] = rounded.abs().toFixed(places).split('.');
	const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, group);
	const sign = rounded.isNegative() && !rounded.isZero() ? '−' : '';
	return sign + grouped + (fraction ? `${decimal}${fraction}` : '');
}

/** An engine value in the metric's display unit, exactly (fractions times 100 for per cent figures). */
function inDisplayUnit(key: FigureKey, value: DecimalJs.Value): Decimal {
	const d = new Decimal(value);
	return figureDefinition(key).scale === 'percent' ? d.times(100) : d;
}

/** An engine value in the display unit at the catalogue's precision, as a Decimal. */
function roundedInDisplayUnit(key: FigureKey, value: DecimalJs.Value): Decimal {
	return inDisplayUnit(key, value).toDecimalPlaces(figureDefinition(key).places, Decimal.ROUND_HALF_EVEN);
}

/** A metric value (or case figure) as text in its display unit, without the unit: "40,259", "9.15"; a missing value reads as an en dash. */
export function formatMetric(key: FigureKey, value: string | null): string {
	if (value === null) return NO_VALUE;
	return groupDigits(inDisplayUnit(key, value), figureDefinition(key).places);
}

/**
 * A metric value for a data file: in the display unit at the catalogue's
 * precision, without grouping, with an ASCII minus ("-6441517", "9.15"), so
 * a file and the screen agree to the digit. Null stays null.
 */
export function roundedMetric(key: FigureKey, value: string | null): string | null {
	if (value === null) return null;
	const rounded = roundedInDisplayUnit(key, value);
	return (rounded.isZero() ? rounded.abs() : rounded).toFixed(figureDefinition(key).places);
}

/** A metric value in its display unit with every digit the engine gave ("9.15207133" for 0.0915207133). */
export function exactMetric(key: MetricKey, value: string | null): string | null {
	return value === null ? null : inDisplayUnit(key, value).toFixed();
}

/** A metric value with its unit, for a sentence or a tooltip: "252.64 EUR/MWh", "9.15 %/yr". */
export function formatMetricWithUnit(key: FigureKey, value: string | null, currency: string): string {
	return value === null ? NO_VALUE : `${formatMetric(key, value)} ${metricUnit(key, currency)}`;
}

/** Whether a metric's differences are in percentage points (per cent figures) rather than its own unit. */
function inPoints(key: MetricKey): boolean {
	return METRICS[key].scale === 'percent';
}

/** A difference (scenario minus base) in the metric's unit, signed; per cent figures in percentage points. */
export function formatDifference(key: MetricKey, absolute: string): string {
	const d = inDisplayUnit(key, absolute);
	const text = groupDigits(d, METRICS[key].places);
	const roundsToZero = d.toDecimalPlaces(METRICS[key].places, Decimal.ROUND_HALF_EVEN).isZero();
	const signed = roundsToZero || d.isNegative() ? text : `+${text}`;
	return inPoints(key) ? `${signed} pp` : signed;
}

/** The unit of a change of the metric: percentage points for per cent figures. */
export function differenceUnit(key: MetricKey, currency: string): string {
	return inPoints(key) ? 'pp' : metricUnit(key, currency);
}

/** A relative change (0.0523) as "+5.2 %". */
export function formatRelative(relative: string): string {
	const d = new Decimal(relative).times(100);
	const text = groupDigits(d, 1);
	const roundsToZero = d.toDecimalPlaces(1, Decimal.ROUND_HALF_EVEN).isZero();
	return `${roundsToZero || d.isNegative() ? '' : '+'}${text} %`;
}

export type Verdict = 'better' | 'worse' | 'same' | 'neutral';

/** Whether a change (scenario minus base) is good or bad news for this metric; a change below the shown precision is the same. */
export function verdictOf(key: MetricKey, absolute: string): Verdict {
	const d = roundedInDisplayUnit(key, absolute);
	if (d.isZero()) return 'same';
	const { betterWhen } = METRICS[key];
	if (betterWhen === 'neither') return 'neutral';
	return d.isPositive() === (betterWhen === 'higher') ? 'better' : 'worse';
}

/** Whether `value` is better or worse than `base` for this metric; neutral when either is missing. */
export function verdictAgainst(key: MetricKey, value: string | null, base: string | null): Verdict {
	if (value === null || base === null) return 'neutral';
	return verdictOf(key, new Decimal(value).minus(base).toFixed());
}

/** A metric value as a chart number in its display unit (per cent figures times 100). Floats, for charts only. */
export function chartValue(key: FigureKey, value: string | null): number | null {
	return value === null ? null : inDisplayUnit(key, value).toNumber();
}

/** A chart number (from chartValue) as text with its unit, for tooltips. */
export function formatChartValue(key: FigureKey, value: number, currency: string): string {
	const places = figureDefinition(key).places;
	const text = value.toLocaleString(activeLocale(), { minimumFractionDigits: places, maximumFractionDigits: places }).replace('-', '−');
	return `${text} ${metricUnit(key, currency)}`;
}

/**
 * The spreadsheet number format of a metric's cell, which holds the engine's
 * exact value: per cent figures in percent format ("0.00%" shows 0.0915 as
 * 9.15%), others grouped at the catalogue's precision ("#,##0.00").
 */
export function spreadsheetNumberFormat(key: MetricKey): string {
	const { places, scale } = METRICS[key];
	const decimals = places > 0 ? `.${'0'.repeat(places)}` : '';
	return scale === 'percent' ? `0${decimals}%` : `#,##0${decimals}`;
}
