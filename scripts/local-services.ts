/**
 * The local stand-ins that `npm start`, `npm run dev` and the browser tests run
 * beside the app. Each one starts, reports the settings the app needs, and stops.
 */
import { clusterSettingsFromEnv, databaseUrl, startCluster, stopCluster } from '../docker-local/postgres';
import { migrateAndSeed } from './migrate';
import { mailSinkPortsFromEnv, startMailSink } from '../docker-local/mail-sink';
import { startStripeStandin, stripeStandinPortFromEnv } from '../docker-local/stripe-standin/index';
import { demoUsers } from '../seeds/02_demo_users';
import { demoInvestor, secondInvestor } from '../seeds/06_demo_room';
import { isLoopbackHost } from '../src/lib/server/loopback';

export interface RunningService {
	name: string;
	env: Record<string, string>;
	stop: () => Promise<void>;
}

export async function startPostgres(options: { seed?: boolean } = {}): Promise<RunningService> {
	const settings = clusterSettingsFromEnv();
	startCluster(settings);
	const url = databaseUrl(settings);
	await migrateAndSeed(url, { seed: options.seed });
	return {
		name: 'postgres',
		env: { DATABASE_URL: url },
		stop: async () => stopCluster(settings)
	};
}

/** Stand-ins started after PostgreSQL (mail sink, Stripe stand-in), in order. */
export const extraServices: Array<() => Promise<RunningService>> = [startMailSinkService, startStripeStandinService];

async function startMailSinkService(): Promise<RunningService> {
	const { smtpPort, httpPort } = mailSinkPortsFromEnv();
	const sink = await startMailSink(smtpPort, httpPort);
	return {
		name: 'mail sink',
		env: {
			SMTP_HOST: '127.0.0.1',
			SMTP_PORT: String(smtpPort),
			MAIL_SINK_URL: `http://127.0.0.1:${httpPort}`
		},
		stop: sink.stop
	};
}

/**
 * The local Stripe stand-in, posting its events to the app's webhook route.
 * ORIGIN and PORT are read when the service starts, so the caller's settings apply.
 */
async function startStripeStandinService(): Promise<RunningService> {
	const port = stripeStandinPortFromEnv();
	const webhookSecret = 'whsec_local_standin';
	const appOrigin = process.env.ORIGIN ?? 'http://127.0.0.1:' + (process.env.PORT ?? '3000');
	const standin = await startStripeStandin({ port, webhookSecret, webhookUrl: `${appOrigin}/api/v1/billing/webhook` });
	return {
		name: 'Stripe stand-in',
		env: {
			STRIPE_SECRET_KEY: 'sk_test_local_standin',
			STRIPE_WEBHOOK_SECRET: webhookSecret,
			STRIPE_API_HOST: '127.0.0.1',
			STRIPE_API_PORT: String(port),
			STRIPE_API_PROTOCOL: 'http',
			STRIPE_STANDIN_URL: `http://127.0.0.1:${port}`
		},
		stop: standin.stop
	};
}

/** What a newcomer needs to sign in at once, and where the app's mail can be read. */
export function demoCredentialsText(origin: string, host: string): string {
	const lines = Object.entries(demoUsers).map(
		([persona, u]) => `  ${persona.padEnd(10)} ${u.email.padEnd(40)} ${u.password}`
	);
	const loopback = isLoopbackHost(host) && isLoopbackHost(new URL(origin).hostname);
	const inbox = loopback
		? `Mail sent by the app lands in the dev inbox: ${origin}/dev/mail (a local demo's: served on loopback only, to signed-in users)`
		: `The dev inbox is off: HOST ${host} is not loopback, and the inbox shows password-reset links. Mail lands in the local sink on this machine.`;
	const investors = [demoInvestor, secondInvestor].map((i) => `  ${'investor'.padEnd(10)} ${i.email.padEnd(44)} ${i.password}`);
	return [
		'Demo users (invented people; sign in at ' + origin + '/signin):',
		...lines,
		`Demo investors, room guests (sign in at ${origin}/rooms/signin):`,
		...investors,
		inbox
	].join('\n');
}
