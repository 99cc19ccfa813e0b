/**
 * Warnings that keep two figures honest: an IRR that may not be the only
 * one, and a payback that is later undone. Each returns a plain sentence for
 * the result's warnings, or null when there is nothing to say.
 */
import { Decimal, ZERO } from './decimal';
import { irrRatesTimed, irrTimedWithRates, type TimedAmount } from './finance/irr';
import type { TimeSeries } from './timeline';

/**
 * Rates searched for a second IRR: from -10 % to +100 % a year, the rates a
 * discount rate or hurdle could take. A second root far outside it (a
 * decommissioning cost at the end of the life gives one near -25 % on most
 * projects) does not change a decision taken at any plausible rate, and a
 * warning on every such project would teach readers to skip warnings.
 */
export const IRR_SEARCH_RANGE = { low: -0.1, high: 1 } as const;

/**
 * Every rate r in (low, high) at which the flows' NPV is zero, ascending: the
 * IRR module's own roots (finance/irr irrRatesTimed), kept to the range.
 *
 * Example: npvZeroRates(-100 at t = 0, 230 at 1, -132 at 2) // => [0.1, 0.2] (to float accuracy)
 */
export function npvZeroRates(flows: readonly TimedAmount[], low: number = IRR_SEARCH_RANGE.low, high: number = IRR_SEARCH_RANGE.high): number[] {
	return irrRatesTimed(flows).filter((rate) => rate > low && rate < high);
}

const percent = (rate: number | Decimal) => `${(typeof rate === 'number' ? rate * 100 : rate.times(100).toNumber()).toFixed(2)} %`;

function listed(items: string[]): string {
	return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

const NUMBER_WORDS = ['no rate', 'one rate', 'two rates', 'three rates', 'four rates'];

/**
 * When the flows whose IRR is reported change sign more than once, more than
 * one rate may make their NPV zero (Descartes' rule of signs bounds the
 * number of IRRs by the number of sign changes), so the single figure may
 * mislead. The warning is given when more than one rate between -10 % and
 * +100 % (IRR_SEARCH_RANGE) makes the NPV zero, naming the metric, those
 * rates and the one reported; or when none there does while the reported one
 * lies outside. Null with at most one sign change (the IRR is then unique),
 * or when exactly one rate in the range makes the NPV zero: the figure is
 * then the only one a decision at a plausible rate can meet.
 * Source: Descartes' rule of signs; the advice to rely on the NPV when
 * several IRRs exist is common practice (corporate-finance textbooks).
 */
export function multipleIrrWarning(label: string, flows: readonly TimedAmount[], reported: Decimal): string | null {
	const { changes, rates } = irrTimedWithRates(flows);
	return severalIrrWarning(label, changes, rates, reported);
}

/**
 * multipleIrrWarning from what the IRR solve already found (finance/irr
 * irrTimedWithRates): the flows' sign changes and every rate above -100 % at
 * which their NPV is zero.
 */
export function severalIrrWarning(label: string, changes: number, allRates: readonly number[], reported: Decimal): string | null {
	if (changes <= 1) return null;
	const rates = allRates.filter((rate) => rate > IRR_SEARCH_RANGE.low && rate < IRR_SEARCH_RANGE.high);
	if (rates.length === 1) return null;
	const range = `between ${IRR_SEARCH_RANGE.low * 100} % and ${IRR_SEARCH_RANGE.high * 100} %`;
	const head = `${label}: the cash flows change sign ${changes} times, so more than one rate can make their NPV zero (Descartes' rule of signs)`;
	if (rates.length === 0) return `${head}; none does ${range}, and the figure shown, ${percent(reported)}, lies outside that range.`;
	const count = NUMBER_WORDS[rates.length] ?? `${rates.length} rates`;
	return `${head}; ${range} ${count} do: ${listed(rates.map(percent))}. The figure shown is ${percent(reported)}; the NPV is the safer guide.`;
}

/**
 * The first operating year after payback in which the cumulative cash flow
 * (summed from the first construction year, as paybackYears does) is negative
 * again, and whether it is still negative at the end of the life. Null when
 * payback is never reached or the cumulative never falls below zero after it.
 * Years count from 1 (operating year k ends at t = k). Source: common
 * practice (a decommissioning cost or a late overhaul can undo a payback).
 *
 * Example: construction [-100], operation [60, 60, -30]: payback in year 2
 * (cumulative 20), negative again in year 3 (-10), and negative at the end.
 */
export function paybackReversal(series: TimeSeries): { year: number; negativeAtEnd: boolean } | null {
	let cumulative = ZERO;
	for (const v of series.construction) cumulative = cumulative.plus(v);
	let paidBack = cumulative.gte(0);
	let reversedIn: number | null = null;
	for (let k = 0; k < series.operation.length; k++) {
		cumulative = cumulative.plus(series.operation[k]);
		if (!paidBack) paidBack = cumulative.gte(0);
		else if (reversedIn === null && cumulative.lt(0)) reversedIn = k + 1;
	}
	return reversedIn === null ? null : { year: reversedIn, negativeAtEnd: cumulative.lt(0) };
}

/** The sentence for paybackReversal, naming the metric; null when there is no reversal. */
export function paybackReversalWarning(label: string, series: TimeSeries): string | null {
	const reversal = paybackReversal(series);
	if (!reversal) return null;
	const end = reversal.negativeAtEnd ? ' and stays negative to the end of the life' : ', then recovers';
	return `${label}: the cumulative post-tax project cash flow pays back but turns negative again in operating year ${reversal.year}${end}; the payback figure does not show this.`;
}
