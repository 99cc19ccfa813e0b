/**
 * Discounting: present values of cash-flow series. Rates are fractions per
 * period (0.08 is 8 %); amounts are in currency units; t counts whole periods
 * from the time origin (t = 0).
 *
 * Powers of the discount factor are built by repeated multiplication, never by
 * a fractional Decimal power, because this runs inside every evaluation.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from '../decimal';

/** A cash flow at period t (t may be negative: construction years before the origin). */
export type TimedFlow = { t: number; amount: Decimal };

/** Longest run of integer periods for which a table of powers is built. */
const MAX_POWER_TABLE = 2048;

function growthFactor(rate: DecimalInput): Decimal {
	const r = dec(rate);
	const factor = ONE.plus(r);
	if (!factor.isFinite() || factor.lte(0)) {
		throw new RangeError(`discount rate must be a finite fraction greater than -1, got ${r.toString()}`);
	}
	return factor;
}

/**
 * Net present value with the first value at t = 0 (numpy-financial convention).
 *
 *     NPV = sum_{t=0}^{N-1} values[t] / (1 + rate)^t
 *
 * Evaluated by Horner's rule in v = 1 / (1 + rate). Units: `values` in
 * currency, `rate` a fraction per period. An empty series is worth 0.
 * Source: numpy-financial `npv`; the spreadsheet convention is `npvSpreadsheet`.
 *
 * Example (numpy-financial docstring):
 *
 *     npv(0.08, [-40000, 5000, 8000, 12000, 30000])  // => 3065.22266817...
 *
 * @throws RangeError when rate is not greater than -1.
 */
export function npv(rate: DecimalInput, values: readonly DecimalInput[]): Decimal {
	const v = ONE.div(growthFactor(rate));
	let total = ZERO;
	for (let t = values.length - 1; t >= 0; t--) total = total.times(v).plus(dec(values[t]));
	return total;
}

/**
 * Net present value with the first value at t = 1 (spreadsheet NPV convention:
 * every value is discounted by at least one period).
 *
 *     NPV = sum_{t=1}^{N} values[t-1] / (1 + rate)^t  =  npv(rate, values) / (1 + rate)
 *
 * Units as `npv`. Source: the spreadsheet NPV function documentation.
 *
 * Example: npv(0.05, [-15000, 1500, 2500, 3500, 4500, 6000]) is 122.894855 at
 * t = 0, so here it is 122.894855 / 1.05:
 *
 *     npvSpreadsheet(0.05, [-15000, 1500, 2500, 3500, 4500, 6000])  // => 117.04271...
 *
 * @throws RangeError when rate is not greater than -1.
 */
export function npvSpreadsheet(rate: DecimalInput, values: readonly DecimalInput[]): Decimal {
	return npv(rate, values).div(growthFactor(rate));
}

/**
 * Discount factor for period t.
 *
 *     DF(t) = (1 + rate)^-t
 *
 * Integer t (the usual case, negative for years before the origin) is computed
 * by exact repeated squaring; fractional t by a Decimal power. Units: rate a
 * fraction per period, t in periods; the factor is dimensionless.
 * Source: standard compound discounting.
 *
 * Example:
 *
 *     discountFactor(0.1, 2)   // => 0.826446280991735537190082644628 (= 1 / 1.21)
 *     discountFactor(0.1, -1)  // => 1.1
 *
 * @throws RangeError when rate is not greater than -1 or t is not finite.
 */
export function discountFactor(rate: DecimalInput, t: number): Decimal {
	if (!Number.isFinite(t)) throw new RangeError(`period must be finite, got ${t}`);
	const growth = growthFactor(rate);
	if (t === 0) return ONE;
	return Number.isInteger(t) ? ONE.div(growth.pow(t)) : growth.pow(-t);
}

/**
 * Present value at t = 0 of flows placed at arbitrary periods t.
 *
 *     PV = sum_i amount_i / (1 + rate)^{t_i}
 *
 * t may be negative (construction spending before the commercial operation
 * date, compounded forward to the origin) or fractional (day-count fractions of
 * a year). Repeated t values simply add. An empty list is worth 0.
 * Units: amounts in currency, rate a fraction per period, t in periods.
 * Source: standard compound discounting; with t = days / 365 this is the
 * spreadsheet XNPV.
 *
 * Example:
 *
 *     presentValueOfTimed(0.1, [{ t: -1, amount: dec(-100) }, { t: 1, amount: dec(121) }])
 *     // => -110 + 110 = 0
 *
 * @throws RangeError when rate is not greater than -1 or a t is not finite.
 */
export function presentValueOfTimed(rate: DecimalInput, flows: readonly TimedFlow[]): Decimal {
	const growth = growthFactor(rate);
	let minT = 0;
	let maxT = 0;
	for (const { t } of flows) {
		if (!Number.isFinite(t)) throw new RangeError(`period must be finite, got ${t}`);
		if (Number.isInteger(t)) {
			if (t < minT) minT = t;
			if (t > maxT) maxT = t;
		}
	}
	const useTable = maxT - minT <= MAX_POWER_TABLE;
	const discount = useTable ? powerTable(growth, minT, maxT) : null;

	let total = ZERO;
	for (const { t, amount } of flows) {
		let factor: Decimal;
		if (discount && Number.isInteger(t)) factor = discount[t - minT];
		else if (Number.isInteger(t)) factor = ONE.div(growth.pow(t));
		else factor = growth.pow(-t);
		total = total.plus(dec(amount).times(factor));
	}
	return total;
}

/** (1 + r)^-t for every integer t in [minT, maxT] (minT <= 0 <= maxT), by repeated multiplication. */
function powerTable(growth: Decimal, minT: number, maxT: number): Decimal[] {
	const table = new Array<Decimal>(maxT - minT + 1);
	const v = ONE.div(growth);
	table[-minT] = ONE;
	for (let t = 1; t <= maxT; t++) table[t - minT] = table[t - 1 - minT].times(v);
	for (let t = -1; t >= minT; t--) table[t - minT] = table[t + 1 - minT].times(growth);
	return table;
}
