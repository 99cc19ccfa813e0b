import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { seatPlan, startHarness, type Harness } from './test-harness';

let harness: Harness;

beforeAll(async () => {
	harness = await startHarness();
});
afterAll(async () => harness.stop());
beforeEach(async () => {
	await harness.control('/_standin/reset', {});
	harness.receiver.clear();
});

describe('customers', () => {
	it('creates, retrieves and updates a customer, merging metadata as Stripe does', async () => {
		const created = await harness.stripe.customers.create({
			email: 'nadia.brennock@ebbstone.example',
			name: 'Nadia Brennock',
			metadata: { workspace_id: 'ws_ebb', region: 'north' }
		});
		expect(created).toMatchObject({
			object: 'customer',
			email: 'nadia.brennock@ebbstone.example',
			name: 'Nadia Brennock',
			livemode: false,
			metadata: { workspace_id: 'ws_ebb', region: 'north' }
		});
		expect(created.id).toMatch(/^cus_/);
		expect(await harness.stripe.customers.retrieve(created.id)).toEqual(created);

		const updated = await harness.stripe.customers.update(created.id, {
			name: 'Nadia Brennock-Hale',
			metadata: { region: '', plan: 'team' }
		});
		expect(updated.name).toBe('Nadia Brennock-Hale');
		expect(updated.email).toBe('nadia.brennock@ebbstone.example');
		expect(updated.metadata).toEqual({ workspace_id: 'ws_ebb', plan: 'team' });
	});

	it('answers an unknown id with a 404 StripeInvalidRequestError (resource_missing)', async () => {
		const failure = harness.stripe.customers.retrieve('cus_nobody');
		await expect(failure).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
		await expect(failure).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing', param: 'id' });
	});

	it('refuses a live key and a missing key', async () => {
		const live = new Stripe('sk_live_not_here', { host: '127.0.0.1', port: harness.standin.port, protocol: 'http', maxNetworkRetries: 0 });
		await expect(live.customers.create({})).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
		const response = await fetch(`${harness.standin.url}/v1/customers`, { method: 'POST' });
		expect(response.status).toBe(401);
		expect((await response.json()).error.type).toBe('invalid_request_error');
	});

	it('takes the key as curl -u sends it (Basic, key as user name)', async () => {
		const basic = `Basic ${Buffer.from('sk_test_curl:').toString('base64')}`;
		const response = await fetch(`${harness.standin.url}/v1/customers?limit=1`, { headers: { authorization: basic } });
		expect(response.status).toBe(200);
		expect((await response.json()).object).toBe('list');
	});
});

describe('idempotency keys', () => {
	it('answers a repeated key with the first answer and makes nothing twice', async () => {
		const first = await harness.stripe.customers.create({ email: 'a@kelpford.example' }, { idempotencyKey: 'signup-42' });
		const again = await harness.stripe.customers.create({ email: 'a@kelpford.example' }, { idempotencyKey: 'signup-42' });
		expect(again.id).toBe(first.id);
		expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
		expect((await harness.stripe.customers.list()).data).toHaveLength(1);
	});

	it('refuses the same key with other parameters as a StripeIdempotencyError', async () => {
		await harness.stripe.customers.create({ email: 'a@kelpford.example' }, { idempotencyKey: 'signup-43' });
		await expect(
			harness.stripe.customers.create({ email: 'b@kelpford.example' }, { idempotencyKey: 'signup-43' })
		).rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
	});

	it('gives concurrent requests with one key one answer', async () => {
		const [a, b] = await Promise.all([
			harness.stripe.customers.create({ name: 'Same' }, { idempotencyKey: 'together' }),
			harness.stripe.customers.create({ name: 'Same' }, { idempotencyKey: 'together' })
		]);
		expect(a.id).toBe(b.id);
	});
});

