/**
 * The local Stripe stand-in: the part of Stripe's API Tidewright calls, in
 * memory, on loopback, with checkout and billing-portal pages, signed webhooks
 * and a clock that tests can move forward. The app talks to it with the real
 * SDK: new Stripe('sk_test_...', { host: '127.0.0.1', port, protocol: 'http' }).
 *
 *   tsx docker-local/stripe-standin/index.ts      serves on STRIPE_STANDIN_PORT (default 54327)
 *
 * Control routes are listed in control-routes.ts.
 */
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createStandinContext } from './context';
import { createStandinServer } from './server';

export interface StripeStandinOptions {
	port: number;
	/** Where events are POSTed; can also be set later with POST /_standin/webhook. */
	webhookUrl?: string;
	/** The endpoint secret events are signed with (the app's STRIPE_WEBHOOK_SECRET). */
	webhookSecret: string;
	/** Waits before each retry of a failed delivery; default 1, 2, 4, 8, 16 seconds. */
	retryDelaysMs?: number[];
}

export interface StripeStandin {
	port: number;
	url: string;
	stop(): Promise<void>;
}

export async function startStripeStandin(options: StripeStandinOptions): Promise<StripeStandin> {
	// The pages' URLs need the port, known only once listening when port 0 is asked for.
	const context = createStandinContext({
		baseUrl: `http://127.0.0.1:${options.port}`,
		webhookUrl: options.webhookUrl ?? null,
		webhookSecret: options.webhookSecret,
		retryDelaysMs: options.retryDelaysMs
	});
	const server = createStandinServer(context);
	await new Promise<void>((ok, fail) => {
		server.once('error', fail);
		server.listen(options.port, '127.0.0.1', () => ok());
	});
	const address = server.address();
	const port = typeof address === 'object' && address ? address.port : options.port;
	const url = `http://127.0.0.1:${port}`;
	context.state.baseUrl = url;
	return {
		port,
		url,
		stop: async () => {
			context.webhooks.clear();
			server.closeAllConnections();
			await new Promise<void>((ok) => server.close(() => ok()));
		}
	};
}

export function stripeStandinPortFromEnv(env: NodeJS.ProcessEnv = process.env): number {
	return Number(env.STRIPE_STANDIN_PORT ?? 54327);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
	const port = stripeStandinPortFromEnv();
	startStripeStandin({
		port,
		webhookUrl: process.env.STRIPE_STANDIN_WEBHOOK_URL,
		webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_local_standin'
	}).then((standin) => console.log(`Stripe stand-in: ${standin.url} (webhooks: ${process.env.STRIPE_STANDIN_WEBHOOK_URL ?? 'none yet'})`));
}
