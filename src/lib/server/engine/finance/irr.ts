/**
 * Internal rate of return: the rate r > -1 at which the net present value of a
 * cash-flow series is zero,
 *
 *     sum_t values[t] / (1 + r)^t = 0        (first value at t = 0)
 *
 * Method. With x = 1 / (1 + r) the NPV is the polynomial p(x) = sum_t c_t x^t,
 * and every rate r > -1 is one x > 0. The positive axis is searched in two
 * unit intervals, so the float64 polynomial never overflows:
 *   - x in (0, 1]  for r >= 0, with p(x);
 *   - y = 1 + r = 1 / x in (0, 1]  for -1 < r <= 0, with q(y) = y^N p(1 / y),
 *     the same coefficients reversed.
 * Roots are located in float64 (Brent's method on each bracketed sign change)
 * and then polished by Newton steps on the decimal polynomial, so the result
 * is exact to about 1e-25 for a simple root at the cost of one or two decimal
 * polynomial evaluations.
 *
 * By Descartes' rule of signs the number of positive roots of p is at most the
 * number of sign changes in the flows, and has the same parity. One sign change
 * (an investment followed by returns) therefore means exactly one IRR, found
 * directly. With several sign changes each unit interval is scanned on a grid of
 * 64 cells; a cell whose ends share a sign but whose slopes show a turning point
 * is checked at that turning point, so pairs of close roots and double roots
 * are found too (more than two roots inside one cell, i.e. within about 1.5 %
 * of each other, would not be).
 */
import { dec, Decimal, ONE, roughNumber, type DecimalInput } from '../decimal';
import { solveRoot } from './roots';
import { periodsPerYearOf } from '../fractional-powers';

export type IrrResult = { rate: Decimal; reason: null } | { rate: null; reason: string };

/** A flow at period t (possibly negative; whole, or on a whole 1/m of a period, m <= 24). */
export type TimedAmount = { t: number; amount: Decimal };

/** Cells per unit interval when several sign changes allow several roots. */
const SCAN_CELLS = 64;
/** Longest series irrTimed accepts after shifting (periods). */
const MAX_SPAN = 100_000;

/** Where a float root lies: x = 1 / (1 + r) in (0, 1] or y = 1 + r in (0, 1]. */
type Side = 'discount' | 'growth';
type FloatRoot = { side: Side; z: number; rate: number; tangent: boolean };

function failure(reason: string): IrrResult {
	return { rate: null, reason };
}

/**
 * Internal rate of return of flows at t = 0, 1, 2, ... (numpy-financial convention).
 *
 *     find r > -1 with sum_t values[t] / (1 + r)^t = 0
 *
 * Units: values in currency per period; the rate is a fraction per period.
 * Source: numpy-financial `irr` (the same equation, there solved through the
 * polynomial's eigenvalues); the method is in the module comment.
 *
 * Degenerate cases, decided on purpose:
 *   - empty or all-zero flows, and flows that never change sign: rate null with
 *     a reason (no rate can make the NPV zero);
 *   - several sign changes with no real root: rate null with a reason;
 *   - several real roots: the one nearest `guess` (default 0, i.e. the root of
 *     smallest magnitude, which is numpy-financial 1.0's choice: irr([-100, 100,
 *     0, -7]) has roots -0.0833 and -0.6789 and returns -0.0833). A later
 *     numpy-financial prefers the smallest non-negative root when roots of
 *     both signs exist; pass guess to choose otherwise. With a single sign
 *     change there is only one root and guess does not matter.
 *
 * Example (numpy-financial docstring):
 *
 *     irr([-100, 39, 59, 55, 20])  // => { rate: 0.28094842115996..., reason: null }
 *     irr([100, 200])              // => { rate: null, reason: 'cash flows never change sign ...' }
 *
 * @throws RangeError when guess is given and is not a finite number above -1.
 */
export function irr(values: readonly DecimalInput[], guess?: number): IrrResult {
	if (guess !== undefined && !(Number.isFinite(guess) && guess > -1)) {
		throw new RangeError(`guess must be a finite rate greater than -1, got ${guess}`);
	}
	if (values.length === 0) return failure('no cash flows, so there is no IRR');
	return solved(values.map(dec), guess).result;
}

/** The flows' polynomial and its float roots: what irr and the several-IRR check share. */
type Solved = { result: IrrResult; changes: number; roots: FloatRoot[] };