describe('products and prices', () => {
	it('creates a product and a monthly price with lookup key, nickname and metadata', async () => {
		const product = await harness.stripe.products.create({ name: 'Tidewright Team', metadata: { tier: 'team' } });
		expect(product).toMatchObject({ object: 'product', name: 'Tidewright Team', active: true, metadata: { tier: 'team' } });
		const price = await harness.stripe.prices.create({
			product: product.id,
			unit_amount: 4900,
			currency: 'GBP',
			recurring: { interval: 'month' },
			lookup_key: 'team_monthly',
			nickname: 'Team monthly',
			metadata: { seats: 'per-seat' }
		});
		expect(price).toMatchObject({
			object: 'price',
			product: product.id,
			unit_amount: 4900,
			currency: 'gbp',
			lookup_key: 'team_monthly',
			nickname: 'Team monthly',
			type: 'recurring',
			recurring: { interval: 'month', interval_count: 1, usage_type: 'licensed' },
			metadata: { seats: 'per-seat' }
		});
		// The SDK turns the decimal string back into its own Decimal type.
		expect(String(price.unit_amount_decimal)).toBe('4900');
		expect((await harness.stripe.prices.retrieve(price.id)).id).toBe(price.id);
		expect((await harness.stripe.products.retrieve(product.id)).name).toBe('Tidewright Team');
	});

	it('lists prices by lookup key and active flag, with the product expanded on request', async () => {
		const team = await seatPlan(harness.stripe, { lookupKey: 'team_monthly' });
		const yearly = await harness.stripe.prices.create({
			product: team.product.id,
			unit_amount: 49000,
			currency: 'gbp',
			recurring: { interval: 'year' },
			lookup_key: 'team_yearly'
		});
		await harness.stripe.prices.create({ product: team.product.id, unit_amount: 1, currency: 'gbp', recurring: { interval: 'month' } });
		await harness.stripe.prices.update(yearly.id, { active: false });

		const byKeys = await harness.stripe.prices.list({ lookup_keys: ['team_monthly', 'team_yearly'] });
		expect(byKeys.data.map((p) => p.lookup_key).sort()).toEqual(['team_monthly', 'team_yearly']);
		expect(byKeys.data.every((p) => p.product === team.product.id)).toBe(true);

		const activeOnly = await harness.stripe.prices.list({ lookup_keys: ['team_monthly', 'team_yearly'], active: true, expand: ['data.product'] });
		expect(activeOnly.data).toHaveLength(1);
		expect(activeOnly.data[0].product).toMatchObject({ object: 'product', id: team.product.id, name: 'Tidewright Team' });
		// Expanding answers a copy: the stored price still holds the product id.
		expect((await harness.stripe.prices.retrieve(team.price.id)).product).toBe(team.product.id);
	});

	it('keeps each lookup key on one price unless transfer_lookup_key is set', async () => {
		const { product, price } = await seatPlan(harness.stripe, { lookupKey: 'team_monthly' });
		const clash = harness.stripe.prices.create({
			product: product.id,
			unit_amount: 5900,
			currency: 'gbp',
			recurring: { interval: 'month' },
			lookup_key: 'team_monthly'
		});
		await expect(clash).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'lookup_key' });
		const moved = await harness.stripe.prices.create({
			product: product.id,
			unit_amount: 5900,
			currency: 'gbp',
			recurring: { interval: 'month' },
			lookup_key: 'team_monthly',
			transfer_lookup_key: true
		});
		expect((await harness.stripe.prices.list({ lookup_keys: ['team_monthly'] })).data.map((p) => p.id)).toEqual([moved.id]);
		expect((await harness.stripe.prices.retrieve(price.id)).lookup_key).toBeNull();
	});

	it('names the field of a bad price parameter', async () => {
		const product = await harness.stripe.products.create({ name: 'Tidewright Team' });
		await expect(
			harness.stripe.prices.create({ product: product.id, unit_amount: 4900, currency: 'gbp', recurring: { interval: 'fortnight' as 'month' } })
		).rejects.toMatchObject({ param: 'recurring[interval]', statusCode: 400 });
		await expect(
			harness.stripe.prices.create({ product: product.id, currency: 'gbp', recurring: { interval: 'month' } })
		).rejects.toMatchObject({ param: 'unit_amount', code: 'parameter_missing' });
	});
});

describe('unknown routes', () => {
	it('answer 404 in Stripe error shape', async () => {
		await expect(harness.stripe.refunds.create({ charge: 'ch_1' })).rejects.toMatchObject({
			type: 'StripeInvalidRequestError',
			statusCode: 404,
			message: expect.stringContaining('/v1/refunds')
		});
	});
});
