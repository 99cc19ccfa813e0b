import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startHarness, subscribeThroughCheckout, type Harness } from './test-harness';

let harness: Harness;

beforeAll(async () => {
	harness = await startHarness();
});
afterAll(async () => harness.stop());
beforeEach(async () => {
	await harness.control('/_standin/reset', {});
	harness.receiver.clear();
});

/** Subscribes 3 seats at GBP 49.00 a month and forgets the checkout's events. */
async function subscribed() {
	const result = await subscribeThroughCheckout(harness, 3);
	harness.receiver.clear();
	return result;
}

async function useCard(customer: string, card: 'working' | 'declining') {
	const portal = await harness.stripe.billingPortal.sessions.create({ customer, return_url: 'http://127.0.0.1:3000/billing' });
	const response = await harness.submitForm(`/portal/${portal.id}/card`, { card });
	expect(response.status).toBe(303);
}

/** A moment two thirds into the current period, so one third is left. */
function twoThirdsIn(item: Stripe.SubscriptionItem): number {
	const length = item.current_period_end - item.current_period_start;
	return item.current_period_end - Math.round(length / 3);
}

describe('subscriptions.update (seats)', () => {
	it('with always_invoice, charges the prorated difference at once and reports both events', async () => {
		const { subscription } = await subscribed();
		const item = subscription.items.data[0];
		const at = twoThirdsIn(item);
		const remaining = item.current_period_end - at;
		const length = item.current_period_end - item.current_period_start;
		// Hand arithmetic: 4900 pence × (5 − 3) seats × remaining / length. Period lengths are whole
		// days (86 400 s, divisible by 3), so remaining / length is exactly 1/3: 9800 / 3 = 3266.67 -> 3267.
		expect(remaining * 3).toBe(length);
		const updated = await harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: item.id, quantity: 5 }],
			proration_behavior: 'always_invoice',
			proration_date: at
		});
		expect(updated.items.data[0].quantity).toBe(5);
		expect(updated.status).toBe('active');
		expect(updated.latest_invoice).not.toBe(subscription.latest_invoice);

		const invoice = await harness.stripe.invoices.retrieve(updated.latest_invoice as string);
		expect(invoice).toMatchObject({ status: 'paid', amount_due: 3267, amount_paid: 3267, billing_reason: 'subscription_update' });
		expect(invoice.lines.data).toHaveLength(1);
		expect(invoice.lines.data[0].parent?.subscription_item_details?.proration).toBe(true);

		expect(harness.receiver.types()).toEqual(['customer.subscription.updated', 'invoice.paid']);
		const change = harness.receiver.received[0].event as Stripe.CustomerSubscriptionUpdatedEvent;
		expect(change.data.object.items.data[0].quantity).toBe(5);
		expect(change.data.previous_attributes?.items?.data[0].quantity).toBe(3);
	});

	it('with always_invoice and fewer seats, credits the customer and spends the credit on the renewal', async () => {
		const { subscription, customer } = await subscribed();
		const item = subscription.items.data[0];
		const at = twoThirdsIn(item);
		// Hand arithmetic: 4900 × (2 − 3) × 1/3 = −1633.33 -> −1633 (a credit); nothing is due now.
		const updated = await harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: item.id, quantity: 2 }],
			proration_behavior: 'always_invoice',
			proration_date: at
		});
		const credit = await harness.stripe.invoices.retrieve(updated.latest_invoice as string);
		expect(credit).toMatchObject({ total: -1633, amount_due: 0, status: 'paid', starting_balance: 0, ending_balance: -1633 });
		expect(await harness.stripe.customers.retrieve(customer.id)).toMatchObject({ balance: -1633 });
		// The renewal: 2 seats × 4900 = 9800, less the 1633 credit = 8167 due.
		const preview = await harness.stripe.invoices.createPreview({ subscription: subscription.id });
		expect(preview).toMatchObject({ total: 9800, amount_due: 8167, starting_balance: -1633 });
	});

	it('with proration_behavior none, changes seats and bills nothing now', async () => {
		const { subscription } = await subscribed();
		const updated = await harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 7 }],
			proration_behavior: 'none'
		});
		expect(updated.items.data[0].quantity).toBe(7);
		expect(updated.latest_invoice).toBe(subscription.latest_invoice);
		expect(harness.receiver.types()).toEqual(['customer.subscription.updated']);
		expect((await harness.stripe.invoices.list({ subscription: subscription.id })).data).toHaveLength(1);
	});

	it('with a declining card, leaves the proration invoice open and the subscription past due', async () => {
		const { subscription, customer } = await subscribed();
		await useCard(customer.id, 'declining');
		harness.receiver.clear();
		const updated = await harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 4 }],
			proration_behavior: 'always_invoice'
		});
		expect(updated.status).toBe('past_due');
		const invoice = await harness.stripe.invoices.retrieve(updated.latest_invoice as string);
		expect(invoice.status).toBe('open');
		expect(invoice.amount_paid).toBe(0);
		expect(invoice.attempt_count).toBe(1);
		expect(harness.receiver.types()).toEqual(['customer.subscription.updated', 'invoice.payment_failed']);
	});

	it('with payment_behavior error_if_incomplete and a declining card, answers 402 card_error and changes nothing', async () => {
		const { subscription, customer } = await subscribed();
		await useCard(customer.id, 'declining');
		harness.receiver.clear();
		const failure = harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 4 }],
			proration_behavior: 'always_invoice',
			payment_behavior: 'error_if_incomplete'
		});
		await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripeCardError);
		await expect(failure).rejects.toMatchObject({ statusCode: 402, code: 'card_declined' });
		const unchanged = await harness.stripe.subscriptions.retrieve(subscription.id);
		expect(unchanged.items.data[0].quantity).toBe(3);
		expect(unchanged.status).toBe('active');
		expect(harness.receiver.received).toHaveLength(0);
	});

	it('refuses an item that is not on the subscription, naming items[0][id]', async () => {
		const { subscription } = await subscribed();
		await expect(
			harness.stripe.subscriptions.update(subscription.id, { items: [{ id: 'si_other', quantity: 2 }] })
		).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'items[0][id]' });
	});
});

