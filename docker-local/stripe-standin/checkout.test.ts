import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
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

async function openSession(quantity = 3) {
	const plan = await seatPlan(harness.stripe);
	const session = await harness.stripe.checkout.sessions.create({
		mode: 'subscription',
		customer: plan.customer.id,
		line_items: [{ price: plan.price.id, quantity }],
		success_url: 'http://127.0.0.1:3000/billing/done?session={CHECKOUT_SESSION_ID}',
		cancel_url: 'http://127.0.0.1:3000/billing?canceled=1',
		client_reference_id: 'ws_kelpford',
		metadata: { workspace_id: 'ws_kelpford' },
		subscription_data: { metadata: { workspace_id: 'ws_kelpford', seats_by: 'tomas.okafor' } }
	});
	return { ...plan, session };
}

describe('createCheckoutSession', () => {
	it('answers an open, unpaid session whose url is the stand-in checkout page', async () => {
		const { session, customer } = await openSession();
		expect(session.id).toMatch(/^cs_test_/);
		expect(session.object).toBe('checkout.session');
		expect(session.status).toBe('open');
		expect(session.payment_status).toBe('unpaid');
		expect(session.mode).toBe('subscription');
		expect(session.customer).toBe(customer.id);
		expect(session.subscription).toBeNull();
		expect(session.amount_total).toBe(3 * 4900);
		expect(session.livemode).toBe(false);
		expect(session.url).toBe(`${harness.standin.url}/checkout/${session.id}`);
		const retrieved = await harness.stripe.checkout.sessions.retrieve(session.id);
		expect(retrieved).toEqual(session);
	});

	it('refuses a price that does not exist, naming the field', async () => {
		const plan = await seatPlan(harness.stripe);
		await expect(
			harness.stripe.checkout.sessions.create({
				mode: 'subscription',
				customer: plan.customer.id,
				line_items: [{ price: 'price_missing', quantity: 1 }],
				success_url: 'http://127.0.0.1:3000/done'
			})
		).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'line_items[0][price]', statusCode: 404 });
	});

	it('refuses a quantity below one, naming the field', async () => {
		const plan = await seatPlan(harness.stripe);
		await expect(
			harness.stripe.checkout.sessions.create({
				mode: 'subscription',
				line_items: [{ price: plan.price.id, quantity: 0 }],
				success_url: 'http://127.0.0.1:3000/done'
			})
		).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'line_items[0][quantity]', statusCode: 400 });
	});

	it('refuses a success_url that is not http(s), naming the field', async () => {
		const plan = await seatPlan(harness.stripe);
		await expect(
			harness.stripe.checkout.sessions.create({
				mode: 'subscription',
				line_items: [{ price: plan.price.id, quantity: 1 }],
				success_url: 'javascript:alert(1)'
			})
		).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'success_url', code: 'url_invalid' });
	});
});

describe('checkout page', () => {
	it('says it is the local stand-in and shows plan, price, seats, total and the three buttons', async () => {
		const { session } = await openSession(4);
		const page = await (await fetch(session.url!)).text();
		expect(page).toContain('Local Stripe stand-in checkout');
		expect(page).toContain('Tidewright Team');
		expect(page).toContain('GBP 49.00 per seat per month');
		expect(page).toMatch(/Seats<\/th><td>4</);
		expect(page).toContain('GBP 196.00');
		expect(page).toContain('Pay with the test card');
		expect(page).toContain('Pay with a card that is declined');
		expect(page).toContain('Cancel and go back');
		expect(page).not.toContain('<script');
	});

	it('escapes the product name it echoes', async () => {
		const product = await harness.stripe.products.create({ name: '<b>Reef & "Co"</b>' });
		const price = await harness.stripe.prices.create({
			product: product.id,
			unit_amount: 100,
			currency: 'gbp',
			recurring: { interval: 'month' }
		});
		const session = await harness.stripe.checkout.sessions.create({
			mode: 'subscription',
			line_items: [{ price: price.id, quantity: 1 }],
			success_url: 'http://127.0.0.1:3000/done'
		});
		const page = await (await fetch(session.url!)).text();
		expect(page).toContain('&lt;b&gt;Reef &amp; &quot;Co&quot;&lt;/b&gt;');
		expect(page).not.toContain('<b>Reef');
	});
});

