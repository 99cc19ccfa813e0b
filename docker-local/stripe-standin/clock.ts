/**
 * The stand-in's one clock, in Unix seconds. It starts at real time and runs
 * with it; tests move it forward to make renewals fall due. It never goes back
 * except on reset.
 */
import { StandinError } from './errors';
import type { BillingInterval } from './objects';

export class StandinClock {
	/** Seconds added to real time by every advance since the last reset. */
	private offsetSeconds = 0;
	/** Set while a step runs at one instant (see holdAt). */
	private heldAt: number | null = null;

	now(): number {
		return this.heldAt ?? Math.floor(Date.now() / 1000) + this.offsetSeconds;
	}

	/**
	 * Runs `change` with the clock standing at `time`: everything one step
	 * makes carries the same instant, even when real time crosses a second
	 * meanwhile. Real time runs on afterwards.
	 */
	holdAt<T>(time: number, change: () => T): T {
		this.heldAt = time;
		try {
			return change();
		} finally {
			this.heldAt = null;
		}
	}

	/** Moves the clock to `target` (Unix seconds); refuses to go back. */
	advanceTo(target: number): void {
		const now = this.now();
		if (!Number.isSafeInteger(target)) throw new StandinError(400, 'The clock target must be whole Unix seconds', 'to');
		if (target < now) throw new StandinError(400, `The stand-in clock cannot go back (now ${now}, asked ${target})`, 'to');
		this.offsetSeconds += target - now;
	}

	reset(): void {
		this.offsetSeconds = 0;
	}
}

function daysInUtcMonth(year: number, monthIndex: number): number {
	return new Date(Date.UTC(year, monthIndex + 1, 0)).getUTCDate();
}

/**
 * The anchor moved on by `count` billing intervals, as Stripe bills: months keep
 * the anchor's day of month, clamped to the month's last day (anchor 31 Jan ->
 * 28/29 Feb -> 31 Mar), always counted from the anchor so a short month does not
 * drag later periods earlier. Time of day is kept. UTC throughout.
 */
export function addBillingIntervals(anchor: number, interval: BillingInterval, count: number): number {
	if (interval === 'day') return anchor + count * 86_400;
	if (interval === 'week') return anchor + count * 7 * 86_400;
	const date = new Date(anchor * 1000);
	const months = interval === 'year' ? count * 12 : count;
	const totalMonths = date.getUTCFullYear() * 12 + date.getUTCMonth() + months;
	const year = Math.floor(totalMonths / 12);
	const monthIndex = totalMonths - year * 12;
	const day = Math.min(date.getUTCDate(), daysInUtcMonth(year, monthIndex));
	const moved = Date.UTC(year, monthIndex, day, date.getUTCHours(), date.getUTCMinutes(), date.getUTCSeconds());
	return Math.floor(moved / 1000);
}
