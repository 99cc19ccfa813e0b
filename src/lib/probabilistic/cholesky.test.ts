import { describe, expect, it } from 'vitest';
import { cholesky } from './cholesky';

const times = (l: number[][]) => l.map((row, i) => l.map((other, j) => row.reduce((s, v, k) => s + v * other[k], 0)));

describe('cholesky', () => {
	it('factors the textbook 3 x 3 example exactly', () => {
		// Source: the worked example of the Wikipedia article "Cholesky decomposition" (from memory):
		// [[4, 12, -16], [12, 37, -43], [-16, -43, 98]] = L L^T with L = [[2, 0, 0], [6, 1, 0], [-8, 5, 3]].
		const result = cholesky([
			[4, 12, -16],
			[12, 37, -43],
			[-16, -43, 98]
		]);
		expect(result).toEqual({
			ok: true,
			lower: [
				[2, 0, 0],
				[6, 1, 0],
				[-8, 5, 3]
			]
		});
	});

	it('gives back the matrix as L L^T for a correlation matrix', () => {
		const a = [
			[1, 0.5, -0.3, 0.2],
			[0.5, 1, 0.1, 0],
			[-0.3, 0.1, 1, 0.4],
			[0.2, 0, 0.4, 1]
		];
		const result = cholesky(a);
		if (!result.ok) throw new Error('expected a factor');
		const back = times(result.lower);
		a.forEach((row, i) => row.forEach((v, j) => expect(back[i][j]).toBeCloseTo(v, 14)));
	});

	it('refuses a matrix that is not positive definite, naming the row where the pivot fails', () => {
		// Correlations 0.9, 0.9 and -0.9 between three variables: determinant 0.19 - 2 x 1.539 < 0 (by hand).
		expect(
			cholesky([
				[1, 0.9, 0.9],
				[0.9, 1, -0.9],
				[0.9, -0.9, 1]
			])
		).toEqual({ ok: false, failedAt: 2 });
		// A singular matrix (two identical variables) is refused too.
		expect(
			cholesky([
				[1, 1],
				[1, 1]
			])
		).toEqual({ ok: false, failedAt: 1 });
	});
});
