/**
 * Powers g^t for t on whole 1/m of a year (m a divisor of 24): construction
 * flows fall in the middle of a year, quarter or month. decimal.js's general
 * pow with a fractional exponent costs milliseconds; here the m-th root is
 * found once (square roots for m = 2, 4, 8; otherwise Newton's method from
 * the float64 root, which doubles the correct digits each step) and kept, so
 * a power is one integer power of it (repeated squaring).
 */
import { Decimal, numberKind, ONE } from './decimal';

const DIVISORS_OF_24 = [1, 2, 3, 4, 6, 8, 12, 24];
const ROOT_CACHE_SIZE = 256;
const roots = new Map<string, Decimal>();

/** The fewest periods a year (a divisor of 24) that put every t on a whole period. */
export function periodsPerYearOf(times: readonly number[]): number {
	for (const m of DIVISORS_OF_24) if (times.every((t) => Math.abs(t * m - Math.round(t * m)) < 1e-9)) return m;
	throw new RangeError(`times must fall on whole 1/24ths of a year, got ${times.find((t) => Math.abs(t * 24 - Math.round(t * 24)) >= 1e-9)}`);
}

/** g^(1/m), g > 0, to the precision of the engine's decimals. */
export function rootOf(g: Decimal, m: number): Decimal {
	if (m === 1) return g;
	if (numberKind() === 'float64') return new Decimal(Math.pow(g.toNumber(), 1 / m));
	const key = `${g.toString()}|${m}`;
	const known = roots.get(key);
	if (known) return known;
	let x: Decimal;
	if (m === 2 || m === 4 || m === 8) {
		x = g;
		for (let k = m; k > 1; k /= 2) x = x.sqrt();
	} else {
		// Newton on x^m = g from a 16-digit start: two steps reach 30 digits.
		x = new Decimal(Math.pow(g.toNumber(), 1 / m));
		for (let step = 0; step < 3; step++) {
			const below = x.pow(m - 1);
			x = x.minus(below.times(x).minus(g).div(below.times(m)));
		}
	}
	if (roots.size >= ROOT_CACHE_SIZE) roots.delete(roots.keys().next().value!);
	roots.set(key, x);
	return x;
}

/**
 * g^t for each t (whole 1/m of a year), through one cached root: the powers
 * of the root (or of its inverse, for t < 0) walked outward from t = 0, each
 * step one multiplication by a cached power for the gap (construction points
 * are evenly spaced, so there are one or two gaps).
 */
export function powersAt(g: Decimal, times: readonly number[]): Decimal[] {
	const m = periodsPerYearOf(times);
	const root = rootOf(g, m);
	const exponents = times.map((t) => Math.round(t * m));
	// Float64 powers cost no more than the multiplications.
	if (numberKind() === 'float64') return exponents.map((k) => root.pow(k));
	const result: Decimal[] = new Array(times.length);
	for (const sign of [1, -1]) {
		const base = sign === 1 ? root : ONE.div(root);
		const gaps = new Map<number, Decimal>();
		const order = exponents.map((k, i) => ({ k: k * sign, i })).filter((e) => e.k > 0).sort((a, b) => a.k - b.k);
		let reached = 0;
		let value = ONE;
		for (const { k, i } of order) {
			const gap = k - reached;
			if (gap > 0) {
				let step = gaps.get(gap);
				if (step === undefined) {
					step = base.pow(gap);
					gaps.set(gap, step);
				}
				value = value.times(step);
				reached = k;
			}
			result[i] = value;
		}
	}
	exponents.forEach((k, i) => {
		if (k === 0) result[i] = ONE;
	});
	return result;
}
