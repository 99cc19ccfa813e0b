/**
 * Brings PostgreSQL in line with Stripe. Every handler reads the
 * subscription's current state from the API rather than trusting the event's
 * snapshot, so events that arrive late or out of order end in the right state.
 */
import type Stripe from 'stripe';
import { stripe } from './stripe-client';
import {
	applySubscriptionState,
	getBillingAccount,
	getBillingAccountOfCustomer,
	getPlanPrice,
	getWorkspaceStanding,
	linkCustomer,
	upsertInvoice,
	type BillingAccount
} from '../db/billing';
import type { PlanStatus } from '../../billing/plans';
import { recordAuditEvent } from '../db/audit';
import { standingChange } from './standing-change';

/** Stripe's subscription status -> the workspace's standing; null: not yet a paid plan (checkout not finished). */
export function planStatusOf(status: Stripe.Subscription.Status): PlanStatus | null {
	switch (status) {
		case 'active':
		case 'trialing':
			return 'active';
		case 'past_due':
			return 'past_due';
		case 'canceled':
		case 'unpaid':
		case 'incomplete_expired':
		case 'paused':
			return 'lapsed';
		default:
			return null;
	}
}

function idOf(value: string | { id: string } | null | undefined): string | null {
	if (!value) return null;
	return typeof value === 'string' ? value : value.id;
}

const date = (seconds: number | null | undefined) => (seconds ? new Date(seconds * 1000) : null);

/** The workspace a Stripe customer belongs to: by the account linked here, else by the metadata Tidewright put on it. */
async function accountFor(customerId: string, workspaceHint: string | null): Promise<BillingAccount | undefined> {
	const account = await getBillingAccountOfCustomer(customerId);
	if (account) return account;
	if (!workspaceHint) return undefined;
	const existing = await getBillingAccount(workspaceHint);
	if (existing && existing.customerId !== customerId) return undefined; // never move a workspace to another customer
	return linkCustomer(workspaceHint, customerId);
}

/** Reads the subscription from Stripe and writes it here. False when it belongs to no workspace of ours. */
export async function syncSubscription(subscriptionId: string): Promise<boolean> {
	const subscription = await stripe().subscriptions.retrieve(subscriptionId, { expand: ['items.data.price'] });
	const customerId = idOf(subscription.customer)!;
	const account = await accountFor(customerId, subscription.metadata?.workspace_id ?? null);
	if (!account) return false;

	const planStatus = planStatusOf(subscription.status);
	if (planStatus === null) return true; // checkout still open or first payment pending: nothing to change yet
	// An older subscription ending does not touch a newer one that is live.
	if (account.subscriptionId && account.subscriptionId !== subscription.id && planStatus === 'lapsed') {
		const current = account.subscriptionStatus ? planStatusOf(account.subscriptionStatus as Stripe.Subscription.Status) : null;
		if (current !== 'lapsed') return true;
	}

	const item = subscription.items.data[0];
	const lookupKey = item?.price.lookup_key ?? null;
	const price = lookupKey ? await getPlanPrice(lookupKey) : undefined;
	if (!item || !price) throw new Error(`Subscription ${subscription.id} is for a price Tidewright does not offer (${lookupKey ?? 'no lookup key'})`);

	const standing = await getWorkspaceStanding(account.workspaceId);
	await applySubscriptionState(account.workspaceId, {
		subscriptionId: subscription.id,
		priceLookupKey: lookupKey,
		subscriptionStatus: subscription.status,
		seats: item.quantity ?? 1,
		currentPeriodStart: date(item.current_period_start),
		currentPeriodEnd: date(item.current_period_end),
		cancelAtPeriodEnd: subscription.cancel_at_period_end,
		plan: price.plan,
		planStatus
	});
	const change = standingChange(
		{ plan: standing.plan, planStatus: standing.planStatus, seats: account.seats, cancelAtPeriodEnd: account.cancelAtPeriodEnd },
		{ plan: price.plan, planStatus, seats: item.quantity ?? 1, cancelAtPeriodEnd: subscription.cancel_at_period_end }
	);
	if (change) await recordAuditEvent({ event: 'billing-synced', workspaceId: account.workspaceId, detail: { ...change, subscriptionId: subscription.id } });
	return true;
}

export function subscriptionOfInvoice(invoice: Stripe.Invoice): string | null {
	return idOf(invoice.parent?.subscription_details?.subscription);
}

/** Stores the invoice for the billing page, then brings its subscription up to date. */
export async function syncInvoice(invoice: Stripe.Invoice): Promise<boolean> {
	const customerId = idOf(invoice.customer);
	if (!customerId || !invoice.id) return false;
	const account = await accountFor(customerId, null);
	if (!account) return false;
	const line = invoice.lines?.data?.[0];
	await upsertInvoice({
		id: invoice.id,
		workspaceId: account.workspaceId,
		number: invoice.number ?? null,
		status: invoice.status ?? 'open',
		amountDue: invoice.amount_due,
		amountPaid: invoice.amount_paid,
		currency: invoice.currency,
		periodStart: date(line?.period?.start ?? invoice.period_start),
		periodEnd: date(line?.period?.end ?? invoice.period_end),
		issuedAt: date(invoice.created) ?? new Date(),
		hostedUrl: invoice.hosted_invoice_url ?? null
	});
	const subscriptionId = subscriptionOfInvoice(invoice);
	if (subscriptionId) await syncSubscription(subscriptionId);
	return true;
}

/** A finished checkout links its customer to the workspace it was opened for, then reads the new subscription. */
export async function syncCheckout(session: Stripe.Checkout.Session): Promise<boolean> {
	const customerId = idOf(session.customer);
	if (!customerId) return false;
	const account = await accountFor(customerId, session.client_reference_id ?? session.metadata?.workspace_id ?? null);
	if (!account) return false;
	const subscriptionId = idOf(session.subscription);
	if (subscriptionId) await syncSubscription(subscriptionId);
	return true;
}
