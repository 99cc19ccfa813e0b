/**
 * Subscription invoices: their lines, finalizing one (number, credit balance),
 * charging the card on file, and previews of what would be billed.
 */
import type Stripe from 'stripe';
import { addBillingIntervals } from './clock';
import { StandinError } from './errors';
import { formatAmount, lineAmount } from './money';
import { isBillingInterval, newInvoice, newInvoiceLine, type BillingInterval } from './objects';
import { prorationAmount } from './proration';
import { newId, type StandinState, type SubscriptionRecord } from './state';

/** The stand-in keeps one item per subscription, as Tidewright sells one seat price. */
export function onlyItem(subscription: Stripe.Subscription): Stripe.SubscriptionItem {
	const item = subscription.items.data[0];
	if (!item) throw new Error(`subscription ${subscription.id} has no item`);
	return item;
}

export function recurringOf(price: Stripe.Price): { interval: BillingInterval; intervalCount: number } {
	const interval = price.recurring?.interval;
	if (!isBillingInterval(interval)) {
		throw new StandinError(400, `The price ${price.id} is not a recurring price`, 'price');
	}
	return { interval, intervalCount: price.recurring?.interval_count ?? 1 };
}

/** Start and end of period `index` counted from the subscription's billing cycle anchor. */
export function periodBounds(record: SubscriptionRecord, index: number): { start: number; end: number } {
	const { interval, intervalCount } = recurringOf(onlyItem(record.subscription).price);
	const anchor = record.subscription.billing_cycle_anchor;
	return {
		start: addBillingIntervals(anchor, interval, index * intervalCount),
		end: addBillingIntervals(anchor, interval, (index + 1) * intervalCount)
	};
}

function productName(state: StandinState, price: Stripe.Price): string {
	const productId = typeof price.product === 'string' ? price.product : price.product.id;
	return state.products.get(productId)?.name ?? price.nickname ?? productId;
}

/** The charge for one full period of the item at `quantity` seats. */
export function periodLine(
	state: StandinState,
	subscription: Stripe.Subscription,
	quantity: number,
	period: { start: number; end: number }
): Stripe.InvoiceLineItem {
	const item = onlyItem(subscription);
	const price = item.price;
	const unitAmount = price.unit_amount ?? 0;
	return newInvoiceLine({
		id: newId('il'),
		invoice: null,
		amount: lineAmount(unitAmount, quantity),
		currency: price.currency,
		description: `${quantity} × ${productName(state, price)} (at ${formatAmount(unitAmount, price.currency)} / ${price.recurring?.interval ?? 'period'})`,
		quantity,
		periodStart: period.start,
		periodEnd: period.end,
		price,
		subscription: subscription.id,
		subscriptionItem: item.id,
		proration: false
	});
}

/** The prorated difference for a seat change at `at`, over what is left of the current period. */
export function prorationLine(
	state: StandinState,
	subscription: Stripe.Subscription,
	newQuantity: number,
	at: number
): Stripe.InvoiceLineItem {
	const item = onlyItem(subscription);
	const price = item.price;
	const oldQuantity = item.quantity ?? 1;
	const amount = prorationAmount({
		unitAmount: price.unit_amount ?? 0,
		oldQuantity,
		newQuantity,
		periodStart: item.current_period_start,
		periodEnd: item.current_period_end,
		at
	});
	const until = new Date(item.current_period_end * 1000).toISOString().slice(0, 10);
	return newInvoiceLine({
		id: newId('il'),
		invoice: null,
		amount,
		currency: price.currency,
		description: `Seats ${oldQuantity} → ${newQuantity} × ${productName(state, price)}, prorated until ${until}`,
		quantity: Math.abs(newQuantity - oldQuantity),
		periodStart: at,
		periodEnd: item.current_period_end,
		price,
		subscription: subscription.id,
		subscriptionItem: item.id,
		proration: true
	});
}

/**
 * Finalizes a subscription invoice: numbers it, spends the customer's credit,
 * stores it as the subscription's latest invoice. An invoice with nothing due
 * is paid at once, as Stripe does.
 */
