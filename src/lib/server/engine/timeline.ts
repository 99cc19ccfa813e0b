/**
 * The project's time axis and the series built on it.
 *
 * Time convention: t = 0 is the commercial operation date (COD). Construction
 * year j (j = 1..C) runs from t = j - 1 - C to t = j - C, so the last one ends
 * at COD; operating year k (k = 1..N) sits at t = k, the end of that year.
 * Every flow is a point at its t.
 *
 * Within a construction year, spend and debt draws fall at points set by the
 * spend timing: the middle of the year (mid-year), the middle of each quarter
 * or month (the year's spend split evenly), or the year's end (year-end, the
 * plain annual convention). With any timing but year-end a last point at COD
 * (no spend) carries what falls due at the operation date: interest accrued
 * since the last draw, reserves funded then. Construction series hold one value
 * per point; the annual table adds a year's points up.
 * Source: common practice for project-finance models; see
 * docs/methods/time-convention.md.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from './decimal';
import { powersAt } from './fractional-powers';

export type SpendTiming = 'mid-year' | 'quarterly' | 'monthly' | 'year-end';

const PERIODS_PER_YEAR: Record<SpendTiming, number> = { 'mid-year': 1, quarterly: 4, monthly: 12, 'year-end': 1 };

export type Timeline = {
	constructionYears: number;
	operatingYears: number;
	spendTiming: SpendTiming;
	/** t of each construction point, first first; the last is 0 (COD). */
	constructionTimes: number[];
	/** Construction year (0-based) each point belongs to. */
	constructionYearOf: number[];
	/** Share of its year's spend at each point (0 at the COD point of a non-year-end timing). */
	constructionShares: Decimal[];
	/** t at the end of each construction year: [-(C-1), ..., 0]. */
	constructionYearEnds: number[];
	/** Financial close: the start of construction, t = -C. */
	financialClose: number;
	/** t of each operating year: [1, ..., N]. */
	operatingTimes: number[];
};

export function buildTimeline(constructionYears: number, operatingYears: number, spendTiming: SpendTiming = 'year-end'): Timeline {
	const periods = PERIODS_PER_YEAR[spendTiming];
	const constructionTimes: number[] = [];
	const constructionYearOf: number[] = [];
	const constructionShares: Decimal[] = [];
	const share = ONE.div(periods);
	for (let j = 0; j < constructionYears; j++) {
		const yearEnd = j + 1 - constructionYears;
		for (let q = 0; q < periods; q++) {
			// Middle of period q of the year, or the year's end.
			constructionTimes.push(spendTiming === 'year-end' ? yearEnd : yearEnd - 1 + (q + 0.5) / periods);
			constructionYearOf.push(j);
			constructionShares.push(share);
		}
	}
	if (spendTiming !== 'year-end') {
		constructionTimes.push(0);
		constructionYearOf.push(constructionYears - 1);
		constructionShares.push(ZERO);
	}
	return {
		constructionYears,
		operatingYears,
		spendTiming,
		constructionTimes,
		constructionYearOf,
		constructionShares,
		constructionYearEnds: Array.from({ length: constructionYears }, (_, j) => j + 1 - constructionYears),
		financialClose: -constructionYears,
		operatingTimes: Array.from({ length: operatingYears }, (_, k) => k + 1)
	};
}

/** A quantity on both parts of the axis: construction points, then operating years. */
export type TimeSeries = { construction: Decimal[]; operation: Decimal[] };

/**
 * growth^t for every t of the timeline: growth^0 = 1 at COD, growth^-1 a year
 * before it. Used for price indices (growth = 1 + inflation) and, with
 * growth = 1/(1 + r), for discount factors.
 */
export function powersOnTimeline(growth: DecimalInput, timeline: Timeline): TimeSeries {
	const g = dec(growth);
	const operation: Decimal[] = new Array(timeline.operatingYears);
	let value = ONE;
	for (let k = 0; k < timeline.operatingYears; k++) {
		value = value.times(g);
		operation[k] = value;
	}
	return { construction: powersAt(g, timeline.constructionTimes), operation };
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

/** A construction series added up by construction year (for the annual table). */
export function byConstructionYear(values: readonly Decimal[], timeline: Timeline): Decimal[] {
	const years = Array.from({ length: timeline.constructionYears }, () => ZERO);
	values.forEach((v, p) => (years[timeline.constructionYearOf[p]] = years[timeline.constructionYearOf[p]].plus(v)));
	return years;
}

/** A per-year construction series spread over the year's points by their shares. */
export function overConstructionPoints(perYear: readonly Decimal[], timeline: Timeline): Decimal[] {
	return timeline.constructionTimes.map((_, p) => perYear[timeline.constructionYearOf[p]].times(timeline.constructionShares[p]));
}
