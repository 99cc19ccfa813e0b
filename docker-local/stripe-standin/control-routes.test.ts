import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startHarness, startWebhookReceiver, subscribeThroughCheckout, type Harness } from './test-harness';

let harness: Harness;

beforeAll(async () => {
	harness = await startHarness({ retryDelaysMs: [40, 80] });
});
afterAll(async () => harness.stop());
beforeEach(async () => {
	await harness.control('/_standin/reset', {});
	harness.receiver.clear();
	harness.receiver.failNext(0);
});

describe('GET /_standin/deliveries', () => {
	it('records a failed first attempt and the retry that succeeds', async () => {
		const { subscription } = await subscribeThroughCheckout(harness, 1);
		harness.receiver.clear();
		harness.receiver.failNext(1, 500);
		await harness.stripe.subscriptions.update(subscription.id, { metadata: { note: 'retry me' } });
		await expect.poll(async () => (await harness.deliveries()).filter((d) => d.eventType === 'customer.subscription.updated').length, { timeout: 2000 }).toBe(2);
		const attempts = (await harness.deliveries()).filter((d) => d.eventType === 'customer.subscription.updated');
		expect(attempts.map((a) => [a.attempt, a.status, a.ok])).toEqual([
			[1, 500, false],
			[2, 200, true]
		]);
		expect(attempts[0].eventId).toBe(attempts[1].eventId);
		expect(harness.receiver.types()).toEqual(['customer.subscription.updated']);
		const event = await harness.stripe.events.retrieve(attempts[0].eventId);
		expect(event.pending_webhooks).toBe(0);
	});
});

describe('POST /_standin/webhook', () => {
	it('points deliveries at a new URL at run time, or turns them off with null', async () => {
		const other = await startWebhookReceiver();
		try {
			expect(await harness.control('/_standin/webhook', { url: other.url })).toEqual({ url: other.url });
			const { subscription } = await subscribeThroughCheckout(harness, 1);
			expect(other.types()).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
			expect(harness.receiver.received).toHaveLength(0);

			await harness.control('/_standin/webhook', { url: null });
			await harness.stripe.subscriptions.cancel(subscription.id);
			expect(other.received).toHaveLength(3);
			const [deleted] = (await harness.stripe.events.list({ type: 'customer.subscription.deleted' })).data;
			expect(deleted.pending_webhooks).toBe(0);
		} finally {
			await harness.control('/_standin/webhook', { url: harness.receiver.url });
			await other.stop();
		}
	});

	it('refuses a URL that is not http(s)', async () => {
		const response = await fetch(`${harness.standin.url}/_standin/webhook`, { method: 'POST', body: JSON.stringify({ url: 'file:///etc/passwd' }) });
		expect(response.status).toBe(400);
	});
});

describe('POST /_standin/reset', () => {
	it('forgets objects, events, deliveries and the clock offset, and keeps the webhook URL', async () => {
		const { customer } = await subscribeThroughCheckout(harness, 2);
		await harness.advanceSeconds(10 * 86_400);
		const reset = await harness.control<{ webhookUrl: string }>('/_standin/reset', {});
		expect(reset.webhookUrl).toBe(harness.receiver.url);
		await expect(harness.stripe.customers.retrieve(customer.id)).rejects.toMatchObject({ statusCode: 404 });
		expect((await harness.stripe.events.list()).data).toHaveLength(0);
		expect(await harness.deliveries()).toHaveLength(0);
		const { now } = await harness.control<{ now: number }>('/_standin/clock');
		expect(Math.abs(now - Math.floor(Date.now() / 1000))).toBeLessThanOrEqual(1);

		harness.receiver.clear();
		await subscribeThroughCheckout(harness, 1);
		expect(harness.receiver.received).toHaveLength(3);
	});

	it('forgets idempotency keys', async () => {
		const first = await harness.stripe.customers.create({ name: 'Once' }, { idempotencyKey: 'reset-key' });
		await harness.control('/_standin/reset', {});
		const second = await harness.stripe.customers.create({ name: 'Once' }, { idempotencyKey: 'reset-key' });
		expect(second.id).not.toBe(first.id);
	});
});
