/**
 * Everything the stand-in knows, in memory: the objects it has served, the
 * extra facts real Stripe keeps out of sight (which card a customer has, which
 * billing period a subscription is in), and the events it has sent.
 */
import type Stripe from 'stripe';
import { randomBytes } from 'node:crypto';
import { missingResource } from './errors';
import type { StandinClock } from './clock';

/** The card a customer has on file: the working test card, one that is declined, or none yet. */
export type CardOnFile = 'none' | 'working' | 'declining';

export interface CheckoutRecord {
	session: Stripe.Checkout.Session;
	priceId: string;
	quantity: number;
	subscriptionMetadata: Stripe.Metadata;
}

export interface SubscriptionRecord {
	subscription: Stripe.Subscription;
	/** Which period since the billing cycle anchor is current: 0 for the first. */
	periodIndex: number;
	/** Proration lines waiting for the next renewal invoice (proration_behavior create_prorations). */
	pendingProrations: Stripe.InvoiceLineItem[];
}

const ID_ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

/** An id in Stripe's style: prefix plus 24 random letters and digits. */
export function newId(prefix: string): string {
	const bytes = randomBytes(24);
	let tail = '';
	for (const byte of bytes) tail += ID_ALPHABET[byte % ID_ALPHABET.length];
	return `${prefix}_${tail}`;
}

export class StandinState {
	readonly customers = new Map<string, Stripe.Customer>();
	readonly cards = new Map<string, CardOnFile>();
	readonly products = new Map<string, Stripe.Product>();
	readonly prices = new Map<string, Stripe.Price>();
	readonly subscriptions = new Map<string, SubscriptionRecord>();
	readonly invoices = new Map<string, Stripe.Invoice>();
	readonly checkoutSessions = new Map<string, CheckoutRecord>();
	readonly portalSessions = new Map<string, Stripe.BillingPortal.Session>();
	/** Oldest first. */
	readonly events: Stripe.Event[] = [];

	constructor(
		readonly clock: StandinClock,
		/** Where the stand-in's own pages are served, e.g. http://127.0.0.1:54327 */
		public baseUrl: string
	) {}

	clear(): void {
		for (const map of [
			this.customers,
			this.cards,
			this.products,
			this.prices,
			this.subscriptions,
			this.invoices,
			this.checkoutSessions,
			this.portalSessions
		]) {
			map.clear();
		}
		this.events.length = 0;
	}

	customer(id: string, param = 'customer'): Stripe.Customer {
		const customer = this.customers.get(id);
		if (!customer) throw missingResource('customer', id, param);
		return customer;
	}

	product(id: string, param = 'product'): Stripe.Product {
		const product = this.products.get(id);
		if (!product) throw missingResource('product', id, param);
		return product;
	}

	price(id: string, param = 'price'): Stripe.Price {
		const price = this.prices.get(id);
		if (!price) throw missingResource('price', id, param);
		return price;
	}

	subscriptionRecord(id: string, param = 'subscription'): SubscriptionRecord {
		const record = this.subscriptions.get(id);
		if (!record) throw missingResource('subscription', id, param);
		return record;
	}

	invoice(id: string, param = 'invoice'): Stripe.Invoice {
		const invoice = this.invoices.get(id);
		if (!invoice) throw missingResource('invoice', id, param);
		return invoice;
	}

	checkout(id: string, param = 'session'): CheckoutRecord {
		const record = this.checkoutSessions.get(id);
		if (!record) throw missingResource('checkout.session', id, param);
		return record;
	}

	portalSession(id: string): Stripe.BillingPortal.Session {
		const session = this.portalSessions.get(id);
		if (!session) throw missingResource('billing_portal.session', id);
		return session;
	}

	event(id: string): Stripe.Event {
		const event = this.events.find((e) => e.id === id);
		if (!event) throw missingResource('event', id);
		return event;
	}

	card(customerId: string): CardOnFile {
		return this.cards.get(customerId) ?? 'none';
	}

	/** Any stored object by id, for `expand[]`. */
	findById(id: string): object | undefined {
		return (
			this.customers.get(id) ??
			this.products.get(id) ??
			this.prices.get(id) ??
			this.subscriptions.get(id)?.subscription ??
			this.invoices.get(id) ??
			this.checkoutSessions.get(id)?.session
		);
	}

	subscriptionsOf(customerId: string): Stripe.Subscription[] {
		return [...this.subscriptions.values()]
			.map((record) => record.subscription)
			.filter((subscription) => subscription.customer === customerId);
	}

	invoicesOf(customerId: string): Stripe.Invoice[] {
		return [...this.invoices.values()].filter((invoice) => invoice.customer === customerId);
	}
}

/** A deep copy as it would travel on the wire (what an event carries). */
export function snapshot<T>(object: T): T {
	return JSON.parse(JSON.stringify(object)) as T;
}
