import { afterEach, describe, expect, it, vi } from 'vitest';
import { StandinClock, addBillingIntervals } from './clock';

const utc = (iso: string) => Date.parse(iso) / 1000;

describe('addBillingIntervals', () => {
	it('keeps the anchor day, clamped to short months, counted from the anchor', () => {
		const anchor = utc('2027-01-31T09:15:00Z');
		expect(addBillingIntervals(anchor, 'month', 1)).toBe(utc('2027-02-28T09:15:00Z'));
		expect(addBillingIntervals(anchor, 'month', 2)).toBe(utc('2027-03-31T09:15:00Z'));
		expect(addBillingIntervals(anchor, 'month', 13)).toBe(utc('2028-02-29T09:15:00Z')); // 2028 is a leap year
	});

	it('moves a year as twelve months, 29 February to 28 February', () => {
		expect(addBillingIntervals(utc('2028-02-29T00:00:00Z'), 'year', 1)).toBe(utc('2029-02-28T00:00:00Z'));
		expect(addBillingIntervals(utc('2026-11-05T12:00:00Z'), 'year', 1)).toBe(utc('2027-11-05T12:00:00Z'));
	});

	it('moves days and weeks by whole days', () => {
		const anchor = utc('2026-12-30T00:00:00Z');
		expect(addBillingIntervals(anchor, 'day', 3)).toBe(utc('2027-01-02T00:00:00Z'));
		expect(addBillingIntervals(anchor, 'week', 2)).toBe(utc('2027-01-13T00:00:00Z'));
	});
});

describe('StandinClock', () => {
	it('starts at real time, moves forward, refuses to go back, and resets to real time', () => {
		const clock = new StandinClock();
		const real = Math.floor(Date.now() / 1000);
		expect(Math.abs(clock.now() - real)).toBeLessThanOrEqual(1);
		clock.advanceTo(clock.now() + 86_400);
		expect(clock.now() - real).toBeGreaterThanOrEqual(86_400);
		expect(() => clock.advanceTo(real)).toThrow(/cannot go back/);
		clock.reset();
		expect(Math.abs(clock.now() - Math.floor(Date.now() / 1000))).toBeLessThanOrEqual(1);
	});

	describe('holdAt', () => {
		afterEach(() => vi.useRealTimers());

		it('stands still while a step runs, though real time crosses seconds, then runs on with real time', () => {
			vi.useFakeTimers({ now: Date.parse('2027-03-01T10:00:00.900Z') });
			const clock = new StandinClock();
			const start = clock.now();
			const seen = clock.holdAt(start, () => {
				vi.setSystemTime(Date.parse('2027-03-01T10:00:02.100Z'));
				return [clock.now(), clock.now()];
			});
			expect(seen).toEqual([start, start]);
			expect(clock.now()).toBe(start + 2);
		});

		it('lets go of the held time when the step throws', () => {
			const clock = new StandinClock();
			const held = clock.now() + 3_600;
			expect(() =>
				clock.holdAt(held, () => {
					throw new Error('step failed');
				})
			).toThrow('step failed');
			expect(clock.now()).toBeLessThan(held);
		});
	});
});
