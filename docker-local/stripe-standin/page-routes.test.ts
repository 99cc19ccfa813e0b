import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startHarness, subscribeThroughCheckout, type Harness } from './test-harness';

let harness: Harness;

beforeAll(async () => {
	harness = await startHarness();
});
afterAll(async () => harness.stop());
beforeEach(async () => {
	await harness.control('/_standin/reset', {});
	harness.receiver.clear();
});

async function portalFor(customer: string, returnUrl = 'http://127.0.0.1:3000/billing') {
	return harness.stripe.billingPortal.sessions.create({ customer, return_url: returnUrl });
}

describe('billingPortal.sessions.create', () => {
	it('answers a session whose url is the stand-in portal page', async () => {
		const { customer } = await subscribeThroughCheckout(harness, 3);
		const portal = await portalFor(customer.id);
		expect(portal).toMatchObject({ object: 'billing_portal.session', customer: customer.id, livemode: false, return_url: 'http://127.0.0.1:3000/billing' });
		expect(portal.url).toBe(`${harness.standin.url}/portal/${portal.id}`);
		await expect(harness.stripe.billingPortal.sessions.create({ customer: 'cus_nobody' })).rejects.toMatchObject({ statusCode: 404, param: 'customer' });
	});
});

describe('portal page', () => {
	it('shows plan, seats, status, next renewal, card, invoices and the way back', async () => {
		const { customer, subscription } = await subscribeThroughCheckout(harness, 3);
		const page = await (await fetch((await portalFor(customer.id)).url)).text();
		expect(page).toContain('Local Stripe stand-in billing portal');
		expect(page).toContain('Tidewright Team');
		expect(page).toMatch(/Seats<\/th><td>3</);
		expect(page).toMatch(/Status<\/th><td>active</);
		const renewal = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' }).format(
			new Date(subscription.items.data[0].current_period_end * 1000)
		);
		expect(page).toContain(`Renews on ${renewal}`);
		expect(page).toContain('Test card ending 4242');
		expect(page).toContain('GBP 147.00');
		expect(page).toContain('Cancel at the end of the period');
		expect(page).toContain('Use a card that will be declined');
		expect(page).toContain('Use the working test card');
		expect(page).toContain('<a href="http://127.0.0.1:3000/billing">Return to Tidewright</a>');
		expect(page).not.toContain('<script');
	});

	it('escapes the return URL and customer name it echoes', async () => {
		const customer = await harness.stripe.customers.create({ name: '<i>Ola</i>' });
		const page = await (await fetch((await portalFor(customer.id, 'http://127.0.0.1:3000/b?x="><script>')).url)).text();
		expect(page).toContain('&lt;i&gt;Ola&lt;/i&gt;');
		expect(page).toContain('href="http://127.0.0.1:3000/b?x=&quot;&gt;&lt;script&gt;"');
		expect(page).not.toContain('<script>');
	});

	it('refuses a return URL that is not http(s), so no script URL reaches the page', async () => {
		const customer = await harness.stripe.customers.create({ name: 'Ola' });
		await expect(portalFor(customer.id, 'javascript:alert(1)')).rejects.toMatchObject({ statusCode: 400, param: 'return_url' });
	});

	it('cancels at period end and resumes, delivering customer.subscription.updated before each redirect', async () => {
		const { customer, subscription } = await subscribeThroughCheckout(harness, 3);
		harness.receiver.clear();
		const portal = await portalFor(customer.id);
		const canceled = await harness.submitForm(`/portal/${portal.id}/cancel`, { subscription: subscription.id });
		expect(canceled.status).toBe(303);
		expect(harness.receiver.types()).toEqual(['customer.subscription.updated']);
		expect((await harness.stripe.subscriptions.retrieve(subscription.id)).cancel_at_period_end).toBe(true);
		const page = await (await fetch(new URL(canceled.headers.get('location')!, harness.standin.url))).text();
		expect(page).toContain('will end at the close of the current period');
		expect(page).toContain('Resume the subscription');

		const resumed = await harness.submitForm(`/portal/${portal.id}/resume`, { subscription: subscription.id });
		expect(resumed.status).toBe(303);
		expect(harness.receiver.types()).toEqual(['customer.subscription.updated', 'customer.subscription.updated']);
		expect((await harness.stripe.subscriptions.retrieve(subscription.id)).cancel_at_period_end).toBe(false);
	});

	it('will not touch another customer’s subscription', async () => {
		const mine = await subscribeThroughCheckout(harness, 1);
		const theirs = await subscribeThroughCheckout(harness, 1);
		const portal = await portalFor(mine.customer.id);
		const response = await harness.submitForm(`/portal/${portal.id}/cancel`, { subscription: theirs.subscription.id });
		expect(response.status).toBe(404);
		expect((await harness.stripe.subscriptions.retrieve(theirs.subscription.id)).cancel_at_period_end).toBe(false);
	});

	it('answers unknown pages with 404', async () => {
		expect((await fetch(`${harness.standin.url}/portal/bps_nothing`)).status).toBe(404);
		expect((await fetch(`${harness.standin.url}/checkout/cs_test_nothing`)).status).toBe(404);
		expect((await fetch(`${harness.standin.url}/elsewhere`)).status).toBe(404);
	});
});