describe('payCheckout', () => {
	it('delivers subscription created, invoice paid, session completed, in that order, before the 303 to success_url', async () => {
		const { session, customer } = await openSession(3);
		const response = await harness.submitForm(`/checkout/${session.id}/pay`, { card: 'working' });
		// Read the receiver at once: the deliveries must already have happened.
		const typesAtRedirect = harness.receiver.types();
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe(`http://127.0.0.1:3000/billing/done?session=${session.id}`);
		expect(typesAtRedirect).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);

		const completed = await harness.stripe.checkout.sessions.retrieve(session.id);
		expect(completed.status).toBe('complete');
		expect(completed.payment_status).toBe('paid');
		expect(completed.subscription).toMatch(/^sub_/);

		const subscription = await harness.stripe.subscriptions.retrieve(completed.subscription as string);
		expect(subscription.status).toBe('active');
		expect(subscription.customer).toBe(customer.id);
		expect(subscription.metadata).toEqual({ workspace_id: 'ws_kelpford', seats_by: 'tomas.okafor' });
		expect(subscription.cancel_at_period_end).toBe(false);
		const item = subscription.items.data[0];
		expect(item.quantity).toBe(3);
		expect(item.price.id).toBe((await harness.stripe.prices.list()).data[0].id);
		const start = new Date(item.current_period_start * 1000);
		const end = new Date(item.current_period_end * 1000);
		expect(end.getUTCMonth()).toBe((start.getUTCMonth() + 1) % 12);

		const invoice = await harness.stripe.invoices.retrieve(subscription.latest_invoice as string);
		expect(invoice.status).toBe('paid');
		expect(invoice.amount_due).toBe(14700);
		expect(invoice.amount_paid).toBe(14700);
		expect(invoice.billing_reason).toBe('subscription_create');
		expect(invoice.parent?.subscription_details?.subscription).toBe(subscription.id);

		const [created, paid, done] = harness.receiver.received.map((r) => r.event);
		expect(created.data.object).toMatchObject({ id: subscription.id, status: 'active' });
		expect(paid.data.object).toMatchObject({ id: invoice.id, status: 'paid' });
		expect(done.data.object).toMatchObject({ id: session.id, status: 'complete', client_reference_id: 'ws_kelpford' });
	});

	it('keeps the session open and shows "Your card was declined" for the declined card', async () => {
		const { session } = await openSession();
		const response = await harness.submitForm(`/checkout/${session.id}/pay`, { card: 'declining' });
		expect(response.status).toBe(303);
		const back = new URL(response.headers.get('location')!, harness.standin.url);
		expect(back.pathname).toBe(`/checkout/${session.id}`);
		const page = await (await fetch(back)).text();
		expect(page).toContain('Your card was declined');
		expect(page).toContain('Pay with the test card');
		expect((await harness.stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
		expect((await harness.stripe.subscriptions.list({ status: 'all' })).data).toHaveLength(0);
		expect(harness.receiver.received).toHaveLength(0);
	});

	it('sends the browser to cancel_url on "Cancel and go back" and leaves the session open', async () => {
		const { session } = await openSession();
		const response = await harness.submitForm(`/checkout/${session.id}/cancel`);
		expect(response.status).toBe(303);
		expect(response.headers.get('location')).toBe('http://127.0.0.1:3000/billing?canceled=1');
		expect((await harness.stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
	});

	it('will not take a second payment for a completed session', async () => {
		const { session } = await openSession();
		await harness.submitForm(`/checkout/${session.id}/pay`, { card: 'working' });
		const again = await harness.submitForm(`/checkout/${session.id}/pay`, { card: 'working' });
		expect(again.status).toBe(400);
		expect(await again.text()).toContain('complete, not open');
		expect((await harness.stripe.subscriptions.list()).data).toHaveLength(1);
	});
});
