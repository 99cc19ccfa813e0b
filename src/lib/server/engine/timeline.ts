/**
 * The project's time axis and the series built on it.
 *
 * Time convention: t = 0 is the commercial operation date (COD). Construction
 * year j (j = 1..C) sits at t = j - C, so the last construction year's capex is
 * at t = 0 and earlier years at t = -1, -2, ...; operating year k (k = 1..N)
 * sits at t = k, the end of that year. Every flow is a point at its t.
 * Source: common practice for annual project-finance models; see
 * docs/methods/time-convention.md.
 */
import { dec, Decimal, ONE, type DecimalInput } from './decimal';

export type Timeline = {
	constructionYears: number;
	operatingYears: number;
	/** t of each construction year, first first: [-(C-1), ..., 0]. */
	constructionTimes: number[];
	/** t of each operating year: [1, ..., N]. */
	operatingTimes: number[];
};

export function buildTimeline(constructionYears: number, operatingYears: number): Timeline {
	return {
		constructionYears,
		operatingYears,
		constructionTimes: Array.from({ length: constructionYears }, (_, j) => j + 1 - constructionYears),
		operatingTimes: Array.from({ length: operatingYears }, (_, k) => k + 1)
	};
}

/** A quantity on both parts of the axis: construction years, then operating years. */
export type TimeSeries = { construction: Decimal[]; operation: Decimal[] };

/**
 * growth^t for every t of the timeline, by repeated multiplication (no
 * fractional powers): growth^0 = 1 at COD, growth^-1, growth^-2 before it.
 * Used for price indices (growth = 1 + inflation) and, with growth = 1/(1 + r),
 * for discount factors.
 */
export function powersOnTimeline(growth: DecimalInput, timeline: Timeline): TimeSeries {
	const g = dec(growth);
	const inverse = ONE.div(g);
	const construction: Decimal[] = new Array(timeline.constructionYears);
	let value = ONE;
	for (let j = timeline.constructionYears - 1; j >= 0; j--) {
		construction[j] = value;
		value = value.times(inverse);
	}
	const operation: Decimal[] = new Array(timeline.operatingYears);
	value = ONE;
	for (let k = 0; k < timeline.operatingYears; k++) {
		value = value.times(g);
		operation[k] = value;
	}
	return { construction, operation };
}

/** Discount factors (1 + r)^-t on the timeline (greater than 1 before COD). */
export function discountFactorsOnTimeline(rate: DecimalInput, timeline: Timeline): TimeSeries {
	return powersOnTimeline(ONE.div(ONE.plus(dec(rate))), timeline);
}

/** Present value at COD of a series on the timeline. */
export function presentValue(series: TimeSeries, factors: TimeSeries): Decimal {
	let total = new Decimal(0);
	series.construction.forEach((v, j) => (total = total.plus(v.times(factors.construction[j]))));
	series.operation.forEach((v, k) => (total = total.plus(v.times(factors.operation[k]))));
	return total;
}
