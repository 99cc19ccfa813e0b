import { describe, expect, it } from 'vitest';
import { averageRanks, cumulativeCurve, histogram, presentValues, probabilityBelow, quantile, spearman, spearmanTable, summarise } from './statistics';

describe('quantile (Hyndman and Fan definition 7)', () => {
	it("matches numpy.percentile's documented example", () => {
		// Source: numpy.percentile documentation (from memory): a = [[10, 7, 4], [3, 2, 1]];
		// np.percentile(a, 50) = 3.5 and np.percentile(a, 50, axis=0) = [6.5, 4.5, 2.5].
		expect(quantile([1, 2, 3, 4, 7, 10], 0.5)).toBe(3.5);
		expect([quantile([3, 10], 0.5), quantile([2, 7], 0.5), quantile([1, 4], 0.5)]).toEqual([6.5, 4.5, 2.5]);
	});

	it('interpolates between order statistics at h = (n - 1) p', () => {
		// By hand: [1, 2, 3, 4] at p = 0.1 -> h = 0.3 -> 1.3; at 0.9 -> h = 2.7 -> 3.7. Spreadsheets' PERCENTILE.INC agree.
		expect(quantile([1, 2, 3, 4], 0.1)).toBeCloseTo(1.3, 14);
		expect(quantile([1, 2, 3, 4], 0.9)).toBeCloseTo(3.7, 14);
		expect(quantile([1, 2, 3, 4], 0)).toBe(1);
		expect(quantile([1, 2, 3, 4], 1)).toBe(4);
		expect(quantile([5], 0.37)).toBe(5);
	});

	it('refuses no values and p outside [0, 1]', () => {
		expect(() => quantile([], 0.5)).toThrow(RangeError);
		expect(() => quantile([1, 2], 1.1)).toThrow(RangeError);
		expect(() => quantile([1, 2], Number.NaN)).toThrow(RangeError);
	});
});

describe('summarise', () => {
	const values = [null, ...Array.from({ length: 11 }, (_, i) => i * 10), Number.NaN]; // 0, 10, ..., 100 and two missing

	it('counts the missing values apart and reports mean, sample sd and extremes', () => {
		const s = summarise(values, true);
		expect(s.count).toBe(11);
		expect(s.missing).toBe(2);
		expect(s.mean).toBe(50);
		// Sample sd of 0, 10, ..., 100: sqrt(11000 / 10) = 33.166 (by hand).
		expect(s.sd).toBeCloseTo(Math.sqrt(1100), 12);
		expect([s.min, s.max]).toEqual([0, 100]);
	});

	it('higher is better: P90 is the 10th percentile (reached or bettered with 90 % probability)', () => {
		const s = summarise(values, true);
		expect([s.p90, s.p50, s.p10]).toEqual([10, 50, 90]);
	});

	it('lower is better (LCOE): P90 is the 90th percentile', () => {
		const s = summarise(values, false);
		expect([s.p90, s.p50, s.p10]).toEqual([90, 50, 10]);
	});

	it('with no values gives nulls, with one value no sd', () => {
		expect(summarise([null, null], true)).toEqual({ count: 0, missing: 2, mean: null, sd: null, min: null, max: null, p10: null, p50: null, p90: null });
		expect(summarise([7], true)).toMatchObject({ count: 1, mean: 7, sd: null, p10: 7, p90: 7 });
	});
});

describe('histogram', () => {
	it('uses round edges and counts every value once', () => {
		// Range 0.013 .. 0.187 over 30 bins wants a step of 0.0058: the nice step is 0.01 (1 x 10^-2), edges 0.01 .. 0.19.
		const values = [0.013, 0.05, 0.1, 0.1, 0.187, null];
		const h = histogram(values);
		expect(h.edges[0]).toBe(0.01);
		expect(h.edges[h.edges.length - 1]).toBe(0.19);
		expect(h.edges).toContain(0.07); // 7 / 100, not 0.07000000000000001
		expect(h.counts.length).toBe(h.edges.length - 1);
		expect(h.counts.reduce((a, b) => a + b, 0)).toBe(5);
		// 0.1 sits on an edge: it belongs to the bin starting there.
		expect(h.counts[h.edges.indexOf(0.1)]).toBe(2);
	});

	it('picks 2, 2.5 or 5 times a power of ten and at most bins + 1 bins', () => {
		// Range 0 .. 1000 in 30 bins wants 33.3: the step is 50, so 20 bins.
		const h = histogram([0, 1000]);
		expect(h.edges[1] - h.edges[0]).toBe(50);
		expect(h.counts).toHaveLength(20);
		// Range 0 .. 100 in 10 bins wants 10: exactly 10, with 100 in the last (closed) bin.
		const ten = histogram([0, 33, 100], 10);
		expect(ten.edges).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);
		expect(ten.counts).toEqual([1, 0, 0, 1, 0, 0, 0, 0, 0, 1]);
		// Range 0 .. 22 in 10 bins wants 2.2: 2.5.
		expect(histogram([0, 22], 10).edges.slice(0, 3)).toEqual([0, 2.5, 5]);
		for (const bins of [1, 7, 30]) expect(histogram([-3.7, 12.9, 4], bins).counts.length).toBeLessThanOrEqual(bins + 1);
	});

	it('puts equal values in one bin, and no values in none', () => {
		const h = histogram([5, 5, 5]);
		expect(h.counts).toEqual([3]);
		expect(h.edges[0]).toBeLessThanOrEqual(5);
		expect(h.edges[1]).toBeGreaterThan(5);
		expect(histogram([null])).toEqual({ edges: [], counts: [] });
	});
});