function solved(amounts: readonly Decimal[], guess?: number): Solved {
	let first = 0;
	while (first < amounts.length && amounts[first].isZero()) first++;
	if (first === amounts.length) return { result: failure('all cash flows are zero, so there is no IRR'), changes: 0, roots: [] };
	let last = amounts.length - 1;
	while (amounts[last].isZero()) last--;
	// Leading zeros multiply p by x^k and trailing zeros lower its degree: neither moves a root x > 0.
	const coefficients = amounts.slice(first, last + 1);

	const changes = signChanges(coefficients);
	if (changes === 0) {
		return { result: failure('cash flows never change sign (only inflows or only outflows), so no rate makes the NPV zero'), changes, roots: [] };
	}

	const { floats, scale } = scaledFloats(coefficients);
	const roots = changes === 1 ? [singleRoot(floats)] : allRoots(floats);
	if (roots.length === 0) {
		return {
			result: failure(`cash flows change sign ${changes} times but the NPV is not zero at any rate above -100 %, so there is no real IRR`),
			changes,
			roots
		};
	}

	const target = guess ?? 0;
	let chosen = roots[0];
	for (const root of roots) {
		if (Math.abs(root.rate - target) < Math.abs(chosen.rate - target)) chosen = root;
	}
	return { result: { rate: polishedRate(coefficients, floats, scale, chosen), reason: null }, changes, roots };
}

/**
 * Internal rate of return of flows at integer periods t, which may be negative
 * (construction years before the commercial operation date at t = 0) and may
 * repeat (amounts at the same t add).
 *
 *     find r > -1 with sum_i amount_i / (1 + r)^{t_i} = 0
 *
 * Shifting every t by the same number of periods multiplies the NPV by a
 * positive factor (1 + r)^k, so the flows are shifted to start at 0 and passed
 * to `irr`; root choice and reasons are those of `irr`.
 * Units as `irr`. Source: as `irr`.
 *
 * Example:
 *
 *     irrTimed([{ t: -1, amount: dec(-100) }, { t: 0, amount: dec(0) }, { t: 1, amount: dec(121) }])
 *     // => { rate: 0.1, reason: null }
 *
 * Times may fall between periods on whole 1/m of a period (m up to 24, e.g.
 * mid-year or mid-month construction flows): the IRR is then solved per 1/m
 * period and compounded to the period, (1 + rho)^m - 1.
 *
 * @throws RangeError when a t is not on a whole 1/24th or the periods span more than 100 000.
 */
export function irrTimed(flows: readonly TimedAmount[]): IrrResult {
	return irrTimedWithRates(flows).result;
}

/**
 * irrTimed, with what the several-IRR check needs from the same pass over
 * the flows: their sign changes (zeros skipped, amounts at the same t added)
 * and every rate a year above -100 % at which their NPV is zero, ascending
 * (irrRatesTimed's answer).
 */
export function irrTimedWithRates(flows: readonly TimedAmount[]): { result: IrrResult; changes: number; rates: number[] } {
	if (flows.length === 0) return { result: failure('no cash flows, so there is no IRR'), changes: 0, rates: [] };
	const { series, perYear } = onPeriods(flows);
	const { result, changes, roots } = solved(series);
	const rates = annualRates(roots, perYear);
	if (result.rate === null || perYear === 1) return { result, changes, rates };
	// A rate per 1/m of a year, compounded to a year: (1 + rho)^m - 1.
	return { result: { rate: result.rate.plus(1).pow(perYear).minus(1), reason: null }, changes, rates };
}

function annualRates(roots: readonly FloatRoot[], perYear: number): number[] {
	return roots.map((root) => Math.pow(1 + root.rate, perYear) - 1).sort((a, b) => a - b);
}

/** Timed flows on whole periods of 1/m of a year (m as few as the times allow), added where they meet. */
function onPeriods(flows: readonly TimedAmount[]): { series: Decimal[]; perYear: number } {
	const perYear = periodsPerYearOf(flows.map((f) => f.t));
	let minT = Number.POSITIVE_INFINITY;
	let maxT = Number.NEGATIVE_INFINITY;
	for (const { t } of flows) {
		minT = Math.min(minT, Math.round(t * perYear));
		maxT = Math.max(maxT, Math.round(t * perYear));
	}
	if (maxT - minT > MAX_SPAN) throw new RangeError(`flows span ${maxT - minT} periods, more than ${MAX_SPAN}`);
	const series = new Array<Decimal>(maxT - minT + 1).fill(new Decimal(0));
	for (const { t, amount } of flows) {
		const period = Math.round(t * perYear) - minT;
		series[period] = series[period].plus(amount);
	}
	return { series, perYear };
}

