/**
 * Builders for the objects the stand-in serves, typed as the stripe SDK's own
 * objects: when a new SDK major changes a shape, these stop compiling.
 * Pure: ids and times come in as arguments. Fields the stand-in has no use for
 * get Stripe's "nothing set" value (null, false, [] or {}).
 */
import Stripe from 'stripe';

export const billingIntervals = ['day', 'week', 'month', 'year'] as const;
export type BillingInterval = (typeof billingIntervals)[number];

export function isBillingInterval(value: string | undefined): value is BillingInterval {
	return (billingIntervals as readonly (string | undefined)[]).includes(value);
}

const livemode = false;

export function apiList<T>(data: T[], url: string, hasMore = false): Stripe.ApiList<T> {
	return { object: 'list', data, has_more: hasMore, url };
}

export function newCustomer(input: {
	id: string;
	created: number;
	email: string | null;
	name: string | null;
	metadata: Stripe.Metadata;
	invoicePrefix: string;
}): Stripe.Customer {
	return {
		id: input.id,
		object: 'customer',
		address: null,
		balance: 0,
		created: input.created,
		currency: null,
		default_source: null,
		delinquent: false,
		description: null,
		discount: null,
		email: input.email,
		invoice_prefix: input.invoicePrefix,
		invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
		livemode,
		metadata: input.metadata,
		name: input.name,
		next_invoice_sequence: 1,
		phone: null,
		preferred_locales: [],
		shipping: null,
		tax_exempt: 'none',
		test_clock: null
	};
}

export function newProduct(input: {
	id: string;
	created: number;
	name: string;
	description: string | null;
	metadata: Stripe.Metadata;
}): Stripe.Product {
	return {
		id: input.id,
		object: 'product',
		active: true,
		created: input.created,
		default_price: null,
		description: input.description,
		images: [],
		livemode,
		marketing_features: [],
		metadata: input.metadata,
		name: input.name,
		package_dimensions: null,
		shippable: null,
		statement_descriptor: null,
		tax_code: null,
		tax_details: null,
		type: 'service',
		unit_label: null,
		updated: input.created,
		url: null
	};
}

export function newPrice(input: {
	id: string;
	created: number;
	product: string;
	unitAmount: number;
	currency: string;
	interval: BillingInterval;
	intervalCount: number;
	lookupKey: string | null;
	nickname: string | null;
	metadata: Stripe.Metadata;
}): Stripe.Price {
	return {
		id: input.id,
		object: 'price',
		active: true,
		billing_scheme: 'per_unit',
		created: input.created,
		currency: input.currency,
		custom_unit_amount: null,
		livemode,
		lookup_key: input.lookupKey,
		metadata: input.metadata,
		nickname: input.nickname,
		product: input.product,
		recurring: {
			interval: input.interval,
			interval_count: input.intervalCount,
			meter: null,
			trial_period_days: null,
			usage_type: 'licensed'
		},
		tax_behavior: 'unspecified',
		tiers_mode: null,
		transform_quantity: null,
		type: 'recurring',
		unit_amount: input.unitAmount,
		unit_amount_decimal: Stripe.Decimal.from(input.unitAmount)
	};
}

/** The legacy plan view of a recurring price, still carried on subscription items. */
export function planFromPrice(price: Stripe.Price): Stripe.Plan {
	const recurring = price.recurring;
	if (!recurring) throw new Error(`price ${price.id} is not recurring`);
	return {
		id: price.id,
		object: 'plan',
		active: price.active,
		amount: price.unit_amount,
		amount_decimal: price.unit_amount_decimal,
		billing_scheme: 'per_unit',
		created: price.created,
		currency: price.currency,
		interval: recurring.interval,
		interval_count: recurring.interval_count,
		livemode,
		metadata: price.metadata,
		meter: null,
		nickname: price.nickname,
		product: typeof price.product === 'string' ? price.product : price.product.id,
		tiers_mode: null,
		transform_usage: null,
		trial_period_days: null,
		usage_type: 'licensed'
	};
}

export function newSubscriptionItem(input: {
	id: string;
	created: number;
	subscription: string;
	price: Stripe.Price;
	quantity: number;
	periodStart: number;
	periodEnd: number;
}): Stripe.SubscriptionItem {
	return {
		id: input.id,
		object: 'subscription_item',
		billing_thresholds: null,
		created: input.created,
		current_period_end: input.periodEnd,
		current_period_start: input.periodStart,
		current_trial: null,
		discounts: [],
		metadata: {},
		plan: planFromPrice(input.price),
		price: input.price,
		quantity: input.quantity,
		subscription: input.subscription,
		tax_rates: []
	};
}

