/**
 * Puts the demo's paid subscriptions into the Stripe stand-in, whose state
 * lives in memory and starts empty on every `npm start`: for each workspace
 * the seed marks as paid (seeds/05_plans_and_billing.ts) whose Stripe
 * customer the stand-in does not know, it opens a Checkout Session, pays it
 * on the stand-in's page as a browser would, and reads the subscription and
 * its invoice back into PostgreSQL.
 *
 *   tsx --tsconfig scripts/tsconfig.json scripts/demo-billing.ts
 *   (env: DATABASE_URL, STRIPE_* and ORIGIN as `npm start` sets them)
 */
import { db, closeDb } from '../src/lib/server/db/knex';
import { getBillingAccount, linkCustomer } from '../src/lib/server/db/billing';
import { stripe } from '../src/lib/server/billing/stripe-client';
import { offeredPrice, stripePriceId } from '../src/lib/server/billing/subscription';
import { syncInvoice, syncSubscription } from '../src/lib/server/billing/sync';
import { demoSubscriptions } from '../seeds/05_plans_and_billing';

async function knownToStripe(customerId: string): Promise<boolean> {
	try {
		const customer = await stripe().customers.retrieve(customerId);
		return !('deleted' in customer && customer.deleted);
	} catch {
		return false;
	}
}

async function payOnStandinPage(checkoutUrl: string): Promise<void> {
	const response = await fetch(`${checkoutUrl}/pay`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded' },
		body: 'card=working',
		redirect: 'manual'
	});
	if (response.status !== 303) throw new Error(`the stand-in's checkout answered ${response.status}`);
}

async function restoreDemoSubscription(demo: (typeof demoSubscriptions)[number], origin: string): Promise<string | null> {
	const workspace = await db()('workspaces').select('id', 'name').where({ slug: demo.slug }).first();
	if (!workspace) return null;
	const account = await getBillingAccount(workspace.id);
	if (account && (await knownToStripe(account.customerId))) return null;
	// A stand-in restarted since: forget the billing rows it no longer backs, and make them again.
	await db()('billing_invoices').where({ workspace_id: workspace.id }).delete();
	await db()('billing_accounts').where({ workspace_id: workspace.id }).delete();

	const customer = await stripe().customers.create({ email: demo.ownerEmail, name: workspace.name, metadata: { workspace_id: workspace.id } });
	await linkCustomer(workspace.id, customer.id);
	const price = await offeredPrice(demo.plan);
	const session = await stripe().checkout.sessions.create({
		mode: 'subscription',
		customer: customer.id,
		client_reference_id: workspace.id,
		line_items: [{ price: await stripePriceId(price), quantity: demo.seats }],
		success_url: `${origin}/app/w/${workspace.id}/billing?checkout={CHECKOUT_SESSION_ID}`,
		cancel_url: `${origin}/app/w/${workspace.id}/billing?checkout=cancelled`,
		metadata: { workspace_id: workspace.id },
		subscription_data: { metadata: { workspace_id: workspace.id } }
	});
	await payOnStandinPage(session.url!);
	const paid = await stripe().checkout.sessions.retrieve(session.id);
	const subscriptionId = typeof paid.subscription === 'string' ? paid.subscription : paid.subscription?.id;
	if (!subscriptionId) throw new Error(`checkout ${session.id} did not make a subscription`);
	await syncSubscription(subscriptionId);
	for (const invoice of (await stripe().invoices.list({ customer: customer.id, limit: 10 })).data) await syncInvoice(invoice);
	return `${workspace.name}: ${demo.plan} plan, ${demo.seats} seats`;
}

const origin = process.env.ORIGIN ?? 'http://127.0.0.1:3000';
try {
	for (const demo of demoSubscriptions) {
		const done = await restoreDemoSubscription(demo, origin);
		if (done) console.log(`[billing] demo subscription in the Stripe stand-in: ${done}`);
	}
} catch (error) {
	console.error('[billing] the demo subscriptions could not be made:', error instanceof Error ? error.message : error);
	process.exitCode = 1;
} finally {
	await closeDb();
}
