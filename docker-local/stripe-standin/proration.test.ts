import { describe, expect, it } from 'vitest';
import { prorationAmount, remainingShare } from './proration';

describe('remainingShare', () => {
	it('is the part of the period still to run, clamped to 0..1', () => {
		expect(remainingShare(0, 300, 100).toFixed(10)).toBe('0.6666666667');
		expect(remainingShare(0, 300, 300).toNumber()).toBe(0);
		expect(remainingShare(100, 300, 50).toNumber()).toBe(1);
		expect(remainingShare(100, 100, 100).toNumber()).toBe(0);
	});
});

describe('prorationAmount', () => {
	it('charges unit × added seats × share left, rounded once to whole pence', () => {
		// 4900 × (5 − 3) × (1/3) = 3266.67 -> 3267 (hand arithmetic)
		const period = 30 * 86_400;
		expect(
			prorationAmount({ unitAmount: 4900, oldQuantity: 3, newQuantity: 5, periodStart: 0, periodEnd: period, at: (2 * period) / 3 })
		).toBe(3267);
	});

	it('credits removed seats as a negative amount, halves rounded away from zero', () => {
		// 4900 × (2 − 3) × (1/2) = −2450 exactly; 4901 × (−1) × (1/2) = −2450.5 -> −2451
		expect(prorationAmount({ unitAmount: 4900, oldQuantity: 3, newQuantity: 2, periodStart: 0, periodEnd: 200, at: 100 })).toBe(-2450);
		expect(prorationAmount({ unitAmount: 4901, oldQuantity: 3, newQuantity: 2, periodStart: 0, periodEnd: 200, at: 100 })).toBe(-2451);
	});

	it('is zero once the period has ended and the full difference before it starts', () => {
		expect(prorationAmount({ unitAmount: 4900, oldQuantity: 1, newQuantity: 4, periodStart: 0, periodEnd: 100, at: 100 })).toBe(0);
		expect(prorationAmount({ unitAmount: 4900, oldQuantity: 1, newQuantity: 4, periodStart: 50, periodEnd: 100, at: 0 })).toBe(14700);
	});
});
