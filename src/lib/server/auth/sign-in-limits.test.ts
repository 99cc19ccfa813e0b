import { describe, expect, it } from 'vitest';
import { FREE_FAILURES, accountDelaySeconds } from './sign-in-limits';

describe('accountDelaySeconds', () => {
	it('waits nothing within the free failures, then doubles from 2 seconds to at most 5 minutes', () => {
		expect(FREE_FAILURES).toBe(5);
		expect([0, 1, 4].map(accountDelaySeconds)).toEqual([0, 0, 0]);
		expect([5, 6, 7, 8, 12].map(accountDelaySeconds)).toEqual([2, 4, 8, 16, 256]);
		expect(accountDelaySeconds(13)).toBe(300);
		expect(accountDelaySeconds(1000)).toBe(300);
	});
});
