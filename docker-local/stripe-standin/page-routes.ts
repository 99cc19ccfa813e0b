/**
 * The pages a browser visits: checkout (pay, declined card, cancel), the
 * billing portal (cancel at period end, resume, switch card) and invoices.
 * Every form posts and is answered with a 303, after the webhooks for what
 * it changed have been delivered.
 */
import type Stripe from 'stripe';
import { assertOpen, payCheckout, successRedirect } from './checkout';
import type { StandinContext } from './context';
import { StandinError } from './errors';
import type { FormObject } from './form-body';
import { onlyItem } from './invoices';
import { checkoutPage, homePage, invoicePage, portalPage, type PortalSubscriptionView } from './pages';
import { optionalEnum, requiredString } from './params';
import { html, redirect, type Reply } from './reply';
import type { StandinState } from './state';
import { switchCard, updateSubscription } from './subscriptions';

function productName(state: StandinState, price: Stripe.Price): string {
	const productId = typeof price.product === 'string' ? price.product : price.product.id;
	return state.products.get(productId)?.name ?? productId;
}

function checkoutView(context: StandinContext, id: string, declined: boolean): Reply {
	const record = context.state.checkout(id, 'session');
	const price = context.state.price(record.priceId);
	return html(
		200,
		checkoutPage({ session: record.session, price, productName: productName(context.state, price), quantity: record.quantity, declined })
	);
}

async function payAtCheckout(context: StandinContext, id: string, form: FormObject): Promise<Reply> {
	const card = optionalEnum(form, 'card', ['working', 'declining'] as const) ?? 'working';
	const record = context.state.checkout(id, 'session');
	assertOpen(record);
	if (card === 'declining') return redirect(`/checkout/${encodeURIComponent(id)}?declined=1`);
	const session = await context.run(null, (emit) => payCheckout(context.state, emit, id));
	return redirect(successRedirect(session));
}

function cancelCheckout(context: StandinContext, id: string): Reply {
	const { session } = context.state.checkout(id, 'session');
	return redirect(session.cancel_url ?? `/checkout/${encodeURIComponent(id)}`);
}

/** The customer's subscriptions still running, or the latest ended one when none is. */
function portalSubscriptions(state: StandinState, customerId: string): PortalSubscriptionView[] {
	const all = state.subscriptionsOf(customerId).sort((a, b) => b.created - a.created);
	const running = all.filter((subscription) => subscription.status !== 'canceled');
	return (running.length > 0 ? running : all.slice(0, 1)).map((subscription) => {
		const item = onlyItem(subscription);
		return { subscription, item, productName: productName(state, item.price) };
	});
}

const portalNotices: Record<string, string> = {
	canceled: 'Your subscription will end at the close of the current period.',
	resumed: 'Your subscription will renew as before.',
	working: 'Card updated: payments will go through.',
	declining: 'Card updated: payments with this card will be declined.'
};

function portalView(context: StandinContext, id: string, done: string | null): Reply {
	const state = context.state;
	const session = state.portalSession(id);
	const customer = state.customer(session.customer);
	return html(
		200,
		portalPage({
			session,
			customer,
			card: state.card(customer.id),
			subscriptions: portalSubscriptions(state, customer.id),
			invoices: state.invoicesOf(customer.id).sort((a, b) => b.created - a.created),
			notice: done ? (portalNotices[done] ?? null) : null
		})
	);
}

async function portalAction(context: StandinContext, id: string, action: string, form: FormObject): Promise<Reply> {
	const state = context.state;
	const session = state.portalSession(id);
	const back = (done: string) => redirect(`/portal/${encodeURIComponent(id)}?done=${done}`);
	if (action === 'card') {
		const card = optionalEnum(form, 'card', ['working', 'declining'] as const);
		if (!card) throw new StandinError(400, 'Choose a card', 'card');
		await context.run(null, (emit) => switchCard(state, emit, session.customer, card));
		return back(card);
	}
	const subscriptionId = requiredString(form, 'subscription');
	const record = state.subscriptionRecord(subscriptionId);
	if (record.subscription.customer !== session.customer) {
		throw new StandinError(404, 'This subscription does not belong to this portal session', 'subscription');
	}
	const cancelAtPeriodEnd = action === 'cancel';
	await context.run(null, (emit) =>
		updateSubscription(state, emit, subscriptionId, {
			cancelAtPeriodEnd,
			prorationBehavior: 'none',
			paymentBehavior: 'allow_incomplete'
		})
	);
	return back(cancelAtPeriodEnd ? 'canceled' : 'resumed');
}

function homeView(context: StandinContext): Reply {
	const state = context.state;
	return html(
		200,
		homePage({
			now: state.clock.now(),
			webhookUrl: context.webhooks.url,
			counts: {
				Customers: state.customers.size,
				Prices: state.prices.size,
				Subscriptions: state.subscriptions.size,
				Invoices: state.invoices.size,
				Events: state.events.length
			}
		})
	);
}

/** The page route for `method path`, or null when there is none. */
export async function handlePageRoute(
	context: StandinContext,
	method: string,
	url: URL,
	form: FormObject
): Promise<Reply | null> {
	const path = url.pathname;
	if (method === 'GET' && path === '/') return homeView(context);
	const match = /^\/(checkout|portal|invoice)\/([^/]+)(?:\/([a-z-]+))?$/.exec(path);
	if (!match) return null;
	const [, area, rawId, action] = match;
	const id = decodeURIComponent(rawId);
	if (area === 'checkout') {
		if (method === 'GET' && !action) return checkoutView(context, id, url.searchParams.has('declined'));
		if (method === 'POST' && action === 'pay') return payAtCheckout(context, id, form);
		if (method === 'POST' && action === 'cancel') return cancelCheckout(context, id);
	}
	if (area === 'portal') {
		if (method === 'GET' && !action) return portalView(context, id, url.searchParams.get('done'));
		if (method === 'POST' && (action === 'cancel' || action === 'resume' || action === 'card')) {
			return portalAction(context, id, action, form);
		}
	}
	if (area === 'invoice' && method === 'GET' && !action) return html(200, invoicePage(context.state.invoice(id)));
	return null;
}
