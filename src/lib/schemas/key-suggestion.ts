/**
 * The key a misspelt one probably meant, and the words for refusing an
 * unknown key. Pure functions, shared by every place a JSON document or body
 * is checked, so a misspelling reads the same in the API, the CLI and the editor.
 */

/**
 * Edit distance with adjacent transpositions counted as one edit (the
 * "optimal string alignment" form of the Damerau-Levenshtein distance):
 *
 *     d(i, j) = min(d(i-1, j) + 1, d(i, j-1) + 1, d(i-1, j-1) + [a_i != b_j],
 *                   d(i-2, j-2) + 1 when a_i = b_(j-1) and a_(i-1) = b_j)
 *
 * Source: Damerau (1964), Levenshtein (1966); the restricted form as usually
 * taught (each substring edited at most once).
 */
export function editDistance(a: string, b: string): number {
	const rows = a.length + 1;
	const cols = b.length + 1;
	const d: number[][] = Array.from({ length: rows }, (_, i) => Array.from({ length: cols }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
	for (let i = 1; i < rows; i++) {
		for (let j = 1; j < cols; j++) {
			const cost = a[i - 1] === b[j - 1] ? 0 : 1;
			d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
			if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
		}
	}
	return d[a.length][b.length];
}

/** Keys this short get at most one edit; longer ones two. */
const SHORT_KEY = 4;
/** A prefix must be at least this long to count as a clear one. */
const MIN_PREFIX = 3;

function only<T>(values: T[]): T | null {
	return values.length === 1 ? values[0] : null;
}

/**
 * The known key that `key` was probably meant to be, or null when none is
 * clearly nearest. Case is ignored. First choice: the one known key at the
 * smallest edit distance, at most 2 (1 for keys of up to 4 letters); else
 * the one known key that `key` is a prefix of, or that is a prefix of `key`
 * (`ratedPower` -> `ratedPowerKW`), at least 3 letters long. Ties suggest nothing.
 */
export function suggestKey(key: string, known: readonly string[]): string | null {
	const wanted = key.toLowerCase();
	const limit = wanted.length <= SHORT_KEY ? 1 : 2;
	const distances = known.map((k) => ({ k, d: editDistance(wanted, k.toLowerCase()) })).filter((c) => c.d <= limit);
	if (distances.length > 0) {
		const best = Math.min(...distances.map((c) => c.d));
		return only(distances.filter((c) => c.d === best).map((c) => c.k));
	}
	const prefixed = known.filter((k) => {
		const lower = k.toLowerCase();
		const shorter = Math.min(lower.length, wanted.length);
		return shorter >= MIN_PREFIX && (lower.startsWith(wanted) || wanted.startsWith(lower));
	});
	return only(prefixed);
}

/** Up to this many known keys are listed when none is near. */
const LISTED_KEYS = 10;

/**
 * The refusal of an unknown key, with the key probably meant:
 * `"availabilty" is not a field here; did you mean "availability"?`
 */
export function unknownKeyMessage(key: string, known: readonly string[]): string {
	const suggestion = suggestKey(key, known);
	if (suggestion !== null) return `"${key}" is not a field here; did you mean "${suggestion}"?`;
	if (known.length === 0) return `"${key}" is not a field here; this object takes no fields`;
	if (known.length <= LISTED_KEYS) return `"${key}" is not a field here; the fields here are ${known.join(', ')}`;
	return `"${key}" is not a field here`;
}
