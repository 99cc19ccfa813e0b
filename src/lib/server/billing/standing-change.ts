/**
 * What a sync from Stripe changed in a workspace's standing (its plan, the
 * plan's status, the seats paid for, a cancellation at the period's end), as
 * the audit log's detail; null when nothing it shows changed, so a delivery
 * repeated or out of order adds no line.
 */

export interface BillingStanding {
	plan: string;
	planStatus: string;
	seats: number | null;
	cancelAtPeriodEnd: boolean;
}

export function standingChange(before: BillingStanding, after: BillingStanding): Record<string, string | number | boolean | null> | null {
	const detail: Record<string, string | number | boolean | null> = {};
	if (before.plan !== after.plan) Object.assign(detail, { planFrom: before.plan, planTo: after.plan });
	if (before.planStatus !== after.planStatus) Object.assign(detail, { statusFrom: before.planStatus, statusTo: after.planStatus });
	if (before.seats !== after.seats) Object.assign(detail, { seatsFrom: before.seats, seatsTo: after.seats });
	if (before.cancelAtPeriodEnd !== after.cancelAtPeriodEnd) detail.cancelAtPeriodEnd = after.cancelAtPeriodEnd;
	return Object.keys(detail).length === 0 ? null : { source: 'stripe', ...detail };
}
