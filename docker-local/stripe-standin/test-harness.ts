/**
 * For the stand-in's own tests: the stand-in on a free port with short retry
 * delays, the real stripe SDK pointed at it, and a small webhook receiver that
 * verifies every delivery with stripe.webhooks.constructEvent, as the app will.
 */
import { createServer, type Server } from 'node:http';
import Stripe from 'stripe';
import { freePort } from '../../tests/helpers/free-port';
import { startStripeStandin, type StripeStandin } from './index';
import type { DeliveryAttempt } from './webhooks';

export const testWebhookSecret = 'whsec_standin_test_secret';

export interface ReceivedEvent {
	event: Stripe.Event;
	rawBody: string;
	signature: string;
}

export interface WebhookReceiver {
	url: string;
	received: ReceivedEvent[];
	rejected: string[];
	/** The next `count` deliveries are answered with `status` instead of 200. */
	failNext(count: number, status?: number): void;
	types(): string[];
	clear(): void;
	stop(): Promise<void>;
}

export async function startWebhookReceiver(secret = testWebhookSecret): Promise<WebhookReceiver> {
	const verifier = new Stripe('sk_test_receiver');
	const received: ReceivedEvent[] = [];
	const rejected: string[] = [];
	let failures: { count: number; status: number } = { count: 0, status: 500 };
	const server: Server = createServer((req, res) => {
		const chunks: Buffer[] = [];
		req.on('data', (chunk: Buffer) => chunks.push(chunk));
		req.on('end', () => {
			const rawBody = Buffer.concat(chunks).toString('utf8');
			const signature = String(req.headers['stripe-signature'] ?? '');
			if (failures.count > 0) {
				failures = { ...failures, count: failures.count - 1 };
				res.writeHead(failures.status).end('failing on purpose');
				return;
			}
			try {
				const event = verifier.webhooks.constructEvent(rawBody, signature, secret);
				received.push({ event, rawBody, signature });
				res.writeHead(200, { 'content-type': 'application/json' }).end('{"received":true}');
			} catch (error) {
				rejected.push(error instanceof Error ? error.message : String(error));
				res.writeHead(400).end('bad signature');
			}
		});
	});
	const port = await freePort();
	await new Promise<void>((ok) => server.listen(port, '127.0.0.1', () => ok()));
	return {
		url: `http://127.0.0.1:${port}/webhook`,
		received,
		rejected,
		failNext(count, status = 500) {
			failures = { count, status };
		},
		types: () => received.map((r) => r.event.type),
		clear() {
			received.length = 0;
			rejected.length = 0;
		},
		stop: () => new Promise<void>((ok) => server.close(() => ok()))
	};
}

export interface Harness {
	standin: StripeStandin;
	receiver: WebhookReceiver;
	stripe: Stripe;
	/** POST a JSON body to a control route and read the JSON answer. */
	control<T = unknown>(path: string, body?: unknown): Promise<T>;
	advanceSeconds(seconds: number): Promise<{ now: number }>;
	deliveries(): Promise<DeliveryAttempt[]>;
	/** Submit one of the stand-in's page forms without following the redirect. */
	submitForm(path: string, fields?: Record<string, string>): Promise<Response>;
	stop(): Promise<void>;
}

export async function startHarness(options: { retryDelaysMs?: number[] } = {}): Promise<Harness> {
	const receiver = await startWebhookReceiver();
	const standin = await startStripeStandin({
		port: await freePort(),
		webhookUrl: receiver.url,
		webhookSecret: testWebhookSecret,
		retryDelaysMs: options.retryDelaysMs ?? [50, 100]
	});
	const stripe = new Stripe('sk_test_standin_tests', {
		host: '127.0.0.1',
		port: standin.port,
		protocol: 'http',
		maxNetworkRetries: 0,
		telemetry: false
	});
	const control = async <T>(path: string, body?: unknown): Promise<T> => {
		const response = await fetch(`${standin.url}${path}`, {
			method: body === undefined ? 'GET' : 'POST',
			headers: { 'content-type': 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
		const value = (await response.json()) as T;
		if (!response.ok) throw new Error(`${path}: ${response.status} ${JSON.stringify(value)}`);
		return value;
	};
	return {
		standin,
		receiver,
		stripe,
		control,
		advanceSeconds: (seconds) => control('/_standin/clock/advance', { seconds }),
		deliveries: async () => (await control<{ data: DeliveryAttempt[] }>('/_standin/deliveries')).data,
		submitForm: (path, fields = {}) =>
			fetch(`${standin.url}${path}`, {
				method: 'POST',
				headers: { 'content-type': 'application/x-www-form-urlencoded' },
				body: new URLSearchParams(fields).toString(),
				redirect: 'manual'
			}),
		stop: async () => {
			await standin.stop();
			await receiver.stop();
		}
	};
}

/** A customer, a product and a monthly seat price, as the app sets them up. */
export async function seatPlan(
	stripe: Stripe,
	options: { unitAmount?: number; interval?: 'month' | 'year'; lookupKey?: string } = {}
) {
	const customer = await stripe.customers.create({
		email: 'ines.marlow@saltmarsh-tidal.example',
		name: 'Ines Marlow',
		metadata: { workspace_id: 'ws_kelpford' }
	});
	const product = await stripe.products.create({ name: 'Tidewright Team' });
	const price = await stripe.prices.create({
		product: product.id,
		unit_amount: options.unitAmount ?? 4900,
		currency: 'gbp',
		recurring: { interval: options.interval ?? 'month' },
		lookup_key: options.lookupKey ?? `team_${options.interval ?? 'month'}ly_${Math.random().toString(36).slice(2)}`,
		nickname: 'Team monthly'
	});
	return { customer, product, price };
}

/** Creates a Checkout Session for `quantity` seats and pays it with the working test card. */
export async function subscribeThroughCheckout(harness: Harness, quantity = 3, options: { unitAmount?: number } = {}) {
	const plan = await seatPlan(harness.stripe, options);
	const session = await harness.stripe.checkout.sessions.create({
		mode: 'subscription',
		customer: plan.customer.id,
		line_items: [{ price: plan.price.id, quantity }],
		success_url: 'http://127.0.0.1:3000/billing/done?session={CHECKOUT_SESSION_ID}',
		cancel_url: 'http://127.0.0.1:3000/billing',
		client_reference_id: 'ws_kelpford',
		subscription_data: { metadata: { workspace_id: 'ws_kelpford' } }
	});
	const paid = await harness.submitForm(`/checkout/${session.id}/pay`, { card: 'working' });
	if (paid.status !== 303) throw new Error(`paying the checkout answered ${paid.status}: ${await paid.text()}`);
	const completed = await harness.stripe.checkout.sessions.retrieve(session.id);
	const subscription = await harness.stripe.subscriptions.retrieve(completed.subscription as string);
	return { ...plan, session: completed, subscription };
}
