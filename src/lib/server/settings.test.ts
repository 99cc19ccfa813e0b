import { afterEach, describe, expect, it } from 'vitest';
import { env } from '$env/dynamic/private';
import { SettingsError, checkSettings, computeSettings, cookiesAreSecure, databaseSettings, mailSettings, webSettings } from './settings';

const appEnv = env as Record<string, string | undefined>;
const saved = { ...appEnv };

function use(values: Record<string, string | undefined>) {
	for (const [key, value] of Object.entries(values)) {
		if (value === undefined) delete appEnv[key];
		else appEnv[key] = value;
	}
}

afterEach(() => {
	for (const key of Object.keys(appEnv)) if (!(key in saved)) delete appEnv[key];
	Object.assign(appEnv, saved);
});

function problemsOf(run: () => unknown): string[] {
	try {
		run();
	} catch (e) {
		if (e instanceof SettingsError) return e.problems;
		throw e;
	}
	return [];
}

describe('databaseSettings', () => {
	it('has no default: a missing DATABASE_URL stops with its name', () => {
		use({ DATABASE_URL: undefined });
		expect(problemsOf(() => databaseSettings())).toEqual([expect.stringMatching(/^DATABASE_URL is not set/)]);
	});

	it('refuses a connection string that is not PostgreSQL', () => {
		use({ DATABASE_URL: 'mysql://root@127.0.0.1/tidewright' });
		expect(problemsOf(() => databaseSettings())).toEqual([expect.stringMatching(/^DATABASE_URL must be a PostgreSQL connection string/)]);
	});

	it('follows a changed environment (tests point the app at their own database)', () => {
		use({ DATABASE_URL: 'postgres://a@127.0.0.1:1/one' });
		expect(databaseSettings().url).toBe('postgres://a@127.0.0.1:1/one');
		use({ DATABASE_URL: 'postgres://a@127.0.0.1:1/two' });
		expect(databaseSettings().url).toBe('postgres://a@127.0.0.1:1/two');
	});
});

describe('webSettings and cookiesAreSecure', () => {
	it('refuses an ORIGIN with a path or another scheme', () => {
		use({ ORIGIN: 'https://tidewright.example/app' });
		expect(problemsOf(() => webSettings())).toEqual([expect.stringMatching(/^ORIGIN must be an origin/)]);
		use({ ORIGIN: 'ftp://tidewright.example' });
		expect(problemsOf(() => webSettings())).toHaveLength(1);
	});

	it('makes cookies secure on an https origin and plain on a local http one', () => {
		use({ ORIGIN: 'https://tidewright.example' });
		expect(cookiesAreSecure(new URL('http://127.0.0.1:3000/'))).toBe(true);
		use({ ORIGIN: 'http://127.0.0.1:3000' });
		expect(cookiesAreSecure(new URL('http://127.0.0.1:3000/'))).toBe(false);
		use({ ORIGIN: undefined });
		expect(cookiesAreSecure(new URL('https://behind.proxy.example/'))).toBe(true);
	});
});

describe('mailSettings', () => {
	it('needs SMTP_HOST and a numeric port', () => {
		use({ SMTP_HOST: undefined, SMTP_PORT: 'twenty-five' });
		const problems = problemsOf(() => mailSettings());
		expect(problems).toContainEqual(expect.stringMatching(/^SMTP_HOST is not set/));
		expect(problems).toContainEqual(expect.stringMatching(/^SMTP_PORT must be a port number/));
	});

	it('reads a full set', () => {
		use({ SMTP_HOST: 'mail.example', SMTP_PORT: '2525', SMTP_SECURE: 'true', SMTP_USER: 'u', SMTP_PASSWORD: 'p', MAIL_FROM: 'Ops <ops@example.test>' });
		expect(mailSettings()).toMatchObject({ host: 'mail.example', port: 2525, secure: true, auth: { user: 'u', pass: 'p' }, from: 'Ops <ops@example.test>' });
	});
});

describe('computeSettings', () => {
	it('refuses a thread count that is not a whole number from 1 to 64', () => {
		for (const bad of ['0', 'two', '1.5', '65']) {
			use({ COMPUTE_THREADS: bad });
			expect(problemsOf(() => computeSettings()), bad).toEqual([expect.stringMatching(/^COMPUTE_THREADS must be a whole number/)]);
		}
		use({ COMPUTE_THREADS: '3' });
		expect(computeSettings().threads).toBe(3);
	});

	it('lifts the engine limits for the benchmark only on a loopback demo, never in production', () => {
		use({ TIDEWRIGHT_BENCH: '1', HOST: '127.0.0.1', ORIGIN: 'http://127.0.0.1:3200', NODE_ENV: undefined });
		expect(computeSettings().benchLimitsLifted).toBe(true);
		use({ HOST: '0.0.0.0' });
		expect(computeSettings().benchLimitsLifted).toBe(false);
		use({ HOST: '127.0.0.1', NODE_ENV: 'production' });
		expect(computeSettings().benchLimitsLifted).toBe(false);
		use({ NODE_ENV: undefined, TIDEWRIGHT_BENCH: undefined });
		expect(computeSettings().benchLimitsLifted).toBe(false);
	});
});

describe('checkSettings', () => {
	it('reports every missing or malformed setting at once', () => {
		use({ DATABASE_URL: undefined, SMTP_HOST: undefined, ORIGIN: 'not a url' });
		let caught: unknown;
		try {
			checkSettings();
		} catch (e) {
			caught = e;
		}
		expect(caught).toBeInstanceOf(SettingsError);
		const message = (caught as SettingsError).message;
		for (const name of ['DATABASE_URL', 'SMTP_HOST', 'ORIGIN']) expect(message).toContain(name);
	});

	it('passes a complete set', () => {
		use({ DATABASE_URL: 'postgres://a@127.0.0.1:1/x', SMTP_HOST: '127.0.0.1', SMTP_PORT: '2525', ORIGIN: 'http://127.0.0.1:3000' });
		expect(() => checkSettings()).not.toThrow();
	});
});
