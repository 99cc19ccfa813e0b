/**
 * What an owner does on the billing page, through the Stripe SDK: upgrade
 * through Checkout, change the seat count (priced first), open the portal,
 * cancel at period end and resume. After each change the subscription is read
 * back at once, so the page shows it without waiting for the webhook.
 */
import type Stripe from 'stripe';
import { stripe } from './stripe-client';
import { billingSettings } from '../settings';
import { getBillingAccount, getPlanPrice, linkCustomer, listPlanPrices, type BillingAccount, type PlanPrice } from '../db/billing';
import { holderNames, seatHolders, seatsUsed } from './gates';
import { syncSubscription } from './sync';
import { PLANS, type PaidPlanKey } from '../../billing/plans';

export class BillingProblem extends Error {
	constructor(
		message: string,
		readonly field: string | null = null
	) {
		super(message);
		this.name = 'BillingProblem';
	}
}

const priceIds = new Map<string, string>();

/**
 * The Stripe price for an offered price, found by lookup key. In test mode a
 * missing one is created from the seeded catalogue (the local stand-in starts
 * empty); in live mode it must exist in Stripe already.
 */
export async function stripePriceId(price: PlanPrice): Promise<string> {
	const known = priceIds.get(price.lookupKey);
	if (known) return known;
	const found = await stripe().prices.list({ lookup_keys: [price.lookupKey], active: true, limit: 1 });
	let id = found.data[0]?.id;
	if (!id) {
		if (!billingSettings().testMode) throw new Error(`Stripe has no active price with lookup key ${price.lookupKey}: create it in the dashboard first.`);
		const product = await stripe().products.create({ name: `Tidewright ${PLANS[price.plan].name}`, metadata: { plan: price.plan } });
		const created = await stripe().prices.create({
			product: product.id,
			unit_amount: price.unitAmount,
			currency: price.currency,
			recurring: { interval: price.interval },
			lookup_key: price.lookupKey,
			nickname: `${PLANS[price.plan].name}, per seat per ${price.interval}`,
			metadata: { plan: price.plan }
		});
		id = created.id;
	}
	priceIds.set(price.lookupKey, id);
	return id;
}

/** The price offered for a plan (one per plan in the seeded catalogue). */
export async function offeredPrice(plan: PaidPlanKey): Promise<PlanPrice> {
	const price = (await listPlanPrices()).find((p) => p.plan === plan);
	if (!price) throw new BillingProblem(`The ${PLANS[plan].name} plan is not on offer on this server.`, 'plan');
	return price;
}

async function customerFor(workspace: { id: string; name: string }, owner: { email: string; name: string }): Promise<BillingAccount> {
	const existing = await getBillingAccount(workspace.id);
	if (existing) return existing;
	const customer = await stripe().customers.create(
		{ email: owner.email, name: workspace.name, metadata: { workspace_id: workspace.id } },
		{ idempotencyKey: `customer-of-workspace-${workspace.id}` }
	);
	return linkCustomer(workspace.id, customer.id);
}

export function checkSeatCount(plan: PaidPlanKey, seats: number, used: number, names: string): void {
	const definition = PLANS[plan];
	if (!Number.isInteger(seats) || seats < definition.minSeats || seats > definition.maxSeats) {
		throw new BillingProblem(`The ${definition.name} plan takes ${definition.minSeats} to ${definition.maxSeats} seats.`, 'seats');
	}
	if (seats < used) {
		throw new BillingProblem(
			`${used} seat${used === 1 ? ' is' : 's are'} in use, by ${names}: change someone to viewer, remove them or withdraw the invitation before going down to ${seats}.`,
			'seats'
		);
	}
}

/** A Checkout Session for the plan and seats; the owner is sent to its page. */
export async function startCheckout(input: {
	workspace: { id: string; name: string };
	owner: { email: string; name: string };
	plan: PaidPlanKey;
	seats: number;
	origin: string;
}): Promise<string> {
	const holders = await seatHolders(input.workspace.id);
	checkSeatCount(input.plan, input.seats, seatsUsed(holders), holderNames(holders));
	const account = await customerFor(input.workspace, input.owner);
	if (account.subscriptionId && account.subscriptionStatus && !['canceled', 'incomplete_expired'].includes(account.subscriptionStatus)) {
		throw new BillingProblem('This workspace already has a subscription: change its seats here, or its plan in the billing portal.', 'plan');
	}
	const price = await offeredPrice(input.plan);
	const billingUrl = `${input.origin}/app/w/${input.workspace.id}/billing`;
	const session = await stripe().checkout.sessions.create({
		mode: 'subscription',
		customer: account.customerId,
		client_reference_id: input.workspace.id,
		line_items: [{ price: await stripePriceId(price), quantity: input.seats }],
		success_url: `${billingUrl}?checkout={CHECKOUT_SESSION_ID}`,
		cancel_url: `${billingUrl}?checkout=cancelled`,
		metadata: { workspace_id: input.workspace.id },
		subscription_data: { metadata: { workspace_id: input.workspace.id } }
	});
	if (!session.url) throw new Error('Stripe answered a Checkout Session without a page address');
	return session.url;
}

