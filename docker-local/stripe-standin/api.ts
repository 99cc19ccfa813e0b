/**
 * The `/v1` routes the app calls, read from the SDK's form-encoded parameters
 * and answered with stored objects (expanded on request). Anything else is a
 * 404 in Stripe's error shape, naming the route.
 */
import type Stripe from 'stripe';
import { createCheckoutSession, invoicePrefix } from './checkout';
import { StandinError, missingResource } from './errors';
import type { Emit } from './events';
import type { FormObject } from './form-body';
import { onlyItem, previewInvoice } from './invoices';
import { apiList, isBillingInterval, newCustomer, newPortalSession, newPrice, newProduct } from './objects';
import {
	applyMetadata,
	expandPaths,
	listOfObjects,
	missing,
	optionalBoolean,
	optionalEnum,
	optionalInteger,
	optionalMetadata,
	optionalNullableString,
	optionalObject,
	optionalString,
	optionalStringList,
	optionalUrl,
	requiredString,
	requiredUrl
} from './params';
import { newId, snapshot, type StandinState } from './state';
import { cancelSubscriptionNow, updateSubscription } from './subscriptions';

export interface ApiCall {
	method: string;
	path: string;
	params: FormObject;
	emit: Emit;
}

type Handler = (state: StandinState, call: ApiCall, pathArgs: string[]) => object;

const prorationBehaviors = ['none', 'always_invoice', 'create_prorations'] as const;
const paymentBehaviors = ['allow_incomplete', 'error_if_incomplete', 'pending_if_incomplete', 'default_incomplete'] as const;
const subscriptionStatuses = ['active', 'past_due', 'canceled', 'incomplete', 'incomplete_expired', 'trialing', 'unpaid', 'paused', 'all', 'ended'] as const;

function idOf(value: string | { id: string } | null): string | null {
	return typeof value === 'string' || value === null ? value : value.id;
}

/** Stripe's list envelope over items given newest first: limit (1..100, default 10) and starting_after. */
function page<T extends { id?: string | null }>(items: T[], params: FormObject, url: string): Stripe.ApiList<T> {
	const limit = optionalInteger(params, 'limit', 'limit', { min: 1, max: 100 }) ?? 10;
	const after = optionalString(params, 'starting_after');
	let start = 0;
	if (after) {
		const index = items.findIndex((item) => item.id === after);
		if (index === -1) throw new StandinError(400, `starting_after ${after} is not in this list`, 'starting_after');
		start = index + 1;
	}
	const data = items.slice(start, start + limit);
	return apiList(data, url, start + limit < items.length);
}

function newestFirst<T>(items: Iterable<T>): T[] {
	return [...items].reverse();
}

// --- customers -------------------------------------------------------------

const createCustomer: Handler = (state, { params }) => {
	const customer = newCustomer({
		id: newId('cus'),
		created: state.clock.now(),
		email: optionalNullableString(params, 'email') ?? null,
		name: optionalNullableString(params, 'name') ?? null,
		metadata: applyMetadata({}, optionalMetadata(params)),
		invoicePrefix: invoicePrefix()
	});
	customer.description = optionalNullableString(params, 'description') ?? null;
	state.customers.set(customer.id, customer);
	return customer;
};

const updateCustomer: Handler = (state, { params }, [id]) => {
	const customer = state.customer(id, 'id');
	const email = optionalNullableString(params, 'email');
	const name = optionalNullableString(params, 'name');
	const description = optionalNullableString(params, 'description');
	const metadata = optionalMetadata(params);
	if (email !== undefined) customer.email = email;
	if (name !== undefined) customer.name = name;
	if (description !== undefined) customer.description = description;
	customer.metadata = applyMetadata(customer.metadata, metadata);
	return customer;
};

const listCustomers: Handler = (state, { params }) => {
	const email = optionalString(params, 'email');
	const customers = newestFirst(state.customers.values()).filter((c) => email === undefined || c.email === email);
	return page(customers, params, '/v1/customers');
};

