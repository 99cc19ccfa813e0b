/**
 * What happens to a subscription: it starts from a paid Checkout Session,
 * changes seats or its end, is cancelled, renews when its period ends, and
 * recovers when the customer fixes their card. Each function changes the
 * state first and emits the events Stripe would, in order.
 */
import type Stripe from 'stripe';
import { StandinError, cardDeclined } from './errors';
import { previousAttributes, type Emit } from './events';
import { chargeInvoice, finalizeInvoice, onlyItem, periodBounds, periodLine, prorationLine, recurringOf } from './invoices';
import { newSubscription, newSubscriptionItem } from './objects';
import { applyMetadata, type MetadataUpdate } from './params';
import { newId, snapshot, type CardOnFile, type StandinState, type SubscriptionRecord } from './state';
import { addBillingIntervals } from './clock';

function cancellationReason(reason: Stripe.Subscription.CancellationDetails.Reason | null): Stripe.Subscription.CancellationDetails {
	return { comment: null, feedback: null, feedback_option: null, reason };
}

/** Stripe's own test payment methods for the two cards the stand-in offers. */
const paymentMethodIds: Record<Exclude<CardOnFile, 'none'>, string> = {
	working: 'pm_card_visa',
	declining: 'pm_card_chargeDeclined'
};

export function setCard(state: StandinState, customerId: string, card: Exclude<CardOnFile, 'none'>): void {
	const customer = state.customer(customerId);
	state.cards.set(customerId, card);
	customer.invoice_settings = { ...customer.invoice_settings, default_payment_method: paymentMethodIds[card] };
}

export function startSubscription(
	state: StandinState,
	input: { customerId: string; priceId: string; quantity: number; metadata: Stripe.Metadata }
): { subscription: Stripe.Subscription; invoice: Stripe.Invoice } {
	const now = state.clock.now();
	const price = state.price(input.priceId);
	const { interval, intervalCount } = recurringOf(price);
	const id = newId('sub');
	const item = newSubscriptionItem({
		id: newId('si'),
		created: now,
		subscription: id,
		price,
		quantity: input.quantity,
		periodStart: now,
		periodEnd: addBillingIntervals(now, interval, intervalCount)
	});
	const customer = state.customer(input.customerId);
	const subscription = newSubscription({
		id,
		created: now,
		customer: customer.id,
		currency: price.currency,
		item,
		metadata: input.metadata,
		latestInvoice: null,
		defaultPaymentMethod: (customer.invoice_settings.default_payment_method as string | null) ?? null
	});
	const record: SubscriptionRecord = { subscription, periodIndex: 0, pendingProrations: [] };
	state.subscriptions.set(id, record);
	const invoice = finalizeInvoice(state, record, {
		lines: [periodLine(state, subscription, input.quantity, { start: now, end: item.current_period_end })],
		billingReason: 'subscription_create',
		periodStart: now,
		periodEnd: now
	});
	if (!chargeInvoice(state, invoice)) subscription.status = 'incomplete';
	return { subscription, invoice };
}

export interface SubscriptionChange {
	seats?: { itemId: string; quantity: number };
	prorationBehavior: 'none' | 'always_invoice' | 'create_prorations';
	/** The moment the proration is computed for (Stripe's proration_date); default now. */
	prorationDate?: number;
	paymentBehavior: 'allow_incomplete' | 'error_if_incomplete' | 'pending_if_incomplete' | 'default_incomplete';
	cancelAtPeriodEnd?: boolean;
	metadata?: MetadataUpdate;
}

export function updateSubscription(
	state: StandinState,
	emit: Emit,
	id: string,
	change: SubscriptionChange
): Stripe.Subscription {
	const record = state.subscriptionRecord(id, 'id');
	const subscription = record.subscription;
	const item = onlyItem(subscription);
	if (subscription.status === 'canceled' && (change.seats || change.cancelAtPeriodEnd !== undefined)) {
		throw new StandinError(400, 'A canceled subscription can only update its cancellation_details and metadata.', undefined, 'resource_invalid_state');
	}
	if (change.seats && change.seats.itemId !== item.id) {
		throw new StandinError(400, `The subscription ${id} has no item ${change.seats.itemId}`, 'items[0][id]', 'resource_missing');
	}
	const now = state.clock.now();
	const prorationDate = change.prorationDate ?? now;
	if (
		change.prorationDate !== undefined &&
		(prorationDate < item.current_period_start || prorationDate > item.current_period_end)
	) {
		throw new StandinError(400, 'proration_date must fall within the current billing period', 'proration_date');
	}
	const oldQuantity = item.quantity ?? 1;
	const newQuantity = change.seats?.quantity ?? oldQuantity;
	const proration =
		newQuantity !== oldQuantity && change.prorationBehavior !== 'none'
			? prorationLine(state, subscription, newQuantity, prorationDate)
			: null;
	const invoiceNow = proration && change.prorationBehavior === 'always_invoice';
	if (
		invoiceNow &&
		change.paymentBehavior === 'error_if_incomplete' &&
		proration.amount + state.customer(subscription.customer as string).balance > 0 &&
		state.card(subscription.customer as string) !== 'working'
	) {
		throw cardDeclined();
	}

	const before = snapshot(subscription);
	item.quantity = newQuantity;
	if (change.cancelAtPeriodEnd === true && !subscription.cancel_at_period_end) {
		subscription.cancel_at_period_end = true;
		subscription.cancel_at = item.current_period_end;
		subscription.canceled_at = now;
		subscription.cancellation_details = cancellationReason('cancellation_requested');
	} else if (change.cancelAtPeriodEnd === false && subscription.cancel_at_period_end) {
		subscription.cancel_at_period_end = false;
		subscription.cancel_at = null;
		subscription.canceled_at = null;
		subscription.cancellation_details = cancellationReason(null);
	}
	subscription.metadata = applyMetadata(subscription.metadata, change.metadata);

	let invoice: Stripe.Invoice | null = null;
	let paid = true;
	if (proration && invoiceNow) {
		invoice = finalizeInvoice(state, record, {
			lines: [proration],
			billingReason: 'subscription_update',
			periodStart: now,
			periodEnd: now
		});
		paid = chargeInvoice(state, invoice);
		if (!paid) subscription.status = 'past_due';
	} else if (proration) {
		record.pendingProrations.push(proration);
	}

	const changed = previousAttributes(before, subscription);
	if (Object.keys(changed).length > 0) emit('customer.subscription.updated', subscription, changed);
	if (invoice) {
		if (paid) emit('invoice.paid', invoice);
		else emit('invoice.payment_failed', invoice);
	}
	return subscription;
}

