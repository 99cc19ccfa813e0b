import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { dec } from '../decimal';
import {
	combinedSigma,
	exceedanceFactor,
	horizonExceedanceFactor,
	horizonSigma,
	normalQuantile,
	sigmaFromExceedance,
	splitSigmas
} from './uncertainty';

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

describe('splitSigmas', () => {
	it('combines each kind apart, and a component without a kind is long-term', () => {
		// RSS within each kind: long-term sqrt(0.06^2 + 0.08^2) = 0.10; inter-annual sqrt(0.03^2 + 0.04^2) = 0.05.
		const split = splitSigmas([
			{ sigma: 0.06 },
			{ sigma: 0.08, kind: 'long-term' },
			{ sigma: 0.03, kind: 'inter-annual' },
			{ sigma: 0.04, kind: 'inter-annual' }
		]);
		expect(split.longTerm.toString()).toBe('0.1');
		expect(split.interAnnual.toString()).toBe('0.05');
	});
});

describe('horizonSigma', () => {
	// Common practice in yield assessment (the year-to-year part of N independent years averages out as
	// 1/sqrt(N)); Thevenard and Pelland, Solar Energy 91 (2013) 432-445; EWEA, Wind Energy - The Facts (2009).
	const split = { longTerm: dec(0.08), interAnnual: dec(0.06) };

	it('is the root sum of squares of both kinds over one year', () => {
		// N = 1: sqrt(0.08^2 + 0.06^2 / 1) = sqrt(0.0064 + 0.0036) = sqrt(0.01) = 0.1.
		expect(horizonSigma(split, 1).toString()).toBe('0.1');
	});

	it('divides the inter-annual variance by the years of the horizon', () => {
		// N = 10: sqrt(0.0064 + 0.0036 / 10) = sqrt(0.0064 + 0.00036) = sqrt(0.00676) = 0.0822192191643779.
		expect(horizonSigma(split, 10).toNumber()).toBeCloseTo(0.0822192191643779, 15);
		// N = 4: sqrt(0.0064 + 0.0036 / 4) = sqrt(0.0073) = 0.0854400374531753.
		expect(horizonSigma(split, 4).toNumber()).toBeCloseTo(0.0854400374531753, 15);
	});

	it('gives the same sigma over every horizon when there is only long-term uncertainty', () => {
		const longOnly = { longTerm: dec(0.1), interAnnual: dec(0) };
		expect(horizonSigma(longOnly, 10).eq(horizonSigma(longOnly, 1))).toBe(true);
		expect(horizonSigma(longOnly, 10).toString()).toBe('0.1');
	});

	it('never grows with the horizon and never falls below the long-term sigma', () => {
		// Property: sigma_N is non-increasing in N and bounded below by sigma_LT.
		fc.assert(
			fc.property(fc.double({ min: 0, max: 0.5, noNaN: true }), fc.double({ min: 0, max: 0.5, noNaN: true }), fc.integer({ min: 1, max: 40 }), (lt, iav, n) => {
				const s = { longTerm: dec(lt), interAnnual: dec(iav) };
				return horizonSigma(s, n + 1).lte(horizonSigma(s, n)) && horizonSigma(s, n).gte(dec(lt).minus(1e-25));
			})
		);
	});

	it('refuses a horizon shorter than a year', () => {
		expect(() => horizonSigma(split, 0)).toThrow(RangeError);
	});
});

describe('horizonExceedanceFactor', () => {
	it('gives P90 over one and over ten years by hand', () => {
		// sigma_LT 8 %, sigma_IAV 6 %, z_90 = 1.2815515655446004 (standard normal quantile, NIST/SEMATECH
		// e-Handbook of Statistical Methods 1.3.6.7.1 tabulates 1.282):
		// 1 year:   1 - 1.2815515655 x 0.1          = 0.8718448434
		// 10 years: 1 - 1.2815515655 x 0.0822192192 = 0.8946318310
		const split = { longTerm: dec(0.08), interAnnual: dec(0.06) };
		expect(horizonExceedanceFactor(90, 1, split).toNumber()).toBeCloseTo(0.8718448434, 10);
		expect(horizonExceedanceFactor(90, 10, split).toNumber()).toBeCloseTo(0.894631831, 9);
		expect(horizonExceedanceFactor(50, 10, split).toNumber()).toBeCloseTo(1, 14);
	});
});

describe('sigmaFromExceedance', () => {
	it('turns a P90 into sigma with z_90 = 1.2815515655', () => {
		// Normal model P90 = P50 (1 - 1.2815515655 sigma), z_90 from the standard normal quantile
		// (NIST/SEMATECH e-Handbook 1.3.6.7.1: 1.282). P50 100,000, P90 85,000:
		// sigma = (1 - 85,000 / 100,000) / 1.2815515655 = 0.15 / 1.2815515655 = 0.1170456.
		expect(sigmaFromExceedance(100_000, 85_000).toNumber()).toBeCloseTo(0.15 / 1.2815515655446004, 12);
		expect(sigmaFromExceedance(100_000, 85_000).toNumber()).toBeCloseTo(0.1170456, 7);
		expect(sigmaFromExceedance(100_000, 100_000).toString()).toBe('0');
	});

	it('is undone by exceedanceFactor: P90 from sigma and back', () => {
		// sigma 10 %: P90 = 100 x (1 - 1.2815515655 x 0.1) = 87.18448434; back: (1 - 0.8718448434) / 1.2815515655 = 0.1.
		const p90 = exceedanceFactor(90, 0.1).times(100);
		expect(p90.toNumber()).toBeCloseTo(87.18448434, 8);
		expect(sigmaFromExceedance(100, p90).toNumber()).toBeCloseTo(0.1, 14);
		fc.assert(
			fc.property(fc.double({ min: 0, max: 0.4, noNaN: true }), fc.integer({ min: 51, max: 99 }), (sigma, level) => {
				const back = sigmaFromExceedance(1, exceedanceFactor(level, sigma), level);
				return back.minus(sigma).abs().lt(1e-12);
			})
		);
	});

	it('refuses a level at or below P50', () => {
		expect(() => sigmaFromExceedance(100, 90, 50)).toThrow(RangeError);
	});
});
