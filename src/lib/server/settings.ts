/**
 * The app's settings: the one place that reads the environment. Each section
 * is validated with zod when first used; `checkSettings()` validates all of
 * them at start-up (hooks.server.ts `init`) and stops the start with a message
 * naming every missing or malformed setting. There is no default database.
 */
import { z } from 'zod';
import { env } from '$env/dynamic/private';
import { isLoopbackHost } from './loopback';

export class SettingsError extends Error {
	constructor(readonly problems: string[]) {
		super(`Tidewright cannot start: ${problems.length === 1 ? 'a setting needs' : 'settings need'} attention.\n${problems.map((p) => `  - ${p}`).join('\n')}`);
		this.name = 'SettingsError';
	}
}

const postgresUrl = z
	.string({ message: 'is not set: give the PostgreSQL connection string (`npm start` sets it for the local cluster)' })
	.trim()
	.regex(/^postgres(ql)?:\/\/.+/, 'must be a PostgreSQL connection string such as postgres://user@host:5432/tidewright');

const flag = z.enum(['true', 'false'], { message: 'must be true or false' });

const port = z.coerce.number({ message: 'must be a port number' }).int('must be a whole number').min(1).max(65535);

const originUrl = z
	.string()
	.trim()
	.refine((value) => {
		try {
			const url = new URL(value);
			return (url.protocol === 'http:' || url.protocol === 'https:') && url.origin === value.replace(/\/$/, '');
		} catch {
			return false;
		}
	}, 'must be an origin such as https://tidewright.example.com (scheme and host, no path)');

const sections = {
	database: z.object({
		DATABASE_URL: postgresUrl
	}),
	web: z.object({
		ORIGIN: originUrl.optional(),
		HOST: z.string().trim().optional(),
		NODE_ENV: z.string().optional()
	}),
	compute: z.object({
		COMPUTE_THREADS: z.coerce
			.number({ message: 'must be a whole number of worker threads from 1 to 64' })
			.int('must be a whole number of worker threads from 1 to 64')
			.min(1, 'must be a whole number of worker threads from 1 to 64')
			.max(64, 'must be a whole number of worker threads from 1 to 64')
			.optional(),
		TIDEWRIGHT_BENCH: z.enum(['1'], { message: 'must be 1 or unset' }).optional()
	}),
	mail: z.object({
		SMTP_HOST: z.string({ message: 'is not set: Tidewright sends verification, reset and invitation mail (`npm start` points it at the local sink)' }).trim().min(1, 'is empty'),
		SMTP_PORT: port.default(587),
		SMTP_SECURE: flag.default('false'),
		SMTP_USER: z.string().optional(),
		SMTP_PASSWORD: z.string().optional(),
		MAIL_FROM: z.string().trim().min(3).default('Tidewright <no-reply@tidewright.example>'),
		MAIL_SINK_URL: z.url({ message: 'must be the local mail sink address, such as http://127.0.0.1:54326' }).optional()
	}),
	billing: z
		.object({
			STRIPE_SECRET_KEY: z
				.string()
				.trim()
				.regex(/^(sk|rk)_(test|live)_\w+$/, 'must be a Stripe secret key (sk_test_… or sk_live_…)')
				.optional(),
			STRIPE_WEBHOOK_SECRET: z.string().trim().regex(/^whsec_\w+$/, 'must be the webhook endpoint’s signing secret (whsec_…)').optional(),
			STRIPE_API_HOST: z.string().trim().min(1).optional(),
			STRIPE_API_PORT: port.optional(),
			STRIPE_API_PROTOCOL: z.enum(['http', 'https'], { message: 'must be http or https' }).optional(),
			STRIPE_STANDIN_URL: z.url({ message: 'must be the local Stripe stand-in address, such as http://127.0.0.1:54327' }).optional()
		})
		.superRefine((value, ctx) => {
			if (value.STRIPE_SECRET_KEY && !value.STRIPE_WEBHOOK_SECRET) {
				ctx.addIssue({ code: 'custom', path: ['STRIPE_WEBHOOK_SECRET'], message: 'is not set: with STRIPE_SECRET_KEY set, the webhook route needs the signing secret' });
			}
		})
} as const;

type SectionName = keyof typeof sections;
type Raw<S extends SectionName> = z.output<(typeof sections)[S]>;

/** The named variables, an empty one read as unset. */
function rawEnvironment(keys: readonly string[]): Record<string, string | undefined> {
	const source = env as Record<string, string | undefined>;
	return Object.fromEntries(keys.map((key) => [key, source[key] === '' ? undefined : source[key]]));
}

function problemsOf(error: z.ZodError): string[] {
	return error.issues.map((issue) => `${String(issue.path[0] ?? 'setting')} ${issue.message}`);
}

const cache = new Map<SectionName, { key: string; value: unknown }>();

