/**
 * Root finding in float64 for the engine's solvers (breakeven tariff, the IRR
 * search). Callers that need decimal exactness polish the float root with a
 * Newton step in Decimal afterwards.
 */

export type SolveRootOptions = {
	/** Absolute tolerance on x; a relative 4 * machine epsilon is always added. Default 2e-12. */
	xTolerance?: number;
	/** Give up (return null) after this many iterations, one evaluation of f each. Default 100. */
	maxIterations?: number;
};

const EPSILON = Number.EPSILON;

/**
 * Brent's method: a root of f in the bracket [lo, hi], where f(lo) and f(hi)
 * have opposite signs (or one of them is 0).
 *
 * Each step takes inverse quadratic interpolation or a secant step when it
 * stays well inside the bracket and shrinks it fast enough, and bisects
 * otherwise, so it never does worse than bisection. It stops when the bracket
 * is narrower than 2 (4 eps |x| + xTolerance / 2), i.e. the error of x is
 * below 4 eps |x| + xTolerance / 2 (the same tolerance as SciPy's brentq with
 * xtol 2e-12, rtol 4 eps).
 *
 * Returns null when [lo, hi] does not bracket a sign change, when f returns a
 * non-finite value, or when maxIterations is reached.
 * Source: R. P. Brent, Algorithms for Minimization without Derivatives (1973), ch. 4.
 *
 * Example: the positive root of x^2 - 2:
 *
 *     solveRoot((x) => x * x - 2, 0, 2)  // => { x: 1.41421356237314, iterations: 8 } (error 4e-14)
 */
export function solveRoot(
	f: (x: number) => number,
	lo: number,
	hi: number,
	opts: SolveRootOptions = {}
): { x: number; iterations: number } | null {
	const xTolerance = opts.xTolerance ?? 2e-12;
	const maxIterations = opts.maxIterations ?? 100;
	if (!Number.isFinite(lo) || !Number.isFinite(hi)) return null;

	let a = lo;
	let b = hi;
	let fa = f(a);
	let fb = f(b);
	if (!Number.isFinite(fa) || !Number.isFinite(fb)) return null;
	if (fa === 0) return { x: a, iterations: 0 };
	if (fb === 0) return { x: b, iterations: 0 };
	if (Math.sign(fa) === Math.sign(fb)) return null;

	// b is the best estimate, c the other end of the bracket, a the previous b.
	let c = a;
	let fc = fa;
	let step = b - a;
	let previousStep = step;

	for (let iteration = 1; iteration <= maxIterations; iteration++) {
		if (Math.sign(fb) === Math.sign(fc)) {
			c = a;
			fc = fa;
			step = b - a;
			previousStep = step;
		}
		if (Math.abs(fc) < Math.abs(fb)) {
			a = b;
			b = c;
			c = a;
			fa = fb;
			fb = fc;
			fc = fa;
		}

		const tolerance = 2 * EPSILON * Math.abs(b) + 0.5 * xTolerance;
		const halfBracket = 0.5 * (c - b);
		if (Math.abs(halfBracket) <= tolerance || fb === 0) return { x: b, iterations: iteration };

		if (Math.abs(previousStep) >= tolerance && Math.abs(fa) > Math.abs(fb)) {
			const s = fb / fa;
			let p: number;
			let q: number;
			if (a === c) {
				// secant
				p = 2 * halfBracket * s;
				q = 1 - s;
			} else {
				// inverse quadratic interpolation through a, b, c
				const qa = fa / fc;
				const rb = fb / fc;
				p = s * (2 * halfBracket * qa * (qa - rb) - (b - a) * (rb - 1));
				q = (qa - 1) * (rb - 1) * (s - 1);
			}
			if (p > 0) q = -q;
			p = Math.abs(p);
			const interpolationIsSafe =
				2 * p < Math.min(3 * halfBracket * q - Math.abs(tolerance * q), Math.abs(previousStep * q));
			if (interpolationIsSafe) {
				previousStep = step;
				step = p / q;
			} else {
				step = halfBracket;
				previousStep = step;
			}
		} else {
			step = halfBracket;
			previousStep = step;
		}

		a = b;
		fa = fb;
		b += Math.abs(step) > tolerance ? step : halfBracket > 0 ? tolerance : -tolerance;
		fb = f(b);
		if (!Number.isFinite(fb)) return null;
	}
	return null;
}