export function newSubscription(input: {
	id: string;
	created: number;
	customer: string;
	currency: string;
	item: Stripe.SubscriptionItem;
	metadata: Stripe.Metadata;
	latestInvoice: string | null;
	defaultPaymentMethod: string | null;
}): Stripe.Subscription {
	return {
		id: input.id,
		object: 'subscription',
		application: null,
		application_fee_percent: null,
		automatic_tax: { disabled_reason: null, enabled: false, liability: null },
		billing_cycle_anchor: input.item.current_period_start,
		billing_cycle_anchor_config: null,
		billing_mode: { flexible: null, type: 'classic' },
		billing_schedules: [],
		billing_thresholds: null,
		cancel_at: null,
		cancel_at_period_end: false,
		canceled_at: null,
		cancellation_details: { comment: null, feedback: null, feedback_option: null, reason: null },
		collection_method: 'charge_automatically',
		created: input.created,
		currency: input.currency,
		customer: input.customer,
		customer_account: null,
		days_until_due: null,
		default_payment_method: input.defaultPaymentMethod,
		default_source: null,
		default_tax_rates: [],
		description: null,
		discounts: [],
		ended_at: null,
		invoice_settings: {
			account_tax_ids: null,
			custom_fields: null,
			description: null,
			footer: null,
			issuer: { type: 'self' }
		},
		items: apiList([input.item], `/v1/subscription_items?subscription=${input.id}`),
		latest_invoice: input.latestInvoice,
		livemode,
		managed_payments: null,
		metadata: input.metadata,
		next_pending_invoice_item_invoice: null,
		on_behalf_of: null,
		pause_collection: null,
		payment_settings: { payment_method_options: null, payment_method_types: null, save_default_payment_method: 'off' },
		pending_invoice_item_interval: null,
		pending_setup_intent: null,
		pending_update: null,
		schedule: null,
		start_date: input.created,
		status: 'active',
		test_clock: null,
		transfer_data: null,
		trial_end: null,
		trial_settings: { end_behavior: { billing_cycle_anchor: null, missing_payment_method: 'create_invoice' } },
		trial_start: null
	};
}

export function newInvoiceLine(input: {
	id: string;
	invoice: string | null;
	amount: number;
	currency: string;
	description: string;
	quantity: number;
	periodStart: number;
	periodEnd: number;
	price: Stripe.Price;
	subscription: string;
	subscriptionItem: string;
	proration: boolean;
}): Stripe.InvoiceLineItem {
	const product = typeof input.price.product === 'string' ? input.price.product : input.price.product.id;
	return {
		id: input.id,
		object: 'line_item',
		amount: input.amount,
		currency: input.currency,
		description: input.description,
		discount_amounts: [],
		discountable: !input.proration,
		discounts: [],
		invoice: input.invoice,
		livemode,
		metadata: {},
		parent: {
			type: 'subscription_item_details',
			invoice_item_details: null,
			subscription_item_details: {
				invoice_item: null,
				proration: input.proration,
				proration_details: input.proration ? { credited_items: null } : null,
				subscription: input.subscription,
				subscription_item: input.subscriptionItem
			}
		},
		period: { start: input.periodStart, end: input.periodEnd },
		pretax_credit_amounts: [],
		pricing: {
			type: 'price_details',
			price_details: { price: input.price.id, product },
			unit_amount_decimal: input.price.unit_amount_decimal
		},
		quantity: input.quantity,
		quantity_decimal: Stripe.Decimal.from(input.quantity),
		subscription: input.subscription,
		subtotal: input.amount,
		taxes: []
	};
}

export interface InvoiceTotals {
	/** Sum of the lines; negative for a credit. */
	total: number;
	/** The customer's balance before this invoice (negative = credit held). */
	startingBalance: number;
}

/**
 * A finalized subscription invoice. A credit balance is spent first; what is
 * left is amount_due. A negative total leaves amount_due 0 and adds to the credit.
 */
