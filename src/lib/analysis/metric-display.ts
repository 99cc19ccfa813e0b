/**
 * How the engine's metrics read on screen: a label, a kind that decides the
 * format and unit, and which direction is better. The engine sends decimals
 * as strings; formatting rounds them with decimal.js, never through floats.
 * Safe to import in the browser.
 */
import Decimal from 'decimal.js';

export type MetricKind = 'energy' | 'fraction' | 'rate' | 'pricePerMWh' | 'money' | 'ratio' | 'years';

/** higher: a rise is good news for the project (IRR); lower: a fall is (LCOE); neither: a plain fact (debt amount). */
export type BetterWhen = 'higher' | 'lower' | 'neither';

export interface MetricDisplay {
	label: string;
	kind: MetricKind;
	betterWhen: BetterWhen;
}

export const METRIC_DISPLAY: Record<string, MetricDisplay> = {
	netAepMWh: { label: 'Net annual energy (P50)', kind: 'energy', betterWhen: 'higher' },
	p90AepMWh: { label: 'Net annual energy (P90)', kind: 'energy', betterWhen: 'higher' },
	capacityFactor: { label: 'Capacity factor', kind: 'fraction', betterWhen: 'higher' },
	lcoeReal: { label: 'LCOE, real', kind: 'pricePerMWh', betterWhen: 'lower' },
	lcoeNominal: { label: 'LCOE, nominal', kind: 'pricePerMWh', betterWhen: 'lower' },
	lcoeFcr: { label: 'LCOE, fixed charge rate', kind: 'pricePerMWh', betterWhen: 'lower' },
	projectIrrPreTax: { label: 'Project IRR, pre-tax', kind: 'rate', betterWhen: 'higher' },
	projectIrrPostTax: { label: 'Project IRR, post-tax', kind: 'rate', betterWhen: 'higher' },
	equityIrr: { label: 'Equity IRR', kind: 'rate', betterWhen: 'higher' },
	npv: { label: 'NPV, post-tax project', kind: 'money', betterWhen: 'higher' },
	paybackYears: { label: 'Payback', kind: 'years', betterWhen: 'lower' },
	minDscr: { label: 'Minimum DSCR', kind: 'ratio', betterWhen: 'higher' },
	avgDscr: { label: 'Average DSCR', kind: 'ratio', betterWhen: 'higher' },
	llcr: { label: 'LLCR', kind: 'ratio', betterWhen: 'higher' },
	debtAmount: { label: 'Debt at COD', kind: 'money', betterWhen: 'neither' },
	breakevenTariff: { label: 'Breakeven tariff (flat, real)', kind: 'pricePerMWh', betterWhen: 'lower' }
};

export function metricDisplay(key: string): MetricDisplay {
	return METRIC_DISPLAY[key] ?? { label: key, kind: 'ratio', betterWhen: 'neither' };
}

/** The unit a metric is shown in, with the project's currency. */
export function displayUnit(kind: MetricKind, currency: string): string {
	switch (kind) {
		case 'energy':
			return 'MWh/yr';
		case 'fraction':
			return '%';
		case 'rate':
			return '%/yr';
		case 'pricePerMWh':
			return `${currency}/MWh`;
		case 'money':
			return currency;
		case 'ratio':
			return '×';
		case 'years':
			return 'years';
	}
}

/** "1234567.891" -> "1,234,567.89" at `places` decimals, with a real minus sign. */
export function groupDigits(value: Decimal, places: number): string {
	const fixed = value.toDecimalPlaces(places, Decimal.ROUND_HALF_EVEN).abs().toFixed(places);
	const [whole, fraction] = fixed.split('.');
	const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
	const sign = value.isNegative() && !value.toDecimalPlaces(places).isZero() ? '−' : '';
	return sign + grouped + (fraction ? `.${fraction}` : '');
}

const places: Record<MetricKind, number> = { energy: 0, fraction: 1, rate: 2, pricePerMWh: 2, money: 0, ratio: 2, years: 1 };

/** Fractions and rates show as percentages. */
function scaled(kind: MetricKind, value: Decimal): Decimal {
	return kind === 'fraction' || kind === 'rate' ? value.times(100) : value;
}

/** A metric value as text in its display unit (without the unit); null reads as an en dash. */
export function formatMetric(key: string, value: string | null): string {
	if (value === null) return '–';
	const { kind } = metricDisplay(key);
	return groupDigits(scaled(kind, new Decimal(value)), places[kind]);
}

/** A difference in the metric's unit; fractions and rates in percentage points. */
export function formatDifference(key: string, absolute: string): string {
	const { kind } = metricDisplay(key);
	const d = scaled(kind, new Decimal(absolute));
	const text = groupDigits(d, places[kind]);
	const signed = d.toDecimalPlaces(places[kind]).isZero() ? text.replace('−', '') : d.isPositive() ? `+${text}` : text;
	return kind === 'fraction' || kind === 'rate' ? `${signed} pp` : signed;
}

/** A relative difference (0.0523) as "+5.2 %". */
export function formatRelative(relative: string): string {
	const d = new Decimal(relative).times(100);
	const text = groupDigits(d, 1);
	if (d.toDecimalPlaces(1).isZero()) return `${text.replace('−', '')} %`;
	return `${d.isPositive() ? '+' : ''}${text} %`;
}

export type Verdict = 'better' | 'worse' | 'same' | 'neutral';

/** Whether a change (scenario minus base) is good or bad news for this metric. */
export function verdictOf(key: string, absolute: string): Verdict {
	const { betterWhen, kind } = metricDisplay(key);
	const d = scaled(kind, new Decimal(absolute)).toDecimalPlaces(places[kind]);
	if (d.isZero()) return 'same';
	if (betterWhen === 'neither') return 'neutral';
	return d.isPositive() === (betterWhen === 'higher') ? 'better' : 'worse';
}

/** A decimal string as a float, for charts only. */
export function chartNumber(value: string | null): number | null {
	return value === null ? null : Number(value);
}

/** A metric value as a chart number in its display unit (rates and fractions in per cent). Floats, for charts only. */
export function chartValue(key: string, value: string | null): number | null {
	if (value === null) return null;
	const { kind } = metricDisplay(key);
	return kind === 'fraction' || kind === 'rate' ? Number(value) * 100 : Number(value);
}

/** A chart number (from chartValue) as text with its unit, for tooltips. */
export function formatChartValue(key: string, value: number, currency: string): string {
	const { kind } = metricDisplay(key);
	const unit = displayUnit(kind, currency);
	const text = value.toLocaleString('en-GB', { minimumFractionDigits: places[kind], maximumFractionDigits: places[kind] }).replace('-', '−');
	return `${text} ${unit}`;
}

/** Whether `value` is better or worse than `base` for this metric; neutral when either is missing. */
export function verdictAgainst(key: string, value: string | null, base: string | null): Verdict {
	if (value === null || base === null) return 'neutral';
	return verdictOf(key, new Decimal(value).minus(new Decimal(base)).toFixed());
}

/** The unit of a change of the metric: percentage points for rates and fractions. */
export function differenceUnit(kind: MetricKind, currency: string): string {
	return kind === 'fraction' || kind === 'rate' ? 'pp' : displayUnit(kind, currency);
}
