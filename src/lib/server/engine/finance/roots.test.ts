import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { dec } from '../decimal';
import { presentValueOfTimed } from './discounting';
import { solveRoot } from './roots';

describe('solveRoot', () => {
	it('finds the square root of 2 to the default tolerance', () => {
		// hand calculation: the positive root of x^2 - 2 is sqrt(2)
		const result = solveRoot((x) => x * x - 2, 0, 2);
		expect(result).not.toBeNull();
		expect(Math.abs(result!.x - Math.SQRT2)).toBeLessThan(1e-12);
	});

	it('reaches machine precision with xTolerance 0', () => {
		// the fixed point of cos, 0.7390851332151607 (the Dottie number; from memory)
		const result = solveRoot((x) => Math.cos(x) - x, 0, 1, { xTolerance: 0 });
		expect(Math.abs(result!.x - 0.7390851332151607)).toBeLessThanOrEqual(4 * Number.EPSILON);
	});

	it('accepts the bracket in either order', () => {
		// the bracket is a set: [2, 0] holds the same root as [0, 2]
		const result = solveRoot((x) => x * x - 2, 2, 0);
		expect(Math.abs(result!.x - Math.SQRT2)).toBeLessThan(1e-12);
	});

	it('returns an endpoint that is already a root without iterating', () => {
		// decided on purpose: f(lo) = 0 is an answer
		expect(solveRoot((x) => x - 1, 1, 5)).toEqual({ x: 1, iterations: 0 });
		expect(solveRoot((x) => x - 5, 1, 5)).toEqual({ x: 5, iterations: 0 });
	});

	it('returns null when the interval does not bracket a sign change', () => {
		// Brent's method needs f(lo) f(hi) < 0: x^2 + 1 has no real root
		expect(solveRoot((x) => x * x + 1, -3, 3)).toBeNull();
		// two roots inside, no sign change at the ends: also not bracketed
		expect(solveRoot((x) => x * x - 1, -3, 3)).toBeNull();
	});

	it('returns null when f is not finite or the iterations run out', () => {
		// decided on purpose: null, never NaN
		expect(solveRoot(() => Number.NaN, 0, 1)).toBeNull();
		expect(solveRoot((x) => (x < 0.5 ? -1 : Number.POSITIVE_INFINITY), 0, 1)).toBeNull();
		expect(solveRoot((x) => x - 0.3, 0, 1e6, { maxIterations: 1 })).toBeNull();
	});

	it('falls back to bisection on a discontinuous sign change', () => {
		// Brent (1973): never slower than bisection, so a step function's jump is found
		const result = solveRoot((x) => (x > 0.3 ? 1 : -1), 0, 1);
		expect(Math.abs(result!.x - 0.3)).toBeLessThan(1e-11);
	});

	it('solves the spreadsheet XIRR example through presentValueOfTimed', () => {
		// spreadsheet XIRR function documentation example: these five dated flows -> 0.373362535
		const dated: [string, number][] = [
			['2008-01-01', -10000],
			['2008-03-01', 2750],
			['2008-10-30', 4250],
			['2009-02-15', 3250],
			['2009-04-01', 2750]
		];
		const start = Date.parse(dated[0][0]);
		const flows = dated.map(([day, amount]) => ({
			t: (Date.parse(day) - start) / 86_400_000 / 365,
			amount: dec(amount)
		}));
		const result = solveRoot((rate) => presentValueOfTimed(rate, flows).toNumber(), 0, 1, { xTolerance: 0 });
		// the published figure is the spreadsheet's own iterate, which it documents as accurate to
		// 0.000001 % (from memory), so compare within 1e-8
		expect(Math.abs(result!.x - 0.373362535)).toBeLessThan(1e-8);
	});

	it('finds a planted root of a cubic within the stated tolerance', () => {
		// property: (x - r)(1 + x^2) has the single real root r
		fc.assert(
			fc.property(fc.double({ min: -10, max: 10, noNaN: true }), (root) => {
				const result = solveRoot((x) => (x - root) * (1 + x * x), -20, 20);
				return result !== null && Math.abs(result.x - root) <= 4 * Number.EPSILON * Math.abs(root) + 1e-12;
			}),
			{ numRuns: 300 }
		);
	});
});
