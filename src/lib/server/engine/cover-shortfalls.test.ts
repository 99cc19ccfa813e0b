import { describe, expect, it } from 'vitest';
import { dec } from './decimal';
import { coverShortfalls, coverShortfallWarnings } from './cover-shortfalls';
import { coverRatios } from './metrics';

describe('coverShortfalls', () => {
	// A sculpted-style case: no debt service where CFADS is not positive, so the minimum DSCR (1.35) hides years 3 and 4.
	const cfads = [135, 135, -20, -5, 135, 90, 135].map(dec);
	const debtService = [100, 100, 0, 0, 100, 100, 0].map(dec);
	const cover = coverRatios(cfads, debtService);

	it('finds the negative-CFADS years the minimum DSCR leaves out, and the years below 1', () => {
		expect(cover.min!.toNumber()).toBeCloseTo(0.9, 12);
		const found = coverShortfalls(cfads, debtService, cover.perYear);
		expect(found).toEqual({ negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] });
	});

	it('says so with every year named', () => {
		const warnings = coverShortfallWarnings(coverShortfalls(cfads, debtService, cover.perYear), cover.perYear);
		expect(warnings).toEqual([
			'CFADS is negative in operating years 3 and 4 of the loan: the minimum DSCR leaves such years out, and equity or a reserve must meet any debt service then.',
			'CFADS does not cover debt service in operating year 6 (DSCR 6: 0.90).'
		]);
	});

	it('ignores negative CFADS after the last debt service', () => {
		expect(coverShortfalls([dec(10), dec(-3)], [dec(5), dec(0)], [dec(2), null]).negativeCfadsYears).toEqual([]);
	});
});
