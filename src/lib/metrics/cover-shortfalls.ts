/**
 * The words shown beside the minimum DSCR for the years it leaves out or that
 * fall short (the engine's result.coverShortfalls): "CFADS negative in
 * operating years 3 and 4; DSCR below 1 in operating year 6". Results stored
 * before the field existed have none: read as no shortfalls.
 * Safe to import in the browser.
 */

/** The engine's coverShortfalls, either list possibly missing from an older stored result. */
export interface CoverShortfallYears {
	negativeCfadsYears?: readonly number[];
	dscrBelowOneYears?: readonly number[];
}

/** Whole years in order, each once; runs of three or more as "3 to 7". */
function yearItems(years: readonly number[]): string[] {
	const sorted = [...new Set(years)].sort((a, b) => a - b);
	const items: string[] = [];
	let start = 0;
	for (let i = 1; i <= sorted.length; i++) {
		if (i < sorted.length && sorted[i] === sorted[i - 1] + 1) continue;
		const run = sorted.slice(start, i);
		if (run.length >= 3) items.push(`${run[0]} to ${run[run.length - 1]}`);
		else items.push(...run.map(String));
		start = i;
	}
	return items;
}

/** "operating year 3", "operating years 3 and 4", "operating years 2, 5 to 8 and 11". */
export function operatingYearsList(years: readonly number[]): string {
	const items = yearItems(years);
	const single = items.length === 1 && !items[0].includes(' ');
	const list = items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
	return `${single ? 'operating year' : 'operating years'} ${list}`;
}

/** The shortfalls in one line, or null when there are none (or the result predates them). */
export function coverShortfallsText(shortfalls: CoverShortfallYears | null | undefined): string | null {
	const negative = shortfalls?.negativeCfadsYears ?? [];
	const belowOne = shortfalls?.dscrBelowOneYears ?? [];
	const parts: string[] = [];
	if (negative.length > 0) parts.push(`CFADS negative in ${operatingYearsList(negative)}`);
	if (belowOne.length > 0) parts.push(`DSCR below 1 in ${operatingYearsList(belowOne)}`);
	return parts.length === 0 ? null : parts.join('; ');
}
