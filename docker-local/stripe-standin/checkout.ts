/**
 * Checkout Sessions in subscription mode: made by the app, paid (or declined,
 * or left) on the stand-in's checkout page, expired after 24 hours.
 */
import type Stripe from 'stripe';
import { StandinError } from './errors';
import type { Emit } from './events';
import { recurringOf } from './invoices';
import { lineAmount } from './money';
import { newCheckoutSession, newCustomer } from './objects';
import { newId, type CheckoutRecord, type StandinState } from './state';
import { setCard, startSubscription } from './subscriptions';

const SESSION_LIFETIME_SECONDS = 24 * 60 * 60;

export interface CheckoutRequest {
	customerId: string | null;
	customerEmail: string | null;
	priceId: string;
	quantity: number;
	successUrl: string;
	cancelUrl: string | null;
	clientReferenceId: string | null;
	metadata: Stripe.Metadata;
	subscriptionMetadata: Stripe.Metadata;
}

export function createCheckoutSession(state: StandinState, request: CheckoutRequest): Stripe.Checkout.Session {
	if (request.customerId) state.customer(request.customerId);
	const price = state.price(request.priceId, 'line_items[0][price]');
	if (!price.active) throw new StandinError(400, `The price ${price.id} is not active`, 'line_items[0][price]');
	recurringOf(price);
	const id = newId('cs_test');
	const now = state.clock.now();
	const session = newCheckoutSession({
		id,
		created: now,
		expiresAt: now + SESSION_LIFETIME_SECONDS,
		customer: request.customerId,
		customerEmail: request.customerId ? null : request.customerEmail,
		currency: price.currency,
		amountTotal: lineAmount(price.unit_amount ?? 0, request.quantity),
		successUrl: request.successUrl,
		cancelUrl: request.cancelUrl,
		clientReferenceId: request.clientReferenceId,
		metadata: request.metadata,
		url: `${state.baseUrl}/checkout/${id}`
	});
	state.checkoutSessions.set(id, {
		session,
		priceId: price.id,
		quantity: request.quantity,
		subscriptionMetadata: request.subscriptionMetadata
	});
	return session;
}

export function assertOpen(record: CheckoutRecord): void {
	if (record.session.status !== 'open') {
		throw new StandinError(400, `This Checkout Session is ${record.session.status}, not open`, 'session', 'checkout_session_not_open');
	}
}

/**
 * Pays with the working test card: the customer (made now if the session had
 * none) gets the card, the subscription starts with a paid first invoice, the
 * session completes. Events: customer.subscription.created, invoice.paid,
 * checkout.session.completed.
 */
export function payCheckout(state: StandinState, emit: Emit, sessionId: string): Stripe.Checkout.Session {
	const record = state.checkout(sessionId);
	assertOpen(record);
	const session = record.session;
	const customerId = (session.customer as string | null) ?? createCheckoutCustomer(state, session).id;
	setCard(state, customerId, 'working');
	const customer = state.customer(customerId);
	const { subscription, invoice } = startSubscription(state, {
		customerId,
		priceId: record.priceId,
		quantity: record.quantity,
		metadata: record.subscriptionMetadata
	});
	session.customer = customerId;
	session.status = 'complete';
	session.payment_status = 'paid';
	session.subscription = subscription.id;
	session.invoice = invoice.id;
	session.customer_details = {
		address: null,
		business_name: null,
		email: customer.email,
		individual_name: null,
		name: customer.name ?? null,
		phone: null,
		tax_exempt: 'none',
		tax_ids: []
	};
	emit('customer.subscription.created', subscription);
	emit('invoice.paid', invoice);
	emit('checkout.session.completed', session);
	return session;
}

function createCheckoutCustomer(state: StandinState, session: Stripe.Checkout.Session): Stripe.Customer {
	const customer = newCustomer({
		id: newId('cus'),
		created: state.clock.now(),
		email: session.customer_email,
		name: null,
		metadata: {},
		invoicePrefix: invoicePrefix()
	});
	state.customers.set(customer.id, customer);
	return customer;
}

export function invoicePrefix(): string {
	return newId('x').slice(2, 10).toUpperCase().replace(/[^A-Z0-9]/g, 'X');
}

/** Where the browser goes after paying: success_url with {CHECKOUT_SESSION_ID} filled in, as Stripe does. */
export function successRedirect(session: Stripe.Checkout.Session): string {
	return (session.success_url ?? '').replaceAll('{CHECKOUT_SESSION_ID}', session.id);
}

/** Open sessions whose 24 hours have run out by `now` expire (checkout.session.expired). */
export function expireSessions(state: StandinState, emit: Emit, now: number): void {
	for (const { session } of state.checkoutSessions.values()) {
		if (session.status !== 'open' || session.expires_at > now) continue;
		session.status = 'expired';
		session.url = null;
		emit('checkout.session.expired', session);
	}
}