export function finalizeInvoice(
	state: StandinState,
	record: SubscriptionRecord,
	input: {
		lines: Stripe.InvoiceLineItem[];
		billingReason: Stripe.Invoice.BillingReason;
		periodStart: number;
		periodEnd: number;
	}
): Stripe.Invoice {
	const subscription = record.subscription;
	const customer = state.customer(subscription.customer as string);
	const sequence = customer.next_invoice_sequence ?? 1;
	const id = newId('in');
	const now = state.clock.now();
	const invoice = newInvoice({
		id,
		created: now,
		customer,
		subscription,
		number: `${customer.invoice_prefix}-${String(sequence).padStart(4, '0')}`,
		billingReason: input.billingReason,
		lines: input.lines.map((line) => ({ ...line, invoice: id })),
		periodStart: input.periodStart,
		periodEnd: input.periodEnd,
		startingBalance: customer.balance,
		hostedInvoiceUrl: `${state.baseUrl}/invoice/${id}`
	});
	customer.next_invoice_sequence = sequence + 1;
	customer.balance = invoice.ending_balance ?? 0;
	if (invoice.amount_due === 0) markPaid(invoice, now);
	state.invoices.set(id, invoice);
	subscription.latest_invoice = id;
	return invoice;
}

function markPaid(invoice: Stripe.Invoice, at: number): void {
	invoice.status = 'paid';
	invoice.amount_paid = invoice.amount_due;
	invoice.amount_remaining = 0;
	invoice.next_payment_attempt = null;
	invoice.status_transitions = { ...invoice.status_transitions, paid_at: at };
}

/** Charges the customer's card on file for an open invoice; true when it is paid. */
export function chargeInvoice(state: StandinState, invoice: Stripe.Invoice): boolean {
	if (invoice.status === 'paid') return true;
	invoice.attempted = true;
	invoice.attempt_count += 1;
	if (state.card(invoice.customer as string) === 'working') {
		markPaid(invoice, state.clock.now());
		return true;
	}
	invoice.next_payment_attempt = null;
	return false;
}

export interface PreviewRequest {
	record: SubscriptionRecord;
	/** The seat count after the change; undefined for no change. */
	newQuantity?: number;
	prorationBehavior: 'none' | 'always_invoice' | 'create_prorations';
	at: number;
}

/**
 * What Stripe would bill: with always_invoice and a seat change, the invoice
 * made at once for the prorated difference; otherwise the next renewal invoice
 * (period_end = the renewal date), with waiting prorations and, for
 * create_prorations, this change's proration.
 */
export function previewInvoice(state: StandinState, request: PreviewRequest): Stripe.Invoice {
	const { record, newQuantity, at } = request;
	const subscription = record.subscription;
	const item = onlyItem(subscription);
	const customer = state.customer(subscription.customer as string);
	const changesSeats = newQuantity !== undefined && newQuantity !== (item.quantity ?? 1);
	const common = {
		id: newId('upcoming_in'),
		customer,
		subscription,
		number: null,
		startingBalance: customer.balance,
		hostedInvoiceUrl: null
	};

	if (changesSeats && request.prorationBehavior === 'always_invoice') {
		return asPreview(
			newInvoice({
				...common,
				created: at,
				billingReason: 'subscription_update',
				lines: [prorationLine(state, subscription, newQuantity, at)],
				periodStart: at,
				periodEnd: at
			})
		);
	}

	if (subscription.status === 'canceled' || subscription.cancel_at_period_end) {
		throw new StandinError(
			404,
			`No upcoming invoices for customer: ${customer.id}: the subscription ends at the close of its period`,
			'subscription',
			'invoice_upcoming_none'
		);
	}
	const lines = [...record.pendingProrations];
	if (changesSeats && request.prorationBehavior === 'create_prorations') {
		lines.push(prorationLine(state, subscription, newQuantity, at));
	}
	lines.push(periodLine(state, subscription, newQuantity ?? item.quantity ?? 1, periodBounds(record, record.periodIndex + 1)));
	const invoice = newInvoice({
		...common,
		created: item.current_period_end,
		billingReason: 'upcoming',
		lines,
		periodStart: item.current_period_start,
		periodEnd: item.current_period_end
	});
	invoice.next_payment_attempt = item.current_period_end;
	return asPreview(invoice);
}

function asPreview(invoice: Stripe.Invoice): Stripe.Invoice {
	invoice.status = 'draft';
	invoice.status_transitions = { ...invoice.status_transitions, finalized_at: null };
	return invoice;
}
