/**
 * Which two revisions the history page compares, from its address
 * (`?from=3&to=5`): by default the current revision against the one before
 * it. A number that names no revision of the scenario falls back to the
 * default and is reported, so a stale link still shows something true.
 */

export interface RevisionChoice {
	from: number;
	to: number;
	/** Words for a revision asked for that does not exist; null when both were found (or not asked). */
	notice: string | null;
}

function asked(params: URLSearchParams, name: string): number | null | 'bad' {
	const text = params.get(name);
	if (text === null || text === '') return null;
	return /^\d{1,9}$/.test(text) ? Number(text) : 'bad';
}

/** The pair to compare among the scenario's `revisions` (any order); null while there is only one revision. */
export function chooseRevisions(params: URLSearchParams, revisions: readonly number[], current: number): RevisionChoice | null {
	const known = new Set(revisions);
	if (known.size < 2) return null;
	const missing: string[] = [];
	const pick = (name: string, fallback: () => number) => {
		const value = asked(params, name);
		if (value === null) return fallback();
		if (value === 'bad' || !known.has(value)) {
			missing.push(`${name === 'from' ? 'older' : 'newer'} revision ${params.get(name)}`);
			return fallback();
		}
		return value;
	};
	const to = pick('to', () => (known.has(current) ? current : Math.max(...known)));
	const earlier = [...known].filter((r) => r < to);
	const from = pick('from', () => (earlier.length > 0 ? Math.max(...earlier) : Math.min(...[...known].filter((r) => r !== to))));
	const notice = missing.length === 0 ? null : `This scenario has no ${missing.join(' and no ')}: showing revisions ${from} and ${to} instead.`;
	return { from, to, notice };
}