export function cancelSubscriptionNow(state: StandinState, emit: Emit, id: string): Stripe.Subscription {
	const record = state.subscriptionRecord(id, 'id');
	const subscription = record.subscription;
	if (subscription.status === 'canceled') {
		throw new StandinError(400, `The subscription ${id} is already canceled.`, undefined, 'resource_invalid_state');
	}
	const now = state.clock.now();
	subscription.status = 'canceled';
	subscription.canceled_at = now;
	subscription.ended_at = now;
	subscription.cancel_at = null;
	subscription.cancel_at_period_end = false;
	subscription.cancellation_details = cancellationReason('cancellation_requested');
	record.pendingProrations = [];
	emit('customer.subscription.deleted', subscription);
	return subscription;
}

/**
 * The subscription's period has ended (the clock stands at its end): it ends
 * if set to cancel at period end; otherwise the next period starts and its
 * invoice is charged, leaving the subscription active or past due.
 */
export function renewSubscription(state: StandinState, emit: Emit, record: SubscriptionRecord): void {
	const subscription = record.subscription;
	const item = onlyItem(subscription);
	if (subscription.cancel_at_period_end) {
		subscription.status = 'canceled';
		subscription.ended_at = item.current_period_end;
		subscription.cancel_at_period_end = false;
		record.pendingProrations = [];
		emit('customer.subscription.deleted', subscription);
		return;
	}
	const before = snapshot(subscription);
	const ended = { start: item.current_period_start, end: item.current_period_end };
	record.periodIndex += 1;
	const next = periodBounds(record, record.periodIndex);
	item.current_period_start = next.start;
	item.current_period_end = next.end;
	const invoice = finalizeInvoice(state, record, {
		lines: [...record.pendingProrations, periodLine(state, subscription, item.quantity ?? 1, next)],
		billingReason: 'subscription_cycle',
		periodStart: ended.start,
		periodEnd: ended.end
	});
	record.pendingProrations = [];
	const paid = chargeInvoice(state, invoice);
	if (!paid) subscription.status = 'past_due';
	else if (!hasOpenInvoices(state, subscription.id)) subscription.status = 'active';
	emit(paid ? 'invoice.paid' : 'invoice.payment_failed', invoice);
	emit('customer.subscription.updated', subscription, previousAttributes(before, subscription));
}

function hasOpenInvoices(state: StandinState, subscriptionId: string): boolean {
	return [...state.invoices.values()].some(
		(invoice) => invoice.status === 'open' && invoice.parent?.subscription_details?.subscription === subscriptionId
	);
}

/**
 * The customer switches card. With the working card, every open invoice is
 * charged at once, oldest first, and a past-due subscription with nothing left
 * open becomes active again.
 */
export function switchCard(
	state: StandinState,
	emit: Emit,
	customerId: string,
	card: Exclude<CardOnFile, 'none'>
): void {
	setCard(state, customerId, card);
	if (card !== 'working') return;
	const open = state
		.invoicesOf(customerId)
		.filter((invoice) => invoice.status === 'open')
		.sort((a, b) => a.created - b.created);
	for (const invoice of open) {
		if (chargeInvoice(state, invoice)) emit('invoice.paid', invoice);
	}
	for (const subscription of state.subscriptionsOf(customerId)) {
		if (subscription.status !== 'past_due' || hasOpenInvoices(state, subscription.id)) continue;
		const before = snapshot(subscription);
		subscription.status = 'active';
		emit('customer.subscription.updated', subscription, previousAttributes(before, subscription));
	}
}