export function newInvoice(input: {
	id: string;
	created: number;
	customer: Stripe.Customer;
	subscription: Stripe.Subscription;
	number: string | null;
	billingReason: Stripe.Invoice.BillingReason;
	lines: Stripe.InvoiceLineItem[];
	periodStart: number;
	periodEnd: number;
	startingBalance: number;
	hostedInvoiceUrl: string | null;
}): Stripe.Invoice {
	const total = input.lines.reduce((sum, line) => sum + line.amount, 0);
	const afterBalance = total + input.startingBalance;
	const amountDue = Math.max(0, afterBalance);
	return {
		id: input.id,
		object: 'invoice',
		account_country: null,
		account_name: 'Local Stripe stand-in',
		account_tax_ids: null,
		amount_due: amountDue,
		amount_overpaid: 0,
		amount_paid: 0,
		amount_remaining: amountDue,
		amount_shipping: 0,
		application: null,
		attempt_count: 0,
		attempted: false,
		auto_advance: true,
		automatic_tax: { disabled_reason: null, enabled: false, liability: null, provider: null, status: null },
		automatically_finalizes_at: null,
		billing_reason: input.billingReason,
		collection_method: 'charge_automatically',
		created: input.created,
		currency: input.subscription.currency,
		custom_fields: null,
		customer: input.customer.id,
		customer_account: null,
		customer_address: null,
		customer_email: input.customer.email,
		customer_name: input.customer.name ?? null,
		customer_phone: null,
		customer_shipping: null,
		customer_tax_exempt: 'none',
		customer_tax_ids: [],
		default_payment_method: null,
		default_source: null,
		default_tax_rates: [],
		description: null,
		discounts: [],
		due_date: null,
		effective_at: input.created,
		ending_balance: Math.min(0, afterBalance),
		footer: null,
		from_invoice: null,
		hosted_invoice_url: input.hostedInvoiceUrl,
		invoice_pdf: null,
		issuer: { type: 'self' },
		last_finalization_error: null,
		latest_revision: null,
		lines: apiList(input.lines, `/v1/invoices/${input.id}/lines`),
		livemode,
		metadata: {},
		next_payment_attempt: null,
		number: input.number,
		on_behalf_of: null,
		parent: {
			type: 'subscription_details',
			quote_details: null,
			subscription_details: { metadata: input.subscription.metadata, subscription: input.subscription.id }
		},
		payment_settings: { default_mandate: null, payment_method_options: null, payment_method_types: null },
		period_end: input.periodEnd,
		period_start: input.periodStart,
		post_payment_credit_notes_amount: 0,
		pre_payment_credit_notes_amount: 0,
		receipt_number: null,
		rendering: null,
		shipping_cost: null,
		shipping_details: null,
		starting_balance: input.startingBalance,
		statement_descriptor: null,
		status: 'open',
		status_transitions: { finalized_at: input.created, marked_uncollectible_at: null, paid_at: null, voided_at: null },
		subtotal: total,
		subtotal_excluding_tax: total,
		test_clock: null,
		total,
		total_discount_amounts: [],
		total_excluding_tax: total,
		total_pretax_credit_amounts: [],
		total_taxes: [],
		webhooks_delivered_at: null
	};
}

export function newCheckoutSession(input: {
	id: string;
	created: number;
	expiresAt: number;
	customer: string | null;
	customerEmail: string | null;
	currency: string;
	amountTotal: number;
	successUrl: string;
	cancelUrl: string | null;
	clientReferenceId: string | null;
	metadata: Stripe.Metadata;
	url: string;
}): Stripe.Checkout.Session {
	return {
		id: input.id,
		object: 'checkout.session',
		adaptive_pricing: null,
		after_expiration: null,
		allow_promotion_codes: null,
		allowed_payment_method_types: null,
		amount_subtotal: input.amountTotal,
		amount_total: input.amountTotal,
		automatic_tax: { enabled: false, liability: null, provider: null, status: null },
		billing_address_collection: null,
		cancel_url: input.cancelUrl,
		client_reference_id: input.clientReferenceId,
		client_secret: null,
		collected_information: null,
		consent: null,
		consent_collection: null,
		created: input.created,
		currency: input.currency,
		currency_conversion: null,
		custom_fields: [],
		custom_text: { after_submit: null, shipping_address: null, submit: null, terms_of_service_acceptance: null },
		customer: input.customer,
		customer_account: null,
		customer_creation: input.customer ? null : 'always',
		customer_details: null,
		customer_email: input.customerEmail,
		discounts: [],
		expires_at: input.expiresAt,
		integration_identifier: null,
		invoice: null,
		invoice_creation: null,
		livemode,
		locale: null,
		managed_payments: null,
		metadata: input.metadata,
		mode: 'subscription',
		optional_items: null,
		origin_context: null,
		payment_intent: null,
		payment_link: null,
		payment_method_collection: 'always',
		payment_method_configuration_details: null,
		payment_method_options: null,
		payment_method_types: ['card'],
		payment_status: 'unpaid',
		permissions: null,
		recovered_from: null,
		saved_payment_method_options: null,
		setup_intent: null,
		shipping_address_collection: null,
		shipping_cost: null,
		shipping_options: [],
		status: 'open',
		submit_type: null,
		subscription: null,
		success_url: input.successUrl,
		total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
		ui_mode: 'hosted_page',
		url: input.url,
		wallet_options: null
	};
}

export function newPortalSession(input: {
	id: string;
	created: number;
	customer: string;
	returnUrl: string | null;
	url: string;
}): Stripe.BillingPortal.Session {
	return {
		id: input.id,
		object: 'billing_portal.session',
		configuration: 'bpc_local_standin',
		created: input.created,
		customer: input.customer,
		customer_account: null,
		flow: null,
		livemode,
		locale: null,
		on_behalf_of: null,
		return_url: input.returnUrl,
		url: input.url
	};
}
