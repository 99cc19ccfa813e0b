/**
 * Years a lender would ask about beside the minimum DSCR: operating years of
 * the loan whose CFADS is negative (a DSCR is then not defined, or there is
 * no debt service at all, so the minimum DSCR leaves them out), and years
 * whose DSCR is below 1 (debt service not covered). Listed with their years,
 * so every place that shows the minimum DSCR can say so.
 */
import type { Decimal } from './decimal';
import { operatingYearsList } from '../../metrics/cover-shortfalls';

export type CoverShortfalls = {
	/** Operating years (1-based) up to the last debt-service year with CFADS below zero. */
	negativeCfadsYears: number[];
	/** Operating years (1-based) with a DSCR below 1. */
	dscrBelowOneYears: number[];
};

export function coverShortfalls(cfads: readonly Decimal[], debtService: readonly Decimal[], dscr: readonly (Decimal | null)[]): CoverShortfalls {
	let lastServiceYear = 0;
	debtService.forEach((ds, k) => {
		if (ds.gt(0)) lastServiceYear = k + 1;
	});
	const negativeCfadsYears: number[] = [];
	for (let k = 0; k < lastServiceYear; k++) if (cfads[k].lt(0)) negativeCfadsYears.push(k + 1);
	const dscrBelowOneYears = dscr.flatMap((d, k) => (d !== null && d.lt(1) ? [k + 1] : []));
	return { negativeCfadsYears, dscrBelowOneYears };
}

/** The sentences the result's warnings carry for the shortfalls (none when there are none). */
export function coverShortfallWarnings(shortfalls: CoverShortfalls, dscr: readonly (Decimal | null)[]): string[] {
	const warnings: string[] = [];
	if (shortfalls.negativeCfadsYears.length > 0) {
		warnings.push(`CFADS is negative in ${operatingYearsList(shortfalls.negativeCfadsYears)} of the loan: the minimum DSCR leaves such years out, and equity or a reserve must meet any debt service then.`);
	}
	if (shortfalls.dscrBelowOneYears.length > 0) {
		const each = shortfalls.dscrBelowOneYears.map((year) => `${year}: ${dscr[year - 1]!.toFixed(2)}`).join(', ');
		warnings.push(`CFADS does not cover debt service in ${operatingYearsList(shortfalls.dscrBelowOneYears)} (DSCR ${each}).`);
	}
	return warnings;
}
