import { describe, expect, it } from 'vitest';
import { freePort } from '../../tests/helpers/free-port';
import { startStripeStandin, stripeStandinPortFromEnv } from './index';

describe('stripeStandinPortFromEnv', () => {
	it('reads STRIPE_STANDIN_PORT, else 54327', () => {
		expect(stripeStandinPortFromEnv({})).toBe(54327);
		expect(stripeStandinPortFromEnv({ STRIPE_STANDIN_PORT: '54337' })).toBe(54337);
	});
});

describe('startStripeStandin', () => {
	it('serves on loopback at the port asked for, and stop() closes it', async () => {
		const port = await freePort();
		const standin = await startStripeStandin({ port, webhookSecret: 'whsec_x' });
		expect(standin.port).toBe(port);
		expect(standin.url).toBe(`http://127.0.0.1:${port}`);
		const home = await fetch(`${standin.url}/`);
		expect(await home.text()).toContain('Local Stripe stand-in');
		await standin.stop();
		await expect(fetch(`${standin.url}/`)).rejects.toThrow();
	});

	it('picks a port when given 0 and builds page URLs with it', async () => {
		const standin = await startStripeStandin({ port: 0, webhookSecret: 'whsec_x' });
		try {
			expect(standin.port).toBeGreaterThan(0);
			const clock = await fetch(`${standin.url}/_standin/clock`);
			expect(clock.status).toBe(200);
		} finally {
			await standin.stop();
		}
	});
});
