import { describe, expect, it } from 'vitest';
import { Decimal } from '../decimal';
import { AndersonMixer } from './anderson';

/** x = A x + b with a contraction A (spectral radius 0.6): the fixed point solves (I - A) x = b. */
const A = [
	[0.5, 0.1],
	[0.2, 0.4]
];
const b = [1, 2];
const map = (x: Decimal[]) => A.map((row, i) => row.reduce((s, a, j) => s.plus(x[j].times(a)), new Decimal(b[i])));
// Hand solution of (I - A) x = b: 0.5 x0 - 0.1 x1 = 1 and -0.2 x0 + 0.6 x1 = 2, by Cramer's rule.
const det = 0.5 * 0.6 - 0.1 * 0.2; // 0.28
const exact = [(1 * 0.6 + 0.1 * 2) / det, (0.5 * 2 + 0.2 * 1) / det]; // [2.857142..., 4.285714...]

function rounds(step: (x: Decimal[], fx: Decimal[]) => Decimal[]): number {
	let x = [new Decimal(0), new Decimal(0)];
	for (let k = 1; k <= 100; k++) {
		const fx = map(x);
		if (Math.max(...fx.map((v, i) => v.minus(x[i]).abs().toNumber())) < 1e-12) return k;
		x = step(x, fx);
	}
	return 100;
}

describe('AndersonMixer', () => {
	it('finds the fixed point of a linear contraction in a few steps where plain iteration needs dozens', () => {
		const mixer = new AndersonMixer(2);
		const accelerated = rounds((x, fx) => mixer.next(x, fx));
		const plain = rounds((_x, fx) => fx);
		expect(accelerated).toBeLessThanOrEqual(5);
		expect(plain).toBeGreaterThan(30);
		const solved = new AndersonMixer(2);
		let x = [new Decimal(0), new Decimal(0)];
		for (let k = 0; k < 6; k++) x = solved.next(x, map(x));
		expect(x[0].toNumber()).toBeCloseTo(exact[0], 10);
		expect(x[1].toNumber()).toBeCloseTo(exact[1], 10);
	});

	it('takes the plain step first and after the residual grows', () => {
		const mixer = new AndersonMixer(2);
		const x = [new Decimal(1)];
		expect(mixer.next(x, [new Decimal(2)]).map(String)).toEqual(['2']);
		// residual 1 then 5: growing, so the history is dropped and the plain step returned
		expect(mixer.next([new Decimal(2)], [new Decimal(7)]).map(String)).toEqual(['7']);
	});
});
