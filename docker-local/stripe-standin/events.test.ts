import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { previousAttributes } from './events';
import { startHarness, subscribeThroughCheckout, type Harness } from './test-harness';

describe('previousAttributes', () => {
	it('keeps the old value of each top-level field that changed, and nothing else', () => {
		const before = { status: 'active', cancel_at_period_end: false, items: { data: [{ quantity: 3 }] }, metadata: { a: '1' } };
		const after = { status: 'active', cancel_at_period_end: true, items: { data: [{ quantity: 5 }] }, metadata: { a: '1' } };
		expect(previousAttributes(before, after)).toEqual({ cancel_at_period_end: false, items: { data: [{ quantity: 3 }] } });
	});
});

describe('events API', () => {
	let harness: Harness;
	beforeAll(async () => {
		harness = await startHarness();
	});
	afterAll(async () => harness.stop());
	beforeEach(async () => {
		await harness.control('/_standin/reset', {});
		harness.receiver.clear();
	});

	it('serves each delivered event whole, by id and in a newest-first list', async () => {
		await subscribeThroughCheckout(harness, 2);
		const delivered = harness.receiver.received.map((r) => r.event);
		const event = await harness.stripe.events.retrieve(delivered[0].id);
		expect(event).toMatchObject({
			id: delivered[0].id,
			object: 'event',
			type: 'customer.subscription.created',
			api_version: Stripe.API_VERSION,
			livemode: false,
			request: { id: null, idempotency_key: null }
		});
		expect(event.created).toBe(delivered[0].created);
		expect(event.data.object).toEqual(delivered[0].data.object);

		const list = await harness.stripe.events.list();
		expect(list.data.map((e) => e.type)).toEqual(['checkout.session.completed', 'invoice.paid', 'customer.subscription.created']);
		const paidOnly = await harness.stripe.events.list({ type: 'invoice.*' });
		expect(paidOnly.data.map((e) => e.type)).toEqual(['invoice.paid']);
	});

	it('signs the exact bytes it sends, pretty-printed as Stripe does', async () => {
		await subscribeThroughCheckout(harness, 1);
		const { rawBody, signature } = harness.receiver.received[0];
		expect(rawBody).toContain('\n  "id": "evt_');
		expect(signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
		expect(harness.receiver.rejected).toEqual([]);
	});

	it('carries the request id and idempotency key of the API call that caused it', async () => {
		const { subscription } = await subscribeThroughCheckout(harness, 1);
		harness.receiver.clear();
		const updated = await harness.stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true }, { idempotencyKey: 'end-it' });
		const [event] = harness.receiver.received.map((r) => r.event);
		expect(event.request).toEqual({ id: updated.lastResponse.requestId, idempotency_key: 'end-it' });
	});
});
