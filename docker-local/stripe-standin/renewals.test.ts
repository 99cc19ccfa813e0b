import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type Stripe from 'stripe';
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

async function subscribed(quantity = 3) {
	const result = await subscribeThroughCheckout(harness, quantity);
	harness.receiver.clear();
	return result;
}

async function advancePast(subscription: Stripe.Subscription) {
	const end = subscription.items.data[0].current_period_end;
	return harness.control<{ now: number }>('/_standin/clock/advance', { to: end + 60 });
}

describe('advanceClock', () => {
	it('renews a subscription whose period has ended: paid invoice, period moved on, invoice.paid then subscription.updated', async () => {
		const { subscription } = await subscribed(3);
		const item = subscription.items.data[0];
		await advancePast(subscription);

		expect(harness.receiver.types()).toEqual(['invoice.paid', 'customer.subscription.updated']);
		const renewed = await harness.stripe.subscriptions.retrieve(subscription.id);
		const renewedItem = renewed.items.data[0];
		expect(renewed.status).toBe('active');
		expect(renewedItem.current_period_start).toBe(item.current_period_end);
		expect(renewedItem.current_period_end).toBeGreaterThan(item.current_period_end + 27 * 86_400);

		const invoice = await harness.stripe.invoices.retrieve(renewed.latest_invoice as string);
		expect(invoice).toMatchObject({ status: 'paid', amount_due: 14700, billing_reason: 'subscription_cycle' });
		expect(invoice.created).toBe(item.current_period_end);
		expect(invoice.period_end).toBe(item.current_period_end);
		expect(invoice.lines.data[0].period).toEqual({ start: renewedItem.current_period_start, end: renewedItem.current_period_end });

		const updated = harness.receiver.received[1].event as Stripe.CustomerSubscriptionUpdatedEvent;
		expect(updated.created).toBe(item.current_period_end);
		expect(updated.data.previous_attributes?.items?.data[0].current_period_end).toBe(item.current_period_end);
	});

	it('renews once per period passed, in time order', async () => {
		const { subscription } = await subscribed(1);
		await harness.advanceSeconds(95 * 86_400);
		const invoices = await harness.stripe.invoices.list({ subscription: subscription.id });
		expect(invoices.data.map((i) => i.billing_reason)).toEqual(['subscription_cycle', 'subscription_cycle', 'subscription_cycle', 'subscription_create']);
		const created = invoices.data.map((i) => i.created);
		expect([...created].sort((a, b) => b - a)).toEqual(created);
	});

	it('ends a subscription set to cancel at period end, with customer.subscription.deleted', async () => {
		const { subscription } = await subscribed();
		await harness.stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true });
		harness.receiver.clear();
		await advancePast(subscription);
		expect(harness.receiver.types()).toEqual(['customer.subscription.deleted']);
		const ended = await harness.stripe.subscriptions.retrieve(subscription.id);
		expect(ended.status).toBe('canceled');
		expect(ended.ended_at).toBe(subscription.items.data[0].current_period_end);
		expect((await harness.stripe.invoices.list({ subscription: subscription.id })).data).toHaveLength(1);
	});

	it('with a declining card, leaves the renewal open and the subscription past due; the working card in the portal recovers it', async () => {
		const { subscription, customer } = await subscribed(2);
		const portal = await harness.stripe.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://127.0.0.1:3000/billing' });
		await harness.submitForm(`/portal/${portal.id}/card`, { card: 'declining' });
		harness.receiver.clear();

		await advancePast(subscription);
		expect(harness.receiver.types()).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
		const failed = harness.receiver.received[1].event as Stripe.CustomerSubscriptionUpdatedEvent;
		expect(failed.data.object.status).toBe('past_due');
		expect(failed.data.previous_attributes?.status).toBe('active');
		const open = (await harness.stripe.invoices.list({ customer: customer.id, status: 'open' })).data;
		expect(open).toHaveLength(1);
		expect(open[0].amount_due).toBe(9800);

		const portalPage = await (await fetch(portal.url)).text();
		expect(portalPage).toContain('past_due');
		expect(portalPage).toContain('Use the working test card');

		harness.receiver.clear();
		const switched = await harness.submitForm(`/portal/${portal.id}/card`, { card: 'working' });
		expect(switched.status).toBe(303);
		expect(harness.receiver.types()).toEqual(['invoice.paid', 'customer.subscription.updated']);
		const recovered = await harness.stripe.subscriptions.retrieve(subscription.id);
		expect(recovered.status).toBe('active');
		expect((await harness.stripe.invoices.retrieve(open[0].id)).status).toBe('paid');
	});

	it('expires a checkout session left open for 24 hours', async () => {
		const { price } = await subscribeThroughCheckout(harness, 1);
		const session = await harness.stripe.checkout.sessions.create({
			mode: 'subscription',
			line_items: [{ price: price.id, quantity: 1 }],
			success_url: 'http://127.0.0.1:3000/done'
		});
		harness.receiver.clear();
		await harness.advanceSeconds(24 * 3600 + 1);
		expect(harness.receiver.types()).toEqual(['checkout.session.expired']);
		expect((await harness.stripe.checkout.sessions.retrieve(session.id)).status).toBe('expired');
	});
});

describe('the clock control routes', () => {
	it('reads and moves the clock, which stamps new objects', async () => {
		const before = await harness.control<{ now: number }>('/_standin/clock');
		const moved = await harness.advanceSeconds(3 * 86_400);
		expect(moved.now - before.now).toBeGreaterThanOrEqual(3 * 86_400);
		const customer = await harness.stripe.customers.create({ name: 'Later' });
		expect(customer.created).toBeGreaterThanOrEqual(moved.now);
	});

	it('refuses to go back and refuses a bad body', async () => {
		const now = (await harness.control<{ now: number }>('/_standin/clock')).now;
		const back = await fetch(`${harness.standin.url}/_standin/clock/advance`, { method: 'POST', body: JSON.stringify({ to: now - 100 }) });
		expect(back.status).toBe(400);
		expect((await back.json()).error.message).toMatch(/cannot go back/);
		const both = await fetch(`${harness.standin.url}/_standin/clock/advance`, { method: 'POST', body: JSON.stringify({ seconds: 1, to: now }) });
		expect(both.status).toBe(400);
	});
});