describe('cumulativeCurve', () => {
	it('samples the type-7 quantile at evenly spaced probabilities, minimum to maximum', () => {
		const curve = cumulativeCurve([4, null, 1, 3, 2], 5);
		expect(curve).toEqual([
			{ probability: 0, value: 1 },
			{ probability: 0.25, value: 1.75 },
			{ probability: 0.5, value: 2.5 },
			{ probability: 0.75, value: 3.25 },
			{ probability: 1, value: 4 }
		]);
		expect(cumulativeCurve([1, 2])).toHaveLength(101);
		expect(cumulativeCurve([null])).toEqual([]);
	});
});

describe('probabilityBelow', () => {
	it('is the share strictly below the threshold; missing values as asked', () => {
		const irr = [0.05, 0.07, 0.09, 0.12, null];
		expect(probabilityBelow(irr, 0.08)).toBe(0.5);
		expect(probabilityBelow(irr, 0.08, 'below')).toBe(0.6);
		expect(probabilityBelow(irr, 0.08, 'above')).toBe(0.4);
		expect(probabilityBelow(irr, 0.07)).toBe(0.25);
		expect(probabilityBelow([null], 0.08)).toBeNull();
	});
});

describe('averageRanks', () => {
	it('gives ties the average of the ranks they span', () => {
		expect(averageRanks([10, 20, 20, 5, 20])).toEqual([2, 4, 4, 1, 4]);
	});
});

describe('spearman', () => {
	it('matches the textbook IQ / television example: rho = -29/165', () => {
		// Source: worked example of the Wikipedia article "Spearman's rank correlation coefficient" (from memory); hand-checkable:
		// sum d^2 = 194 over n = 10, so rho = 1 - 6 x 194 / (10 x 99) = -29/165 = -0.175758.
		const iq = [106, 100, 86, 101, 99, 103, 97, 113, 112, 110];
		const tv = [7, 27, 2, 50, 28, 29, 20, 12, 6, 17];
		expect(spearman(iq, tv)).toBeCloseTo(-29 / 165, 14);
	});

	it('uses average ranks for ties', () => {
		// By hand: ranks [1, 2.5, 2.5, 4] against [1, 2, 3, 4]: 4.5 / sqrt(4.5 x 5) = sqrt(0.9).
		expect(spearman([1, 2, 2, 3], [10, 20, 30, 40])).toBeCloseTo(Math.sqrt(0.9), 14);
	});

	it('is 1 for any increasing relation, drops incomplete pairs, and is null when undefined', () => {
		expect(spearman([1, 2, 3, 4], [1, 8, 27, 1000])).toBeCloseTo(1, 14);
		expect(spearman([1, 2, null, 4, 5], [5, 4, 99, 2, null])).toBeCloseTo(-1, 14);
		expect(spearman([1, 1, 1], [1, 2, 3])).toBeNull();
		expect(spearman([1], [2])).toBeNull();
		expect(() => spearman([1, 2], [1])).toThrow(RangeError);
	});
});

describe('presentValues', () => {
	it('drops null, NaN and infinities', () => {
		expect(presentValues([1, null, Number.NaN, Number.POSITIVE_INFINITY, -2])).toEqual([1, -2]);
	});
});

describe('spearmanTable', () => {
	it('gives what spearman gives pair by pair, missing output values left out per output', () => {
		const f1 = [1, 5, 2, 8, 3, 9, 4];
		const f2 = [7, 1, 6, 2, 5, 4, 3];
		const full = [2, 10, 3, 20, 4, 30, 5];
		const gappy = [null, 1, 2, null, 9, 3, 4];
		const table = spearmanTable([f1, f2], [full, gappy]);
		expect(table).toEqual([
			[spearman(f1, full), spearman(f1, gappy)],
			[spearman(f2, full), spearman(f2, gappy)]
		]);
		expect(table[0][0]).toBe(1);
	});
});