async function liveSubscription(workspaceId: string): Promise<{ account: BillingAccount; subscription: Stripe.Subscription }> {
	const account = await getBillingAccount(workspaceId);
	if (!account?.subscriptionId) throw new BillingProblem('This workspace has no subscription yet: choose a plan first.');
	const subscription = await stripe().subscriptions.retrieve(account.subscriptionId);
	if (['canceled', 'incomplete_expired'].includes(subscription.status)) {
		throw new BillingProblem('This subscription has ended: choose a plan to start a new one.');
	}
	return { account, subscription };
}

export interface SeatChangePreview {
	seats: number;
	currentSeats: number;
	/** Charged (or credited, when negative) now for the rest of this period, in minor units. */
	dueNow: number;
	/** Each period from the next renewal on, in minor units. */
	perPeriod: number;
	currency: string;
	nextRenewal: Date | null;
}

/** The live subscription, its price and its one item, once the new seat count is known to fit the plan and the seats in use. */
async function seatChange(workspaceId: string, seats: number) {
	const { account, subscription } = await liveSubscription(workspaceId);
	const price = account.priceLookupKey ? await getPlanPrice(account.priceLookupKey) : undefined;
	if (!price) throw new Error(`No offered price for ${account.priceLookupKey}`);
	const holders = await seatHolders(workspaceId);
	checkSeatCount(price.plan, seats, seatsUsed(holders), holderNames(holders));
	return { account, subscription, price, item: subscription.items.data[0] };
}

/** What a new seat count costs, before the owner confirms it. */
export async function previewSeatChange(workspaceId: string, seats: number): Promise<SeatChangePreview> {
	const { account, subscription, price, item } = await seatChange(workspaceId, seats);
	const preview = await stripe().invoices.createPreview({
		customer: account.customerId,
		subscription: subscription.id,
		subscription_details: { items: [{ id: item.id, quantity: seats }], proration_behavior: 'always_invoice' }
	});
	return {
		seats,
		currentSeats: item.quantity ?? 0,
		// total, not amount_due: a credit for fewer seats is negative here, while amount_due never goes below 0.
		dueNow: preview.total,
		perPeriod: price.unitAmount * seats,
		currency: price.currency,
		nextRenewal: item.current_period_end ? new Date(item.current_period_end * 1000) : null
	};
}

/** Changes the seat count; the difference for the rest of the period is invoiced at once. */
export async function changeSeats(workspaceId: string, seats: number): Promise<void> {
	const { subscription, item } = await seatChange(workspaceId, seats);
	await stripe().subscriptions.update(subscription.id, {
		items: [{ id: item.id, quantity: seats }],
		proration_behavior: 'always_invoice'
	});
	await syncSubscription(subscription.id);
}

export async function setCancelAtPeriodEnd(workspaceId: string, cancel: boolean): Promise<void> {
	const { subscription } = await liveSubscription(workspaceId);
	await stripe().subscriptions.update(subscription.id, { cancel_at_period_end: cancel });
	await syncSubscription(subscription.id);
}

export async function portalUrl(workspaceId: string, returnUrl: string): Promise<string> {
	const account = await getBillingAccount(workspaceId);
	if (!account) throw new BillingProblem('This workspace has no billing account yet: choose a plan first.');
	const session = await stripe().billingPortal.sessions.create({ customer: account.customerId, return_url: returnUrl });
	return session.url;
}

/** After Checkout sends the owner back: read the session and its subscription now rather than wait for the webhook. */
export async function completeCheckout(workspaceId: string, sessionId: string): Promise<boolean> {
	const session = await stripe().checkout.sessions.retrieve(sessionId);
	if ((session.client_reference_id ?? session.metadata?.workspace_id) !== workspaceId) return false;
	const subscriptionId = typeof session.subscription === 'string' ? session.subscription : session.subscription?.id;
	if (session.status !== 'complete' || !subscriptionId) return false;
	await syncSubscription(subscriptionId);
	return true;
}