describe('subscriptions.update (cancel at period end, resume, metadata)', () => {
	it('sets and clears cancel_at_period_end with previous_attributes on each event', async () => {
		const { subscription } = await subscribed();
		const ending = await harness.stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true });
		expect(ending.cancel_at_period_end).toBe(true);
		expect(ending.cancel_at).toBe(subscription.items.data[0].current_period_end);
		expect(ending.canceled_at).not.toBeNull();
		expect(ending.status).toBe('active');

		const resumed = await harness.stripe.subscriptions.update(subscription.id, { cancel_at_period_end: false });
		expect(resumed.cancel_at_period_end).toBe(false);
		expect(resumed.cancel_at).toBeNull();
		expect(resumed.canceled_at).toBeNull();

		const [first, second] = harness.receiver.received.map((r) => r.event as Stripe.CustomerSubscriptionUpdatedEvent);
		expect(first.type).toBe('customer.subscription.updated');
		expect(first.data.previous_attributes).toMatchObject({ cancel_at_period_end: false, cancel_at: null, canceled_at: null });
		expect(second.data.previous_attributes).toMatchObject({ cancel_at_period_end: true });
		expect(second.request?.id).toMatch(/^req_/);
	});

	it('merges metadata', async () => {
		const { subscription } = await subscribed();
		const updated = await harness.stripe.subscriptions.update(subscription.id, { metadata: { seats_by: '', note: 'pilot' } });
		expect(updated.metadata).toEqual({ workspace_id: 'ws_kelpford', note: 'pilot' });
	});
});