// --- products and prices ---------------------------------------------------

const createProduct: Handler = (state, { params }) => {
	const id = optionalString(params, 'id') ?? newId('prod');
	if (state.products.has(id)) throw new StandinError(400, `Product already exists: ${id}`, 'id', 'resource_already_exists');
	const product = newProduct({
		id,
		created: state.clock.now(),
		name: requiredString(params, 'name'),
		description: optionalNullableString(params, 'description') ?? null,
		metadata: applyMetadata({}, optionalMetadata(params))
	});
	product.active = optionalBoolean(params, 'active') ?? true;
	state.products.set(id, product);
	return product;
};

/** A lookup key belongs to one price; moving it needs transfer_lookup_key=true, as on Stripe. */
function claimLookupKey(state: StandinState, lookupKey: string, transfer: boolean, priceId: string): void {
	for (const price of state.prices.values()) {
		if (price.lookup_key !== lookupKey || price.id === priceId) continue;
		if (!transfer) {
			throw new StandinError(
				400,
				`A price (${price.id}) already uses the lookup key ${lookupKey}; pass transfer_lookup_key=true to move it`,
				'lookup_key',
				'lookup_key_already_exists'
			);
		}
		price.lookup_key = null;
	}
}

const createPrice: Handler = (state, { params }) => {
	const productId = requiredString(params, 'product');
	state.product(productId);
	const unitAmount = optionalInteger(params, 'unit_amount', 'unit_amount', { min: 0 });
	if (unitAmount === undefined) throw missing('unit_amount');
	const currency = requiredString(params, 'currency').toLowerCase();
	if (!/^[a-z]{3}$/.test(currency)) throw new StandinError(400, `Invalid currency: ${currency}`, 'currency');
	const recurring = optionalObject(params, 'recurring');
	if (!recurring) throw new StandinError(400, 'The stand-in serves recurring prices only: recurring[interval] is required', 'recurring[interval]', 'parameter_missing');
	const interval = requiredString(recurring, 'interval', 'recurring[interval]');
	if (!isBillingInterval(interval)) {
		throw new StandinError(400, 'Invalid recurring[interval]: must be one of day, week, month, year', 'recurring[interval]');
	}
	const id = newId('price');
	const lookupKey = optionalNullableString(params, 'lookup_key') ?? null;
	const transferLookupKey = optionalBoolean(params, 'transfer_lookup_key') ?? false;
	const price = newPrice({
		id,
		created: state.clock.now(),
		product: productId,
		unitAmount,
		currency,
		interval,
		intervalCount: optionalInteger(recurring, 'interval_count', 'recurring[interval_count]', { min: 1, max: 36 }) ?? 1,
		lookupKey,
		nickname: optionalNullableString(params, 'nickname') ?? null,
		metadata: applyMetadata({}, optionalMetadata(params))
	});
	price.active = optionalBoolean(params, 'active') ?? true;
	if (lookupKey) claimLookupKey(state, lookupKey, transferLookupKey, id);
	state.prices.set(id, price);
	return price;
};

const updatePrice: Handler = (state, { params }, [id]) => {
	const price = state.price(id, 'id');
	const active = optionalBoolean(params, 'active');
	const nickname = optionalNullableString(params, 'nickname');
	const lookupKey = optionalNullableString(params, 'lookup_key');
	const transferLookupKey = optionalBoolean(params, 'transfer_lookup_key') ?? false;
	const metadata = optionalMetadata(params);
	if (lookupKey) claimLookupKey(state, lookupKey, transferLookupKey, id);
	if (active !== undefined) price.active = active;
	if (nickname !== undefined) price.nickname = nickname;
	if (lookupKey !== undefined) price.lookup_key = lookupKey;
	price.metadata = applyMetadata(price.metadata, metadata);
	return price;
};

