/**
 * Linear (Airy) wave theory at a finite water depth: the dispersion relation
 * and the group velocity that carries wave energy. Periods in s, depths in m,
 * g in m/s^2, wave numbers in rad/m, speeds in m/s.
 *
 * The root kh and the depth factor are computed in double precision (relative
 * error ~1e-15, far below any input's accuracy); the flux that uses them is
 * decimal arithmetic (./wave.ts), as the bin probabilities of ./distributions.ts are.
 */
import { dec, Decimal, type DecimalInput } from '../decimal';
import { PI } from './current';

/**
 * kh from the linear dispersion relation at angular frequency w = 2 pi / T:
 *
 *     w^2 = g k tanh(k h),   i.e.   x tanh x = y  with  x = k h,  y = w^2 h / g
 *
 * x tanh x rises monotonically from 0, so the root is unique. It is bracketed by
 * max(y, sqrt y) <= x (tanh x <= 1 and tanh x <= x) and x <= max(y, sqrt y) + 1,
 * and found by Newton's method from Eckart's estimate x0 = y / sqrt(tanh y),
 * falling back to bisection whenever a step leaves the bracket.
 * Source: the dispersion relation of linear wave theory (any coastal
 * engineering text); Eckart (1952) for the first estimate.
 * Example: T 5 s, h 10 m, g 9.81 gives k = 0.1717028 rad/m (kh = 1.717028).
 */
export function waveNumberTimesDepth(periodS: number, depthM: number, gravityMPerS2: number): number {
	if (!(periodS > 0) || !(depthM > 0) || !(gravityMPerS2 > 0)) {
		throw new RangeError(`wave period, water depth and gravity must be positive (got T ${periodS} s, h ${depthM} m, g ${gravityMPerS2} m/s^2)`);
	}
	const omega = (2 * Math.PI) / periodS;
	const y = (omega * omega * depthM) / gravityMPerS2;
	const residual = (x: number) => x * Math.tanh(x) - y;
	let low = Math.max(y, Math.sqrt(y));
	let high = low + 1;
	if (residual(low) >= 0) return low;
	let x = Math.min(high, Math.max(low, y / Math.sqrt(Math.tanh(y))));
	for (let i = 0; i < 100; i++) {
		const t = Math.tanh(x);
		const f = x * t - y;
		if (f === 0) return x;
		if (f < 0) low = x;
		else high = x;
		const slope = t + x * (1 - t * t);
		let next = x - f / slope;
		if (!(next > low && next < high)) next = (low + high) / 2;
		if (Math.abs(next - x) <= 1e-15 * next) return next;
		x = next;
	}
	return x;
}

/**
 * Group velocity over the deep-water group velocity at the same period:
 *
 *     Cg = (w / k) / 2 x (1 + 2kh / sinh 2kh),   Cg0 = g T / (4 pi)
 *     Cg / Cg0 = tanh(kh) (1 + 2kh / sinh 2kh)
 *
 * (the second line follows from w^2 = g k tanh kh). It tends to 1 in deep water
 * (kh -> infinity) and to 2 kh in shallow water (kh -> 0), where Cg -> sqrt(g h).
 * It peaks at 1.1997 near kh = 1.2. `depthM` undefined means deep water:
 * exactly 1. Source: linear wave theory, e.g. the shoaling relations of
 * coastal engineering handbooks.
 * Example: T 10 s, h 20 m, g 9.81 gives 1.18804 (Cg 9.27450 m/s against 7.80655).
 */
export function groupVelocityDepthFactor(periodS: number, depthM: number | undefined, gravityMPerS2: number): Decimal {
	if (depthM === undefined) return new Decimal(1);
	const x = waveNumberTimesDepth(periodS, depthM, gravityMPerS2);
	// In deep water sinh 2x overflows to Infinity (x > ~355), so 2x / sinh 2x is 0: its limit.
	return new Decimal(Math.tanh(x) * (1 + (2 * x) / Math.sinh(2 * x)));
}

/**
 * Group velocity of linear waves of period T at depth h, m/s:
 *
 *     Cg = g T / (4 pi) x tanh(kh) (1 + 2kh / sinh 2kh)
 *
 * deep water (`depthM` undefined): Cg0 = g T / (4 pi). Source: linear wave
 * theory. Example: T 10 s, g 9.81: 7.80655 m/s deep, 9.27450 m/s at 20 m.
 */
export function groupVelocityMPerS(periodS: DecimalInput, depthM: number | undefined, gravityMPerS2: DecimalInput): Decimal {
	const t = dec(periodS);
	const g = dec(gravityMPerS2);
	const deep = g.times(t).div(PI.times(4));
	return deep.times(groupVelocityDepthFactor(t.toNumber(), depthM, g.toNumber()));
}
