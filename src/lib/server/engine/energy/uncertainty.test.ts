import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { combinedSigma, exceedanceFactor, normalQuantile } from './uncertainty';

describe('combinedSigma', () => {
	it('is the root sum of squares', () => {
		// RSS of independent errors (GUM-style): sqrt(0.03^2 + 0.04^2) = 0.05.
		expect(combinedSigma([0.03, 0.04]).toString()).toBe('0.05');
		expect(combinedSigma([]).toString()).toBe('0');
	});
});

describe('normalQuantile', () => {
	it('gives the standard normal quantiles', () => {
		// Standard normal table: z(0.9) = 1.281552, z(0.95) = 1.644854, z(0.99) = 2.326348, z(0.5) = 0.
		expect(normalQuantile(0.9)).toBeCloseTo(1.2815515655446004, 13);
		expect(normalQuantile(0.95)).toBeCloseTo(1.6448536269514722, 13);
		expect(normalQuantile(0.99)).toBeCloseTo(2.3263478740408408, 13);
		expect(normalQuantile(0.01)).toBeCloseTo(-2.3263478740408408, 13);
		expect(normalQuantile(0.5)).toBeCloseTo(0, 15);
	});
});

describe('exceedanceFactor', () => {
	it('gives P90/P50 = 0.871845 at sigma 10 %', () => {
		// CHECK-VALUES (derived, common practice): 1 - 1.281552 x 0.10 = 0.871845.
		expect(exceedanceFactor(90, 0.1).toNumber()).toBeCloseTo(0.871845, 6);
		expect(exceedanceFactor(50, 0.1).toNumber()).toBeCloseTo(1, 14);
	});
	it('never lets P90 exceed P50 and never goes below zero', () => {
		// Property: z(0.9) > 0, so P90 <= P50 for every sigma >= 0; the floor is zero.
		fc.assert(
			fc.property(fc.double({ min: 0, max: 2, noNaN: true }), fc.integer({ min: 51, max: 99 }), (sigma, level) => {
				const f = exceedanceFactor(level, sigma);
				return f.lte(1) && f.gte(0);
			})
		);
	});
});
