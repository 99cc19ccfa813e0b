import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime, formatDateTimeSeconds } from './format';

describe('dates', () => {
	// One English form on the server and in every browser, so a page never reads 12/9/2026 (month or day first?).
	it('reads the day by name, never as a number that could be the month', () => {
		const when = '2026-12-09T14:05:33Z';
		expect(formatDate(when)).toBe('9 Dec 2026');
		expect(formatDateTime(when)).toMatch(/^9 Dec 2026, \d\d:05$/);
		expect(formatDateTimeSeconds(when)).toMatch(/^9 Dec 2026, \d\d:05:33$/);
	});
});
