import { describe, expect, it } from 'vitest';
import { inverseCdf, standardNormalCdf } from './distributions';

describe('standardNormalCdf', () => {
	it('matches tabulated values', () => {
		// Source: Abramowitz and Stegun, Handbook of Mathematical Functions, Table 26.1 (from memory, 10+ digits):
		// Phi(1) = 0.8413447461, Phi(1.96) = 0.9750021049, Phi(-2.5) = 0.0062096653, Phi(0) = 0.5.
		expect(standardNormalCdf(0)).toBe(0.5);
		expect(standardNormalCdf(1)).toBeCloseTo(0.8413447461, 10);
		expect(standardNormalCdf(1.96)).toBeCloseTo(0.9750021049, 10);
		expect(standardNormalCdf(-2.5)).toBeCloseTo(0.0062096653, 10);
		expect(standardNormalCdf(-9)).toBe(0);
		expect(standardNormalCdf(9)).toBe(1);
	});

	it('is symmetric: Phi(-x) = 1 - Phi(x)', () => {
		for (const x of [0.3, 1.7, 3.2, 6]) expect(standardNormalCdf(-x)).toBeCloseTo(1 - standardNormalCdf(x), 15);
	});
});

describe('inverseCdf', () => {
	it('normal: mean + sd z, with z(0.9) = 1.2815515655', () => {
		// Source: Abramowitz and Stegun Table 26.5 (from memory): the 0.90 quantile of N(0,1) is 1.2815515655.
		expect(inverseCdf({ shape: 'normal', mean: 100, sd: 10 }, 0.9)).toBeCloseTo(112.815515655, 7);
		expect(inverseCdf({ shape: 'normal', mean: 100, sd: 10 }, 0.5)).toBeCloseTo(100, 12);
		expect(inverseCdf({ shape: 'normal', mean: 100, sd: 10 }, 0.1)).toBeCloseTo(87.184484345, 7);
	});

	it('uniform: min + u (max - min)', () => {
		expect(inverseCdf({ shape: 'uniform', min: 2, max: 6 }, 0.25)).toBe(3);
	});

	it('triangular: closed form on both sides of the mode, and F(mode) = (mode - min)/(max - min)', () => {
		// Source: Kotz and van Dorp, Beyond Beta (2004). min 0, mode 1, max 4: F(1) = 1/4;
		// u = 1/16 -> sqrt(1/16 x 4 x 1) = 0.5; u = 0.75 -> 4 - sqrt(0.25 x 4 x 3) = 4 - sqrt(3) (by hand).
		const d = { shape: 'triangular', min: 0, mode: 1, max: 4 } as const;
		expect(inverseCdf(d, 0.25)).toBeCloseTo(1, 14);
		expect(inverseCdf(d, 1 / 16)).toBeCloseTo(0.5, 14);
		expect(inverseCdf(d, 0.75)).toBeCloseTo(4 - Math.sqrt(3), 14);
		// A mode at an end: the density is a ramp.
		expect(inverseCdf({ shape: 'triangular', min: 0, mode: 0, max: 1 }, 0.75)).toBeCloseTo(0.5, 14);
		expect(inverseCdf({ shape: 'triangular', min: 0, mode: 1, max: 1 }, 0.25)).toBeCloseTo(0.5, 14);
	});

	it('lognormal: the median is mean^2 / sqrt(mean^2 + sd^2)', () => {
		// Source: Johnson, Kotz and Balakrishnan, Continuous Univariate Distributions vol. 1, ch. 14:
		// median exp(mu), mu = ln(m^2 / sqrt(m^2 + s^2)). m = 3, s = 4: 9 / 5 = 1.8 (by hand).
		expect(inverseCdf({ shape: 'lognormal', mean: 3, sd: 4 }, 0.5)).toBeCloseTo(1.8, 12);
	});

	it('truncated normal: symmetric cut keeps the median at the mean, stays inside the bounds, and the quantile is the conditional one', () => {
		expect(inverseCdf({ shape: 'truncated-normal', mean: 1, sd: 0.5, min: 0, max: 2 }, 0.5)).toBeCloseTo(1, 12);
		const d = { shape: 'truncated-normal', mean: 0, sd: 1, min: -0.5, max: 3 } as const;
		for (const u of [0, 1e-300, 0.001, 0.5, 0.999, 1]) {
			const x = inverseCdf(d, u);
			expect(x).toBeGreaterThanOrEqual(-0.5);
			expect(x).toBeLessThanOrEqual(3);
		}
		// By definition: P(X <= x | -0.5 < X < 3) = u, i.e. (Phi(x) - Phi(-0.5)) / (Phi(3) - Phi(-0.5)) = u.
		const x = inverseCdf(d, 0.3);
		const conditional = (standardNormalCdf(x) - standardNormalCdf(-0.5)) / (standardNormalCdf(3) - standardNormalCdf(-0.5));
		expect(conditional).toBeCloseTo(0.3, 12);
	});

	it('never returns an infinite value at u = 0 or 1', () => {
		for (const shape of [
			{ shape: 'normal', mean: 0, sd: 1 },
			{ shape: 'lognormal', mean: 1, sd: 1 }
		] as const) {
			expect(Number.isFinite(inverseCdf(shape, 0))).toBe(true);
			expect(Number.isFinite(inverseCdf(shape, 1))).toBe(true);
		}
	});
});