/**
 * Every rate a year above -100 % at which the timed flows' NPV is zero,
 * ascending, to float64 accuracy: the roots irr chooses among (the scan of
 * the module comment), not polished. Empty for flows that never change sign.
 *
 * Example: irrRatesTimed(-100 at t = 0, 230 at 1, -132 at 2)  // => [0.1, 0.2] (to float accuracy)
 */
export function irrRatesTimed(flows: readonly TimedAmount[]): number[] {
	return irrTimedWithRates(flows).rates;
}


/**
 * Sign changes in a sequence, zeros skipped (the count in Descartes' rule of
 * signs, which bounds the number of IRRs). Source: Descartes' rule of signs.
 *
 * Example: signChanges([-100, 230, -132]) // => 2
 */
export function signChanges(coefficients: readonly Decimal[]): number {
	let changes = 0;
	let previous = 0;
	for (const c of coefficients) {
		const sign = c.isZero() ? 0 : c.isNegative() ? -1 : 1;
		if (sign === 0) continue;
		if (previous !== 0 && sign !== previous) changes++;
		previous = sign;
	}
	return changes;
}

/** Coefficients as float64, scaled by a power of 2 (exact) so the largest is near 1. */
function scaledFloats(coefficients: readonly Decimal[]): { floats: number[]; scale: number } {
	const unscaled = coefficients.map(roughNumber);
	let largest = 0;
	for (const c of unscaled) largest = Math.max(largest, Math.abs(c));
	const scale = 2 ** Math.floor(Math.log2(largest));
	return { floats: unscaled.map((c) => c / scale), scale };
}

/** sum_k a_k z^k by Horner's rule. */
function horner(a: readonly number[], z: number): number {
	let value = a[a.length - 1];
	for (let k = a.length - 2; k >= 0; k--) value = value * z + a[k];
	return value;
}

/** Coefficients of the derivative: d/dz sum a_k z^k = sum (k + 1) a_{k+1} z^k. */
function derivative<T>(a: readonly T[], times: (value: T, k: number) => T): T[] {
	const result: T[] = [];
	for (let k = 1; k < a.length; k++) result.push(times(a[k], k));
	return result;
}

const floatDerivative = (a: readonly number[]) => derivative(a, (value, k) => value * k);

function rateOf(side: Side, z: number): number {
	return side === 'discount' ? 1 / z - 1 : z - 1;
}

function floatRoot(side: Side, z: number, tangent = false): FloatRoot {
	return { side, z, rate: rateOf(side, z), tangent };
}

/**
 * The one positive root when the flows change sign once. p(0) = c_0 and the
 * leading coefficient have opposite signs; p(1) (the undiscounted sum) tells
 * which unit interval holds the root. When rounding makes p(1) look like zero
 * in one summation order and not the other, r = 0 is the root to float accuracy.
 */
function singleRoot(p: readonly number[]): FloatRoot {
	const q = [...p].reverse();
	const brackets: [Side, readonly number[]][] = [
		['discount', p],
		['growth', q]
	];
	for (const [side, poly] of brackets) {
		const found = solveRoot((z) => horner(poly, z), 0, 1, { xTolerance: 0 });
		if (found) return floatRoot(side, found.x);
	}
	return floatRoot('discount', 1);
}

/** Every positive root located by scanning both unit intervals (several sign changes). */
function allRoots(p: readonly number[]): FloatRoot[] {
	const roots = [
		...rootsInUnitInterval(p, 'discount'),
		// z = 1 is r = 0 on both sides: count it once
		...rootsInUnitInterval([...p].reverse(), 'growth').filter((root) => root.z !== 1)
	];
	return roots;
}

function rootsInUnitInterval(poly: readonly number[], side: Side): FloatRoot[] {
	const slope = floatDerivative(poly);
	const absolute = poly.map(Math.abs);
	const value = (z: number) => horner(poly, z);
	const slopeAt = (z: number) => horner(slope, z);
	const roots: FloatRoot[] = [];

	let a = 0;
	let fa = value(a);
	for (let cell = 1; cell <= SCAN_CELLS; cell++) {
		const b = cell / SCAN_CELLS;
		const fb = value(b);
		if (fb === 0) roots.push(floatRoot(side, b));
		if (fa !== 0 && fb !== 0) {
			if (Math.sign(fa) !== Math.sign(fb)) {
				const found = solveRoot(value, a, b, { xTolerance: 0 });
				if (found) roots.push(floatRoot(side, found.x));
			} else {
				roots.push(...hiddenPair(value, slopeAt, absolute, a, fa, b, fb, side));
			}
		}
		a = b;
		fa = fb;
	}
	return roots.filter((root) => root.z > 0);
}

