/**
 * Anderson acceleration of a fixed-point iteration x = F(x), for the tax
 * circle of the cash-flow model (interest -> tax -> CFADS -> debt -> interest).
 * Plain iteration there contracts linearly (by some 3 to 8 % a round), so
 * reaching 1e-9 of the debt takes six or seven rounds; the map is nearly
 * linear, and mixing the last few iterates by least squares settles it in
 * about half of that.
 *
 *     f_k = F(x_k) - x_k
 *     gamma = argmin || f_k - dF gamma ||,  dF_j = f_k - f_(k-j),  dX_j = x_k - x_(k-j)
 *     x_(k+1) = F(x_k) - (dX + dF) gamma
 *
 * with at most `depth` earlier iterates. The coefficients are found in
 * float64 (they only steer the iteration; the convergence test is the
 * caller's, in decimals), the mix is formed in decimals. When the residual
 * grows, the history is dropped and the plain step F(x_k) taken.
 * Source: D. G. Anderson, "Iterative procedures for nonlinear integral
 * equations", J. ACM 12 (1965) 547-560; H. F. Walker and P. Ni, "Anderson
 * acceleration for fixed-point iterations", SIAM J. Numer. Anal. 49 (2011)
 * 1715-1735 (the form above, their "Type II").
 */
import { Decimal, roughNumber } from '../decimal';

type Iterate = { x: Decimal[]; f: Decimal[]; norm: number };

export class AndersonMixer {
	private history: Iterate[] = [];

	constructor(private readonly depth = 2) {}

	/** The next iterate from the current one x and its image F(x). */
	next(x: readonly Decimal[], image: readonly Decimal[]): Decimal[] {
		const f = image.map((v, i) => v.minus(x[i]));
		const norm = Math.hypot(...f.map(roughNumber));
		const last = this.history[this.history.length - 1];
		if (last && !(norm < last.norm)) this.history = [];
		const earlier = this.history.slice(-this.depth);
		this.history.push({ x: [...x], f, norm });
		if (this.history.length > this.depth + 1) this.history.shift();
		if (earlier.length === 0) return [...image];
		const dF = earlier.map((e) => f.map((v, i) => v.minus(e.f[i])));
		const dX = earlier.map((e) => x.map((v, i) => v.minus(e.x[i])));
		const gamma = leastSquares(
			dF.map((col) => col.map(roughNumber)),
			f.map(roughNumber)
		);
		if (gamma === null) return [...image];
		return image.map((v, i) => {
			let mixed = v;
			gamma.forEach((g, j) => (mixed = mixed.minus(dX[j][i].plus(dF[j][i]).times(g))));
			return mixed;
		});
	}
}

/** argmin_g || b - A g || for A given by columns (1 or 2 of them), by the normal equations; null when singular. */
function leastSquares(columns: number[][], b: number[]): number[] | null {
	const dot = (u: number[], v: number[]) => u.reduce((s, ui, i) => s + ui * v[i], 0);
	if (columns.length === 1) {
		const aa = dot(columns[0], columns[0]);
		return aa > 0 ? [dot(columns[0], b) / aa] : null;
	}
	const [c0, c1] = columns;
	const a00 = dot(c0, c0);
	const a01 = dot(c0, c1);
	const a11 = dot(c1, c1);
	const det = a00 * a11 - a01 * a01;
	if (!(Math.abs(det) > 1e-12 * a00 * a11)) return leastSquares([c0], b);
	const r0 = dot(c0, b);
	const r1 = dot(c1, b);
	return [(a11 * r0 - a01 * r1) / det, (a00 * r1 - a01 * r0) / det];
}
