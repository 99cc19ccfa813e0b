/**
 * Warnings that keep two figures honest: an IRR that may not be the only
 * one, and a payback that is later undone. Each returns a plain sentence for
 * the result's warnings, or null when there is nothing to say.
 */
import { Decimal, ZERO } from './decimal';
import { solveRoot } from './finance/roots';
import { signChanges, type TimedAmount } from './finance/irr';
import type { TimeSeries } from './timeline';

/**
 * Rates searched for a second IRR: from -10 % to +100 % a year, the rates a
 * discount rate or hurdle could take. A second root far outside it (a
 * decommissioning cost at the end of the life gives one near -25 % on most
 * projects) does not change a decision taken at any plausible rate, and a
 * warning on every such project would teach readers to skip warnings.
 */
export const IRR_SEARCH_RANGE = { low: -0.1, high: 1 } as const;

/** Cells of the scan in ln(1 + r): about 0.2 % apart in 1 + r over the default range. */
const SCAN_CELLS = 400;


/** Amounts in time order, those at the same t added together. */
function inTimeOrder(flows: readonly TimedAmount[]): Decimal[] {
	const byTime = new Map<number, Decimal>();
	for (const { t, amount } of flows) byTime.set(t, (byTime.get(t) ?? ZERO).plus(amount));
	return [...byTime.entries()].sort(([a], [b]) => a - b).map(([, amount]) => amount);
}

/**
 * Every rate r in (low, high) at which the flows' NPV is zero, ascending.
 *
 *     NPV(r) = sum_i a_i (1 + r)^(-t_i) = sum_i a_i e^(-t_i x),   x = ln(1 + r)
 *
 * scanned on 400 equal cells in x (t may be fractional); each cell whose ends
 * differ in sign is narrowed by Brent's method. In float64, to about 1e-12 in
 * x: enough to name a rate to two decimals of a percent. Two roots inside one
 * cell (rates within about 0.2 % of 1 + r of each other over the default range), or a double root,
 * would be missed. Source: the IRR equation; the scan is common practice.
 *
 * Example: npvZeroRates(-100 at t = 0, 230 at 1, -132 at 2) // => [0.1, 0.2] (to float accuracy)
 */
export function npvZeroRates(flows: readonly TimedAmount[], low: number = IRR_SEARCH_RANGE.low, high: number = IRR_SEARCH_RANGE.high): number[] {
	let largest = 0;
	for (const { amount } of flows) largest = Math.max(largest, Math.abs(amount.toNumber()));
	if (largest === 0 || !(low > -1 && high > low)) return [];
	const scaled = flows.map(({ t, amount }) => ({ t, a: amount.toNumber() / largest }));
	const npv = (x: number) => scaled.reduce((total, { t, a }) => total + a * Math.exp(-t * x), 0);
	const from = Math.log1p(low);
	const width = (Math.log1p(high) - from) / SCAN_CELLS;
	const roots: number[] = [];
	let a = from;
	let fa = npv(a);
	for (let cell = 1; cell <= SCAN_CELLS; cell++) {
		const b = from + cell * width;
		const fb = npv(b);
		if (fa === 0) roots.push(a);
		else if (fb !== 0 && Math.sign(fa) !== Math.sign(fb)) {
			const found = solveRoot(npv, a, b, { xTolerance: 1e-12 });
			if (found) roots.push(found.x);
		}
		a = b;
		fa = fb;
	}
	return roots.map(Math.expm1);
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
	const changes = signChanges(inTimeOrder(flows));
	if (changes <= 1) return null;
	const rates = npvZeroRates(flows);
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