/**
 * Roots inside a cell whose ends share a sign: only possible if |p| turns back
 * towards zero inside it. Heading towards zero at a and away from it at b
 * brackets a turning point m; p(m) on the other side of zero (or zero within
 * rounding) gives two roots (or one double root).
 */
function hiddenPair(
	value: (z: number) => number,
	slopeAt: (z: number) => number,
	absolute: readonly number[],
	a: number,
	fa: number,
	b: number,
	fb: number,
	side: Side
): FloatRoot[] {
	const sign = Math.sign(fa);
	const slopeA = slopeAt(a);
	const slopeB = slopeAt(b);
	if (!(Math.sign(slopeA) === -sign && Math.sign(slopeB) === sign)) return [];
	const turning = solveRoot(slopeAt, a, b, { xTolerance: 0 });
	if (!turning) return [];
	const m = turning.x;
	const fm = value(m);
	const roundingBound = 8 * Number.EPSILON * horner(absolute, m);
	if (sign * fm > roundingBound) return [];
	if (Math.abs(fm) <= roundingBound) return [floatRoot(side, m, true)];
	const left = solveRoot(value, a, m, { xTolerance: 0 });
	const right = solveRoot(value, m, b, { xTolerance: 0 });
	return [left, right].filter((found) => found !== null).map((found) => floatRoot(side, found.x));
}

/**
 * The root as a decimal rate, after Newton steps on the decimal polynomial.
 * Only the value needs decimal precision (it is a sum that cancels to almost
 * nothing near the root); the slope divides a correction of order 1e-16, so
 * its float64 value is plenty and halves the decimal work. A double root (a
 * tangency) is a simple root of the derivative, so that one is polished on p'
 * instead. Steps stop once a correction is below 1e-15 relative (Newton's
 * quadratic convergence leaves an error of order its square): usually one step.
 */
function polishedRate(
	coefficients: readonly Decimal[],
	floats: readonly number[],
	scale: number,
	root: FloatRoot
): Decimal {
	const ascending = root.side === 'discount' ? [...coefficients] : [...coefficients].reverse();
	const poly = root.tangent ? derivative(ascending, (value, k) => value.times(k)) : ascending;
	const floatAscending = root.side === 'discount' ? floats : [...floats].reverse();
	const floatPoly = root.tangent ? floatDerivative(floatAscending) : floatAscending;
	const slopePoly = floatDerivative(floatPoly).map((c) => c * scale);
	const start = new Decimal(root.z);
	let z = start;
	for (let step = 0; step < 4; step++) {
		const slope = horner(slopePoly, z.toNumber());
		if (slope === 0 || !Number.isFinite(slope)) break;
		const correction = decimalHorner(poly, z).div(slope);
		z = z.minus(correction);
		if (correction.abs().lte(z.abs().times('1e-15'))) break;
	}
	// Newton only refines: a step that leaves the float root's neighbourhood is not trusted.
	if (!z.isFinite() || z.lte(0) || z.minus(start).abs().gt(start.times('1e-6'))) z = start;
	return root.side === 'discount' ? ONE.div(z).minus(ONE) : z.minus(ONE);
}

/**
 * sum_k a_k z^k by Horner's rule over the non-zero coefficients: a run of g
 * zeros (periods without a flow, as between the years of flows on monthly or
 * quarterly periods) is one multiplication by z^(g+1) instead of g + 1.
 */
function decimalHorner(a: readonly Decimal[], z: Decimal): Decimal {
	const powers = new Map<number, Decimal>([[1, z]]);
	const power = (g: number) => {
		let p = powers.get(g);
		if (p === undefined) {
			p = z.pow(g);
			powers.set(g, p);
		}
		return p;
	};
	let k = a.length - 1;
	let value = a[k];
	while (k > 0) {
		let next = k - 1;
		while (next > 0 && a[next].isZero()) next--;
		value = value.times(power(k - next)).plus(a[next]);
		k = next;
	}
	return value;
}
