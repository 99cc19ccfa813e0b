import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { signatureHeader, WebhookSender } from './webhooks';
import { startWebhookReceiver, testWebhookSecret, type WebhookReceiver } from './test-harness';

const verifier = new Stripe('sk_test_verifier');
const payload = JSON.stringify({ id: 'evt_1', object: 'event', type: 'invoice.paid', data: { object: { id: 'in_1' } } }, null, 2);

describe('signatureHeader', () => {
	it('is accepted by stripe.webhooks.constructEvent with the same secret', () => {
		const header = signatureHeader(payload, testWebhookSecret, Math.floor(Date.now() / 1000));
		expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
		const event = verifier.webhooks.constructEvent(payload, header, testWebhookSecret);
		expect(event.id).toBe('evt_1');
	});

	it('matches the HMAC of "<t>.<payload>" worked out by the SDK itself', () => {
		const timestamp = 1_800_000_000;
		const expected = verifier.webhooks.generateTestHeaderString({ payload, secret: testWebhookSecret, timestamp });
		expect(signatureHeader(payload, testWebhookSecret, timestamp)).toBe(expected);
	});

	it('is rejected for a tampered payload, a wrong secret, re-serialised JSON and an old timestamp', () => {
		const now = Math.floor(Date.now() / 1000);
		const header = signatureHeader(payload, testWebhookSecret, now);
		expect(() => verifier.webhooks.constructEvent(payload.replace('in_1', 'in_2'), header, testWebhookSecret)).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);
		expect(() => verifier.webhooks.constructEvent(payload, header, 'whsec_someone_else')).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);
		expect(() => verifier.webhooks.constructEvent(JSON.stringify(JSON.parse(payload)), header, testWebhookSecret)).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);
		const old = signatureHeader(payload, testWebhookSecret, now - 301);
		expect(() => verifier.webhooks.constructEvent(payload, old, testWebhookSecret)).toThrow(/tolerance/);
	});
});

describe('WebhookSender', () => {
	let receiver: WebhookReceiver;
	beforeAll(async () => {
		receiver = await startWebhookReceiver();
	});
	afterAll(async () => receiver.stop());

	const event = (id: string) =>
		({ id, object: 'event', type: 'invoice.paid', pending_webhooks: 1, data: { object: {} } }) as unknown as Stripe.Event;

	it('retries after a 500 in the background and records each attempt', async () => {
		receiver.clear();
		receiver.failNext(1, 500);
		const sender = new WebhookSender(receiver.url, testWebhookSecret, [30, 60]);
		const first = event('evt_retry');
		await sender.deliver(first);
		expect(sender.deliveries).toEqual([expect.objectContaining({ eventId: 'evt_retry', attempt: 1, status: 500, ok: false })]);
		await expect.poll(() => sender.deliveries.length, { timeout: 2000 }).toBe(2);
		expect(sender.deliveries[1]).toMatchObject({ eventId: 'evt_retry', attempt: 2, status: 200, ok: true });
		expect(receiver.received.map((r) => r.event.id)).toEqual(['evt_retry']);
		expect(first.pending_webhooks).toBe(0);
	});

	it('gives up after the last delay and records network errors as attempts without a status', async () => {
		const sender = new WebhookSender('http://127.0.0.1:9/unreachable', testWebhookSecret, [20]);
		await sender.deliver(event('evt_lost'));
		await expect.poll(() => sender.deliveries.length, { timeout: 2000 }).toBe(2);
		await new Promise((r) => setTimeout(r, 80));
		expect(sender.deliveries).toHaveLength(2);
		expect(sender.deliveries.every((d) => d.status === null && !d.ok && d.error)).toBe(true);
	});

	it('stops waiting retries on clear()', async () => {
		receiver.failNext(5, 503);
		const sender = new WebhookSender(receiver.url, testWebhookSecret, [40, 40, 40]);
		await sender.deliver(event('evt_cleared'));
		sender.clear();
		await new Promise((r) => setTimeout(r, 150));
		expect(sender.deliveries).toHaveLength(0);
		receiver.failNext(0);
	});
});
