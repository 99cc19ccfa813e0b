import { afterEach, describe, expect, it } from 'vitest';
import { env } from '$env/dynamic/private';
import { devInboxEnabled } from './dev-inbox';

const appEnv = env as Record<string, string | undefined>;
const saved = { ...appEnv };
afterEach(() => {
	for (const key of Object.keys(appEnv)) if (!(key in saved)) delete appEnv[key];
	Object.assign(appEnv, saved);
});

function use(values: Record<string, string | undefined>) {
	for (const [key, value] of Object.entries(values)) {
		if (value === undefined) delete appEnv[key];
		else appEnv[key] = value;
	}
}

const demo = { MAIL_SINK_URL: 'http://127.0.0.1:54326', HOST: '127.0.0.1', ORIGIN: 'http://127.0.0.1:3000', NODE_ENV: 'development' };

describe('devInboxEnabled', () => {
	it('is on for a local demo: the sink beside it, loopback only, not production', () => {
		use(demo);
		expect(devInboxEnabled()).toBe(true);
	});

	it('is off when the app listens beyond loopback, or on every interface (HOST unset)', () => {
		use({ ...demo, HOST: '0.0.0.0' });
		expect(devInboxEnabled()).toBe(false);
		use({ ...demo, HOST: '192.168.1.20', ORIGIN: 'http://192.168.1.20:3000' });
		expect(devInboxEnabled()).toBe(false);
		use({ ...demo, HOST: undefined });
		expect(devInboxEnabled()).toBe(false);
	});

	it('is off behind a public origin, in production, and without the sink', () => {
		use({ ...demo, ORIGIN: 'https://tidewright.example' });
		expect(devInboxEnabled()).toBe(false);
		use({ ...demo, NODE_ENV: 'production' });
		expect(devInboxEnabled()).toBe(false);
		use({ ...demo, MAIL_SINK_URL: undefined });
		expect(devInboxEnabled()).toBe(false);
	});
});
