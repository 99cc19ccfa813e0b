import { describe, expect, it } from 'vitest';
import { exactTimestampPattern, keysetPage } from './keyset';

describe('keysetPage', () => {
	const key = (n: number) => `k${n}`;

	it('hands out the first `limit` rows and the last one’s key when one more row came', () => {
		expect(keysetPage([1, 2, 3, 4], 3, key)).toEqual({ items: [1, 2, 3], nextKey: 'k3' });
	});

	it('says there is no next page when no more than `limit` rows came', () => {
		expect(keysetPage([1, 2, 3], 3, key)).toEqual({ items: [1, 2, 3], nextKey: null });
		expect(keysetPage([], 3, key)).toEqual({ items: [], nextKey: null });
	});
});

describe('exactTimestampPattern', () => {
	it('takes microseconds in UTC only', () => {
		expect(exactTimestampPattern.test('2026-05-01T10:00:00.000001Z')).toBe(true);
		expect(exactTimestampPattern.test('2026-05-01T10:00:00.000Z')).toBe(false);
		expect(exactTimestampPattern.test('2026-05-01 10:00:00.000001+00')).toBe(false);
	});
});
