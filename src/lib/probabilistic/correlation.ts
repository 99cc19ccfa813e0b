/**
 * Rank correlations between drawn drivers, turned into the Gaussian-copula
 * correlation matrix and its Cholesky factor. Client-safe: the run schema
 * uses it to refuse correlations that cannot hold together.
 */
import { cholesky } from './cholesky';

export type RankCorrelation<Id extends string = string> = { a: Id; b: Id; rankCorrelation: number };

/**
 * Pearson correlation of a bivariate normal with Spearman rank correlation rho_s.
 *
 *     rho = 2 sin(pi rho_s / 6)
 *
 * A Gaussian copula with this rho gives every pair of continuous marginals
 * the rank correlation rho_s, whatever their shapes (ranks do not change under
 * the monotone F^-1(Phi(.))). Sources: K. Pearson (1907), "On further methods
 * of determining correlation", Drapers' Company Research Memoirs; M. G. Kendall
 * and J. D. Gibbons, Rank Correlation Methods, 5th ed. (1990), ch. 10.
 * Examples: rho_s = 0.5 gives 2 sin(pi/12) = 0.517638; rho_s = +-1 gives +-1.
 */
export function pearsonFromSpearman(rankCorrelation: number): number {
	return 2 * Math.sin((Math.PI * rankCorrelation) / 6);
}

/** The ids that take part in at least one correlation, in the order of `order`. */
export function correlatedIds<Id extends string>(order: readonly Id[], correlations: readonly RankCorrelation<Id>[]): Id[] {
	const named = new Set(correlations.flatMap((c) => [c.a, c.b]));
	return order.filter((id) => named.has(id));
}

export type CorrelationFactor<Id extends string> =
	| { ok: true; lower: number[][] }
	/** The given pairs among the ids of the leading block that is not positive definite. */
	| { ok: false; pairs: RankCorrelation<Id>[] };

/**
 * Cholesky factor L of the copula's correlation matrix over `ids` (in that
 * order): 1 on the diagonal, pearsonFromSpearman(rho_s) for each given pair, 0
 * for pairs not given. The matrix of rank correlations a user types need not be
 * consistent (capex-opex 0.9, capex-tariff 0.9, opex-tariff -0.9 cannot all
 * hold); then the factor fails and the pairs involved are returned.
 */
export function correlationFactor<Id extends string>(ids: readonly Id[], correlations: readonly RankCorrelation<Id>[]): CorrelationFactor<Id> {
	const position = new Map(ids.map((id, i) => [id, i]));
	const matrix: number[][] = ids.map((_, i) => ids.map((__, j) => (i === j ? 1 : 0)));
	for (const c of correlations) {
		const i = position.get(c.a);
		const j = position.get(c.b);
		if (i === undefined || j === undefined) throw new Error(`correlation ${c.a}-${c.b} names an id outside ${ids.join(', ')}`);
		matrix[i][j] = matrix[j][i] = pearsonFromSpearman(c.rankCorrelation);
	}
	const result = cholesky(matrix);
	if (result.ok) return { ok: true, lower: result.lower };
	const block = new Set(ids.slice(0, result.failedAt + 1));
	return { ok: false, pairs: correlations.filter((c) => block.has(c.a) && block.has(c.b)) };
}
