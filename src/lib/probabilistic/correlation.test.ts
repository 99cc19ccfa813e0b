import { describe, expect, it } from 'vitest';
import { correlatedIds, correlationFactor, pearsonFromSpearman } from './correlation';

describe('pearsonFromSpearman', () => {
	it('follows rho = 2 sin(pi rho_s / 6)', () => {
		// Source: Pearson (1907); Kendall and Gibbons, Rank Correlation Methods. 2 sin(pi/12) = 0.5176380902 (by hand).
		expect(pearsonFromSpearman(0.5)).toBeCloseTo(0.5176380902, 9);
		expect(pearsonFromSpearman(-0.5)).toBeCloseTo(-0.5176380902, 9);
		expect(pearsonFromSpearman(0)).toBe(0);
		expect(pearsonFromSpearman(1)).toBeCloseTo(1, 15);
	});
});

describe('correlatedIds', () => {
	it('keeps the given order and only the ids named in a correlation', () => {
		expect(correlatedIds(['a', 'b', 'c', 'd'], [{ a: 'd', b: 'b', rankCorrelation: 0.3 }])).toEqual(['b', 'd']);
	});
});

describe('correlationFactor', () => {
	it('factors a consistent matrix', () => {
		const result = correlationFactor(['x', 'y'], [{ a: 'y', b: 'x', rankCorrelation: 0.5 }]);
		if (!result.ok) throw new Error('expected a factor');
		// 2 x 2: L = [[1, 0], [rho, sqrt(1 - rho^2)]] (by hand).
		const rho = 2 * Math.sin(Math.PI / 12);
		expect(result.lower[1][0]).toBeCloseTo(rho, 14);
		expect(result.lower[1][1]).toBeCloseTo(Math.sqrt(1 - rho * rho), 14);
	});

	it('names the pairs that cannot hold together', () => {
		const pairs = [
			{ a: 'x', b: 'y', rankCorrelation: 0.9 },
			{ a: 'x', b: 'z', rankCorrelation: 0.9 },
			{ a: 'y', b: 'z', rankCorrelation: -0.9 },
			{ a: 'v', b: 'w', rankCorrelation: 0.2 }
		];
		const result = correlationFactor(['x', 'y', 'z', 'v', 'w'], pairs);
		expect(result).toEqual({ ok: false, pairs: pairs.slice(0, 3) });
	});
});
