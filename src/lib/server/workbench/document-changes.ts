/**
 * Which top-level sections of a scenario document differ between two
 * revisions, for the revision history ("capex, opex changed").
 */

/** JSON text with object keys sorted, so key order never counts as a change. */
export function canonicalJson(value: unknown): string {
	return JSON.stringify(sortKeys(value));
}

function sortKeys(value: unknown): unknown {
	if (Array.isArray(value)) return value.map(sortKeys);
	if (value && typeof value === 'object') {
		const out: Record<string, unknown> = {};
		for (const key of Object.keys(value).sort()) {
			const v = (value as Record<string, unknown>)[key];
			if (v !== undefined) out[key] = sortKeys(v);
		}
		return out;
	}
	return value;
}

/** Top-level keys whose values differ (added, removed or changed), in alphabetical order. */
export function changedSections(before: Record<string, unknown> | null, after: Record<string, unknown>): string[] {
	if (before === null) return Object.keys(after).sort();
	const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
	return [...keys].filter((key) => canonicalJson(before[key]) !== canonicalJson(after[key])).sort();
}

/** "Edited capex and opex", "Edited capex, opex and revenue". */
export function describeEdit(sections: readonly string[]): string {
	if (sections.length === 0) return 'No changes';
	if (sections.length === 1) return `Edited ${sections[0]}`;
	return `Edited ${sections.slice(0, -1).join(', ')} and ${sections[sections.length - 1]}`;
}
