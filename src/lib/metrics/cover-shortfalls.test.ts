import { describe, expect, it } from 'vitest';
import { coverShortfallsText, operatingYearsList } from './cover-shortfalls';

describe('operatingYearsList', () => {
	it('names one year, two years, and longer runs as a range', () => {
		expect(operatingYearsList([3])).toBe('operating year 3');
		expect(operatingYearsList([3, 4])).toBe('operating years 3 and 4');
		expect(operatingYearsList([2, 3, 5])).toBe('operating years 2, 3 and 5');
		expect(operatingYearsList([2, 5, 9])).toBe('operating years 2, 5 and 9');
		expect(operatingYearsList([2, 5, 6, 7, 8, 11])).toBe('operating years 2, 5 to 8 and 11');
		expect(operatingYearsList([1, 2, 3])).toBe('operating years 1 to 3');
	});

	it('puts the years in order and names each once', () => {
		expect(operatingYearsList([9, 4, 4, 6])).toBe('operating years 4, 6 and 9');
	});
});

describe('coverShortfallsText', () => {
	it('joins negative CFADS and DSCR below 1 in one line', () => {
		expect(coverShortfallsText({ negativeCfadsYears: [3, 4], dscrBelowOneYears: [6] })).toBe(
			'CFADS negative in operating years 3 and 4; DSCR below 1 in operating year 6'
		);
		expect(coverShortfallsText({ negativeCfadsYears: [], dscrBelowOneYears: [12, 13] })).toBe('DSCR below 1 in operating years 12 and 13');
		expect(coverShortfallsText({ negativeCfadsYears: [1], dscrBelowOneYears: [] })).toBe('CFADS negative in operating year 1');
	});

	it('says nothing when there are no shortfalls, or the stored result predates them', () => {
		expect(coverShortfallsText({ negativeCfadsYears: [], dscrBelowOneYears: [] })).toBeNull();
		expect(coverShortfallsText(undefined)).toBeNull();
		expect(coverShortfallsText(null)).toBeNull();
		expect(coverShortfallsText({ dscrBelowOneYears: [2] })).toBe('DSCR below 1 in operating year 2');
	});
});
