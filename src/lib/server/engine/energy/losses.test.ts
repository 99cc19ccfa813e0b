import { describe, expect, it } from 'vitest';
import { degradationFactor, degradationFactors, netLossFactor } from './losses';

describe('netLossFactor', () => {
	it('multiplies losses rather than adding them', () => {
		// CHECK-VALUES: availability 95 %, array 5 %, electrical 3 % -> 0.95 x 0.95 x 0.97 = 0.875425, not 0.87.
		const f = netLossFactor({ arrayLoss: 0.05, availability: 0.95, electricalLoss: 0.03, otherLoss: 0 });
		expect(f.toString()).toBe('0.875425');
	});
});

describe('degradationFactor', () => {
	it('is geometric: 0.5 %/yr leaves 0.955890 in year 10', () => {
		// CHECK-VALUES (derived): 0.995^9 = 0.955890 (year 1 undegraded).
		expect(degradationFactor(0.005, 10).toNumber()).toBeCloseTo(0.95589, 6);
		expect(degradationFactor(0.005, 1).toString()).toBe('1');
	});
	it('builds the same factors by repeated multiplication', () => {
		const factors = degradationFactors(0.005, 25);
		expect(factors).toHaveLength(25);
		factors.forEach((f, i) => expect(f.eq(degradationFactor(0.005, i + 1))).toBe(true));
	});
});
