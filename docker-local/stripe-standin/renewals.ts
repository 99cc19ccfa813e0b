/**
 * Moving the stand-in clock forward: everything that falls due on the way
 * happens in time order, at its own moment (the clock stops at each due time,
 * so invoices and events carry the right dates), and its events are delivered
 * before the clock moves on.
 */
import type { Emit } from './events';
import { expireSessions } from './checkout';
import { onlyItem } from './invoices';
import type { StandinState, SubscriptionRecord } from './state';
import { renewSubscription } from './subscriptions';

/** Runs one step's changes and delivers the events they emitted. */
export type RunStep = (change: (emit: Emit) => void) => Promise<void>;

/** A guard against a period that never moves on; thousands of renewals in one advance is a mistake. */
const MAX_STEPS = 10_000;

function renewsAt(record: SubscriptionRecord): number | null {
	const status = record.subscription.status;
	if (status !== 'active' && status !== 'past_due') return null;
	return onlyItem(record.subscription).current_period_end;
}

function nextDueTime(state: StandinState, target: number): number | null {
	let next: number | null = null;
	const consider = (time: number | null) => {
		if (time !== null && time <= target && (next === null || time < next)) next = time;
	};
	for (const record of state.subscriptions.values()) consider(renewsAt(record));
	for (const { session } of state.checkoutSessions.values()) {
		if (session.status === 'open') consider(session.expires_at);
	}
	return next;
}

export async function advanceClock(state: StandinState, target: number, runStep: RunStep): Promise<void> {
	if (target < state.clock.now()) state.clock.advanceTo(target); // refuses, with the clock's own message
	for (let steps = 0; ; steps++) {
		if (steps >= MAX_STEPS) throw new Error(`more than ${MAX_STEPS} renewals in one clock advance`);
		const due = nextDueTime(state, target);
		if (due === null) break;
		// The step happens at its due time (or now, if that has passed), held there while it runs.
		const now = Math.max(due, state.clock.now());
		if (due > state.clock.now()) state.clock.advanceTo(due);
		await runStep((emit) =>
			state.clock.holdAt(now, () => {
				const dueRecords = [...state.subscriptions.values()]
					.filter((record) => {
						const at = renewsAt(record);
						return at !== null && at <= now;
					})
					.sort((a, b) => onlyItem(a.subscription).current_period_end - onlyItem(b.subscription).current_period_end);
				for (const record of dueRecords) renewSubscription(state, emit, record);
				expireSessions(state, emit, now);
			})
		);
	}
	if (target > state.clock.now()) state.clock.advanceTo(target);
}