/** One section, validated; re-read when the environment changes (tests point the app at their own services). */
function section<S extends SectionName>(name: S): Raw<S> {
	const schema = sections[name];
	const raw = rawEnvironment(Object.keys(schema.shape));
	const key = JSON.stringify(raw);
	const hit = cache.get(name);
	if (hit && hit.key === key) return hit.value as Raw<S>;
	const parsed = schema.safeParse(raw);
	if (!parsed.success) throw new SettingsError(problemsOf(parsed.error));
	cache.set(name, { key, value: parsed.data });
	return parsed.data as Raw<S>;
}

export interface DatabaseSettings {
	url: string;
}

export function databaseSettings(): DatabaseSettings {
	return { url: section('database').DATABASE_URL };
}

export interface WebSettings {
	/** The public origin the app is served at, when set (adapter-node's ORIGIN). */
	origin: string | null;
	production: boolean;
	/** True when the app listens on loopback only and its origin (if set) is a loopback address: a local demo. */
	loopbackOnly: boolean;
}

export function webSettings(): WebSettings {
	const web = section('web');
	const origin = web.ORIGIN?.replace(/\/$/, '') ?? null;
	// adapter-node listens on every interface when HOST is unset.
	const listensOnLoopback = web.HOST !== undefined && isLoopbackHost(web.HOST);
	const originOnLoopback = origin === null || isLoopbackHost(new URL(origin).hostname);
	return { origin, production: web.NODE_ENV === 'production', loopbackOnly: listensOnLoopback && originOnLoopback };
}

/** Secure cookies wherever the app is served over https; plain http only on a local http origin. */
export function cookiesAreSecure(requestUrl: URL): boolean {
	return (webSettings().origin ?? requestUrl.origin).startsWith('https://');
}

export interface ComputeSettings {
	/** Worker threads for engine and parsing work; null: the pool's own default. */
	threads: number | null;
	/**
	 * `npm run bench:http` lifts the per-user limits on engine routes so its load
	 * is real load. Honoured only for a local demo on loopback, never in production.
	 */
	benchLimitsLifted: boolean;
}

export function computeSettings(): ComputeSettings {
	const compute = section('compute');
	const web = webSettings();
	return { threads: compute.COMPUTE_THREADS ?? null, benchLimitsLifted: compute.TIDEWRIGHT_BENCH === '1' && web.loopbackOnly && !web.production };
}

export interface MailSettings {
	host: string;
	port: number;
	secure: boolean;
	auth: { user: string; pass: string } | null;
	from: string;
	/** The local mail sink's message list; set only beside the sink (`npm start`, tests). */
	sinkUrl: string | null;
}

export function mailSettings(): MailSettings {
	const mail = section('mail');
	return {
		host: mail.SMTP_HOST,
		port: mail.SMTP_PORT,
		secure: mail.SMTP_SECURE === 'true',
		auth: mail.SMTP_USER ? { user: mail.SMTP_USER, pass: mail.SMTP_PASSWORD ?? '' } : null,
		from: mail.MAIL_FROM,
		sinkUrl: mail.MAIL_SINK_URL ?? null
	};
}

/** The mail sink's address when it runs beside the app, without requiring the rest of the mail settings. */
export function mailSinkUrl(): string | null {
	const value = rawEnvironment(['MAIL_SINK_URL']).MAIL_SINK_URL;
	return value && z.url().safeParse(value).success ? value : null;
}

export interface BillingSettings {
	/** False when no Stripe key is set: the billing page says billing is not set up on this server. */
	enabled: boolean;
	secretKey: string;
	webhookSecret: string;
	testMode: boolean;
	/** Where the SDK sends its calls when not to Stripe itself (the local stand-in). */
	api: { host: string; port: number; protocol: 'http' | 'https' } | null;
	/** Origins of the checkout and portal pages a billing form sends the owner to (the page's form-action). */
	pageOrigins: string[];
}

export function billingSettings(): BillingSettings {
	const billing = section('billing');
	const standin = billing.STRIPE_STANDIN_URL ? new URL(billing.STRIPE_STANDIN_URL).origin : null;
	return {
		enabled: billing.STRIPE_SECRET_KEY !== undefined,
		secretKey: billing.STRIPE_SECRET_KEY ?? '',
		webhookSecret: billing.STRIPE_WEBHOOK_SECRET ?? '',
		testMode: (billing.STRIPE_SECRET_KEY ?? '').includes('_test_'),
		api: billing.STRIPE_API_HOST
			? { host: billing.STRIPE_API_HOST, port: billing.STRIPE_API_PORT ?? 443, protocol: billing.STRIPE_API_PROTOCOL ?? 'https' }
			: null,
		pageOrigins: standin ? [standin] : ['https://checkout.stripe.com', 'https://billing.stripe.com']
	};
}

/** Every section at once, reporting all problems together; throws SettingsError. */
export function checkSettings(): void {
	const problems: string[] = [];
	for (const name of Object.keys(sections) as SectionName[]) {
		try {
			section(name);
		} catch (e) {
			if (e instanceof SettingsError) problems.push(...e.problems);
			else throw e;
		}
	}
	if (problems.length > 0) throw new SettingsError(problems);
}
