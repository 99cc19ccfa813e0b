/**
 * Webhook signing and delivery, as Stripe does them: each attempt POSTs the
 * event's JSON with `Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of
 * "<t>.<payload>" keyed with the endpoint secret>` (Stripe docs, "Verify
 * webhook signatures manually"). The first attempt is awaited by the caller;
 * failed attempts are retried in the background after the given delays.
 */
import type Stripe from 'stripe';
import { createHmac } from 'node:crypto';

export const defaultRetryDelaysMs = [1000, 2000, 4000, 8000, 16000];
const ATTEMPT_TIMEOUT_MS = 10_000;

/** The Stripe-Signature header for `payload`, signed at `timestamp` (real Unix seconds). */
export function signatureHeader(payload: string, secret: string, timestamp: number): string {
	const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
	return `t=${timestamp},v1=${signature}`;
}

export interface DeliveryAttempt {
	eventId: string;
	eventType: string;
	attempt: number;
	url: string;
	/** HTTP status, or null when the request did not get an answer. */
	status: number | null;
	ok: boolean;
	error: string | null;
	at: string;
}

export class WebhookSender {
	private readonly attempts: DeliveryAttempt[] = [];
	private readonly retryTimers = new Set<NodeJS.Timeout>();
	/** Bumped by clear(), so attempts already under way do not schedule more. */
	private generation = 0;

	constructor(
		public url: string | null,
		private readonly secret: string,
		private readonly retryDelaysMs: number[] = defaultRetryDelaysMs
	) {}

	get deliveries(): readonly DeliveryAttempt[] {
		return this.attempts;
	}

	/** Sends one event and waits for the first attempt; retries, if needed, run later. */
	async deliver(event: Stripe.Event): Promise<void> {
		const url = this.url;
		if (!url) return;
		const payload = JSON.stringify(event, null, 2);
		await this.attempt(event, payload, url, 1, this.generation);
	}

	private async attempt(event: Stripe.Event, payload: string, url: string, attempt: number, generation: number) {
		let status: number | null = null;
		let error: string | null = null;
		try {
			const response = await fetch(url, {
				method: 'POST',
				headers: {
					'content-type': 'application/json; charset=utf-8',
					'stripe-signature': signatureHeader(payload, this.secret, Math.floor(Date.now() / 1000)),
					'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks) local stand-in'
				},
				body: payload,
				signal: AbortSignal.timeout(ATTEMPT_TIMEOUT_MS)
			});
			status = response.status;
			await response.arrayBuffer().catch(() => undefined);
		} catch (caught) {
			error = caught instanceof Error ? caught.message : String(caught);
		}
		const ok = status !== null && status >= 200 && status < 300;
		if (generation !== this.generation) return;
		this.attempts.push({ eventId: event.id, eventType: event.type, attempt, url, status, ok, error, at: new Date().toISOString() });
		if (ok) {
			event.pending_webhooks = 0;
			return;
		}
		const delay = this.retryDelaysMs[attempt - 1];
		if (delay === undefined) return;
		const timer = setTimeout(() => {
			this.retryTimers.delete(timer);
			void this.attempt(event, payload, url, attempt + 1, generation);
		}, delay);
		timer.unref();
		this.retryTimers.add(timer);
	}

	/** Forgets the delivery log and stops waiting retries (reset, stop). */
	clear(): void {
		this.generation += 1;
		for (const timer of this.retryTimers) clearTimeout(timer);
		this.retryTimers.clear();
		this.attempts.length = 0;
	}
}
