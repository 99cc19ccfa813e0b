/**
 * Cholesky factor of a symmetric positive definite matrix, in plain numbers:
 * client-safe, so the run form can refuse inconsistent correlations before
 * anything is sent.
 */

export type CholeskyResult = { ok: true; lower: number[][] } | { ok: false; failedAt: number };

/** A pivot at or below this is taken as zero: a correlation matrix this close to singular is refused. */
const SMALLEST_PIVOT = 1e-10;

/**
 * Lower-triangular L with A = L L^T (Cholesky-Banachiewicz, row by row):
 *
 *     L_jj = sqrt(A_jj - sum_{k<j} L_jk^2)
 *     L_ij = (A_ij - sum_{k<j} L_ik L_jk) / L_jj,   i > j
 *
 * Only the lower triangle of A is read. When a pivot A_jj - sum L_jk^2 is not
 * above 1e-10 the matrix is not (numerically) positive definite, and the
 * result names the row j where that happened: the leading (j+1) x (j+1) block
 * is already not positive definite. Source: G. H. Golub and C. F. Van Loan,
 * Matrix Computations, 4th ed., section 4.2 (Cholesky factorisation).
 * Example: [[4, 12, -16], [12, 37, -43], [-16, -43, 98]] has
 * L = [[2, 0, 0], [6, 1, 0], [-8, 5, 3]].
 */
export function cholesky(matrix: readonly (readonly number[])[]): CholeskyResult {
	const n = matrix.length;
	const lower = matrix.map(() => new Array<number>(n).fill(0));
	for (let i = 0; i < n; i++) {
		for (let j = 0; j <= i; j++) {
			let sum = matrix[i][j];
			for (let k = 0; k < j; k++) sum -= lower[i][k] * lower[j][k];
			if (i === j) {
				if (!(sum > SMALLEST_PIVOT)) return { ok: false, failedAt: i };
				lower[i][i] = Math.sqrt(sum);
			} else {
				lower[i][j] = sum / lower[j][j];
			}
		}
	}
	return { ok: true, lower };
}