const listPrices: Handler = (state, { params }) => {
	const lookupKeys = optionalStringList(params, 'lookup_keys');
	const active = optionalBoolean(params, 'active');
	const product = optionalString(params, 'product');
	const prices = newestFirst(state.prices.values()).filter(
		(price) =>
			(lookupKeys === undefined || (price.lookup_key !== null && lookupKeys.includes(price.lookup_key))) &&
			(active === undefined || price.active === active) &&
			(product === undefined || idOf(price.product) === product)
	);
	return page(prices, params, '/v1/prices');
};

// --- checkout and portal ---------------------------------------------------

const createCheckout: Handler = (state, { params }) => {
	const mode = requiredString(params, 'mode');
	if (mode !== 'subscription') {
		throw new StandinError(400, 'The stand-in serves Checkout in subscription mode only', 'mode');
	}
	const lineItems = listOfObjects(params, 'line_items');
	if (lineItems.length !== 1) {
		throw new StandinError(400, 'The stand-in takes exactly one line item (the seat price)', 'line_items');
	}
	const quantity = optionalInteger(lineItems[0], 'quantity', 'line_items[0][quantity]', { min: 1, max: 10_000 }) ?? 1;
	const subscriptionData = optionalObject(params, 'subscription_data') ?? {};
	const customerId = optionalString(params, 'customer') ?? null;
	const customerEmail = optionalString(params, 'customer_email') ?? null;
	if (customerId && customerEmail) {
		throw new StandinError(400, 'You may only specify one of these parameters: customer, customer_email.', 'customer_email');
	}
	return createCheckoutSession(state, {
		customerId,
		customerEmail,
		priceId: requiredString(lineItems[0], 'price', 'line_items[0][price]'),
		quantity,
		successUrl: requiredUrl(params, 'success_url'),
		cancelUrl: optionalUrl(params, 'cancel_url') ?? null,
		clientReferenceId: optionalString(params, 'client_reference_id') ?? null,
		metadata: applyMetadata({}, optionalMetadata(params)),
		subscriptionMetadata: applyMetadata({}, optionalMetadata(subscriptionData, 'metadata', 'subscription_data[metadata]'))
	});
};

const expireCheckout: Handler = (state, { emit }, [id]) => {
	const { session } = state.checkout(id, 'id');
	if (session.status !== 'open') {
		throw new StandinError(400, `Only open Checkout Sessions can be expired; this one is ${session.status}`, undefined, 'checkout_session_not_open');
	}
	session.status = 'expired';
	session.url = null;
	emit('checkout.session.expired', session);
	return session;
};

const createPortalSession: Handler = (state, { params }) => {
	const customer = state.customer(requiredString(params, 'customer'));
	const id = newId('bps');
	const session = newPortalSession({
		id,
		created: state.clock.now(),
		customer: customer.id,
		returnUrl: optionalUrl(params, 'return_url') ?? null,
		url: `${state.baseUrl}/portal/${id}`
	});
	state.portalSessions.set(id, session);
	return session;
};

// --- subscriptions and invoices ---------------------------------------------

const listSubscriptions: Handler = (state, { params }) => {
	const customer = optionalString(params, 'customer');
	const status = optionalEnum(params, 'status', subscriptionStatuses);
	const price = optionalString(params, 'price');
	const subscriptions = newestFirst(state.subscriptions.values())
		.map((record) => record.subscription)
		.filter(
			(s) =>
				(customer === undefined || s.customer === customer) &&
				(price === undefined || onlyItem(s).price.id === price) &&
				(status === 'all' ||
					(status === undefined && s.status !== 'canceled' && s.status !== 'incomplete_expired') ||
					(status === 'ended' && (s.status === 'canceled' || s.status === 'incomplete_expired')) ||
					s.status === status)
		);
	return page(subscriptions, params, '/v1/subscriptions');
};