describe('subscriptions.cancel', () => {
	it('ends the subscription now and sends customer.subscription.deleted', async () => {
		const { subscription } = await subscribed();
		const canceled = await harness.stripe.subscriptions.cancel(subscription.id);
		expect(canceled.status).toBe('canceled');
		expect(canceled.ended_at).not.toBeNull();
		expect(canceled.canceled_at).toBe(canceled.ended_at);
		expect(harness.receiver.types()).toEqual(['customer.subscription.deleted']);
		await expect(harness.stripe.subscriptions.cancel(subscription.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
		await expect(
			harness.stripe.subscriptions.update(subscription.id, { items: [{ id: subscription.items.data[0].id, quantity: 9 }] })
		).rejects.toMatchObject({ statusCode: 400 });
	});
});

describe('subscriptions.list', () => {
	it('filters by customer and hides canceled ones unless status is all or canceled', async () => {
		const first = await subscribed();
		const second = await subscribed();
		await harness.stripe.subscriptions.cancel(first.subscription.id);
		expect((await harness.stripe.subscriptions.list()).data.map((s) => s.id)).toEqual([second.subscription.id]);
		expect((await harness.stripe.subscriptions.list({ status: 'all' })).data).toHaveLength(2);
		expect((await harness.stripe.subscriptions.list({ status: 'canceled' })).data.map((s) => s.id)).toEqual([first.subscription.id]);
		const mine = await harness.stripe.subscriptions.list({ customer: first.customer.id, status: 'all' });
		expect(mine.data.map((s) => s.id)).toEqual([first.subscription.id]);
	});

	it('pages with limit and starting_after', async () => {
		await subscribed();
		await subscribed();
		await subscribed();
		const firstPage = await harness.stripe.subscriptions.list({ limit: 2 });
		expect(firstPage.data).toHaveLength(2);
		expect(firstPage.has_more).toBe(true);
		const all = await harness.stripe.subscriptions.list({ limit: 2 }).autoPagingToArray({ limit: 10 });
		expect(new Set(all.map((s) => s.id)).size).toBe(3);
	});
});

describe('invoices.createPreview', () => {
	it('with a seat change and always_invoice, previews the prorated charge due now', async () => {
		const { subscription, customer } = await subscribed();
		const item = subscription.items.data[0];
		const at = twoThirdsIn(item);
		const preview = await harness.stripe.invoices.createPreview({
			customer: customer.id,
			subscription: subscription.id,
			subscription_details: { items: [{ id: item.id, quantity: 5 }], proration_behavior: 'always_invoice', proration_date: at }
		});
		// Same hand arithmetic as the update above: 9800 / 3 -> 3267.
		expect(preview.amount_due).toBe(3267);
		expect(preview.lines.data).toHaveLength(1);
		expect(preview.lines.data[0].amount).toBe(3267);
		// A preview changes nothing.
		expect((await harness.stripe.subscriptions.retrieve(subscription.id)).items.data[0].quantity).toBe(3);
		expect((await harness.stripe.invoices.list({ customer: customer.id })).data).toHaveLength(1);
	});

	it('without changes, previews the next renewal: unit amount × seats, due at period end', async () => {
		const { subscription, customer } = await subscribed();
		const item = subscription.items.data[0];
		const preview = await harness.stripe.invoices.createPreview({ customer: customer.id, subscription: subscription.id });
		expect(preview.amount_due).toBe(4900 * 3);
		expect(preview.period_end).toBe(item.current_period_end);
		expect(preview.next_payment_attempt).toBe(item.current_period_end);
		expect(preview.lines.data[0].period.start).toBe(item.current_period_end);
		expect(preview.lines.data[0].quantity).toBe(3);
	});

	it('with proration_behavior none, previews the renewal at the new seat count', async () => {
		const { subscription } = await subscribed();
		const preview = await harness.stripe.invoices.createPreview({
			subscription: subscription.id,
			subscription_details: { items: [{ id: subscription.items.data[0].id, quantity: 6 }], proration_behavior: 'none' }
		});
		expect(preview.amount_due).toBe(4900 * 6);
	});

	it('says there is no upcoming invoice for a subscription ending at period end', async () => {
		const { subscription } = await subscribed();
		await harness.stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true });
		await expect(harness.stripe.invoices.createPreview({ subscription: subscription.id })).rejects.toMatchObject({
			type: 'StripeInvalidRequestError',
			code: 'invoice_upcoming_none'
		});
	});
});

describe('invoices.list and invoices.retrieve', () => {
	it('lists a customer’s invoices newest first with number, status, amounts, period and hosted page', async () => {
		const { subscription, customer } = await subscribed();
		await harness.stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 4 }],
			proration_behavior: 'always_invoice'
		});
		const list = await harness.stripe.invoices.list({ customer: customer.id, limit: 10 });
		expect(list.data).toHaveLength(2);
		const [latest, first] = list.data;
		expect(latest.billing_reason).toBe('subscription_update');
		expect(first.number).toMatch(/^[A-Z0-9]{8}-0001$/);
		expect(latest.number).toBe(first.number!.replace(/0001$/, '0002'));
		expect(first).toMatchObject({ status: 'paid', amount_due: 14700, amount_paid: 14700, currency: 'gbp' });
		expect(first.period_start).toBe(first.created);
		expect(first.hosted_invoice_url).toBe(`${harness.standin.url}/invoice/${first.id}`);
		const page = await (await fetch(first.hosted_invoice_url!)).text();
		expect(page).toContain('Local Stripe stand-in');
		expect(page).toContain('GBP 147.00');
		expect((await harness.stripe.invoices.list({ subscription: subscription.id, limit: 1 })).data.map((i) => i.id)).toEqual([latest.id]);
	});
});