/** Seat changes arrive as items[0][id] + items[0][quantity]; the stand-in changes seats only, not the price. */
function seatChange(
	state: StandinState,
	subscription: Stripe.Subscription,
	items: FormObject[],
	param: string
): { itemId: string; quantity: number } | undefined {
	if (items.length === 0) return undefined;
	if (items.length > 1) throw new StandinError(400, 'The stand-in keeps one item per subscription', param);
	const item = onlyItem(subscription);
	const itemId = requiredString(items[0], 'id', `${param}[0][id]`);
	if (itemId !== item.id) {
		throw new StandinError(400, `The subscription ${subscription.id} has no item ${itemId}`, `${param}[0][id]`, 'resource_missing');
	}
	const price = optionalString(items[0], 'price', `${param}[0][price]`);
	if (price !== undefined && price !== item.price.id) {
		throw new StandinError(400, 'The stand-in changes seat counts only, not the price', `${param}[0][price]`);
	}
	const quantity = optionalInteger(items[0], 'quantity', `${param}[0][quantity]`, { min: 0, max: 10_000 });
	return quantity === undefined ? undefined : { itemId, quantity };
}

const changeSubscription: Handler = (state, { params, emit }, [id]) => {
	const subscription = state.subscriptionRecord(id, 'id').subscription;
	return updateSubscription(state, emit, id, {
		seats: seatChange(state, subscription, listOfObjects(params, 'items'), 'items'),
		prorationBehavior: optionalEnum(params, 'proration_behavior', prorationBehaviors) ?? 'create_prorations',
		prorationDate: optionalInteger(params, 'proration_date'),
		paymentBehavior: optionalEnum(params, 'payment_behavior', paymentBehaviors) ?? 'allow_incomplete',
		cancelAtPeriodEnd: optionalBoolean(params, 'cancel_at_period_end'),
		metadata: optionalMetadata(params)
	});
};

const previewInvoiceHandler: Handler = (state, { params }) => {
	const subscriptionId = optionalString(params, 'subscription');
	if (!subscriptionId) {
		throw new StandinError(400, 'The stand-in previews invoices of an existing subscription: subscription is required', 'subscription', 'parameter_missing');
	}
	const record = state.subscriptionRecord(subscriptionId);
	const customer = optionalString(params, 'customer');
	if (customer !== undefined && customer !== record.subscription.customer) {
		throw new StandinError(400, `The subscription ${subscriptionId} does not belong to the customer ${customer}`, 'customer');
	}
	const details = optionalObject(params, 'subscription_details') ?? {};
	const seats = seatChange(
		state,
		record.subscription,
		listOfObjects(details, 'items', 'subscription_details[items]'),
		'subscription_details[items]'
	);
	return previewInvoice(state, {
		record,
		newQuantity: seats?.quantity,
		prorationBehavior:
			optionalEnum(details, 'proration_behavior', prorationBehaviors, 'subscription_details[proration_behavior]') ??
			'create_prorations',
		at: optionalInteger(details, 'proration_date', 'subscription_details[proration_date]') ?? state.clock.now()
	});
};

const listInvoices: Handler = (state, { params }) => {
	const customer = optionalString(params, 'customer');
	const subscription = optionalString(params, 'subscription');
	const status = optionalString(params, 'status');
	const invoices = newestFirst(state.invoices.values()).filter(
		(invoice) =>
			(customer === undefined || invoice.customer === customer) &&
			(subscription === undefined || idOf(invoice.parent?.subscription_details?.subscription ?? null) === subscription) &&
			(status === undefined || invoice.status === status)
	);
	return page(invoices, params, '/v1/invoices');
};

// --- events ------------------------------------------------------------------

const listEvents: Handler = (state, { params }) => {
	const type = optionalString(params, 'type');
	const types = optionalStringList(params, 'types');
	const matches = (eventType: string) =>
		(type === undefined || (type.endsWith('*') ? eventType.startsWith(type.slice(0, -1)) : eventType === type)) &&
		(types === undefined || types.includes(eventType));
	return page(newestFirst(state.events).filter((event) => matches(event.type)), params, '/v1/events');
};

const routes: Array<[string, RegExp, Handler]> = [
	['POST', /^\/v1\/customers$/, createCustomer],
	['GET', /^\/v1\/customers$/, listCustomers],
	['GET', /^\/v1\/customers\/([^/]+)$/, (state, _call, [id]) => state.customer(id, 'id')],
	['POST', /^\/v1\/customers\/([^/]+)$/, updateCustomer],
	['POST', /^\/v1\/products$/, createProduct],
	['GET', /^\/v1\/products\/([^/]+)$/, (state, _call, [id]) => state.product(id, 'id')],
	['POST', /^\/v1\/prices$/, createPrice],
	['GET', /^\/v1\/prices$/, listPrices],
	['GET', /^\/v1\/prices\/([^/]+)$/, (state, _call, [id]) => state.price(id, 'id')],
	['POST', /^\/v1\/prices\/([^/]+)$/, updatePrice],
	['POST', /^\/v1\/checkout\/sessions$/, createCheckout],
	['GET', /^\/v1\/checkout\/sessions\/([^/]+)$/, (state, _call, [id]) => state.checkout(id, 'id').session],
	['POST', /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/, expireCheckout],
	['POST', /^\/v1\/billing_portal\/sessions$/, createPortalSession],
	['GET', /^\/v1\/subscriptions$/, listSubscriptions],
	['GET', /^\/v1\/subscriptions\/([^/]+)$/, (state, _call, [id]) => state.subscriptionRecord(id, 'id').subscription],
	['POST', /^\/v1\/subscriptions\/([^/]+)$/, changeSubscription],
	['DELETE', /^\/v1\/subscriptions\/([^/]+)$/, (state, { emit }, [id]) => cancelSubscriptionNow(state, emit, id)],
	['POST', /^\/v1\/invoices\/create_preview$/, previewInvoiceHandler],
	['GET', /^\/v1\/invoices$/, listInvoices],
	['GET', /^\/v1\/invoices\/([^/]+)$/, (state, _call, [id]) => state.invoice(id, 'id')],
	['GET', /^\/v1\/events$/, listEvents],
	['GET', /^\/v1\/events\/([^/]+)$/, (state, _call, [id]) => state.event(id)]
];

/**
 * Replaces the id at each dotted path with the stored object (`data.product`
 * on a list, `latest_invoice` on a subscription). Works on a copy, so stored
 * objects keep their ids.
 */
function expand(state: StandinState, target: unknown, path: string[], fullPath: string): unknown {
	if (Array.isArray(target)) return target.map((entry) => expand(state, entry, path, fullPath));
	if (target === null || typeof target !== 'object') return target;
	const [head, ...rest] = path;
	const record = target as Record<string, unknown>;
	if (!(head in record)) throw new StandinError(400, `This property cannot be expanded (${fullPath}).`, 'expand');
	let value = record[head];
	if (typeof value === 'string' && rest.length === 0) {
		const found = state.findById(value);
		if (!found) throw missingResource('object', value, 'expand');
		value = snapshot(found);
	}
	record[head] = rest.length === 0 ? value : expand(state, value, rest, fullPath);
	return record;
}

export function handleApiCall(state: StandinState, call: ApiCall): object {
	for (const [method, pattern, handler] of routes) {
		const match = pattern.exec(call.path);
		if (!match) continue;
		if (method !== call.method) continue;
		const args = match.slice(1).map((arg) => decodeURIComponent(arg));
		const result = snapshot(handler(state, call, args));
		for (const path of expandPaths(call.params)) expand(state, result, path.split('.'), path);
		return result;
	}
	throw new StandinError(404, `Unrecognized request URL (${call.method}: ${call.path}). The local Stripe stand-in serves only the routes Tidewright calls.`);
}
