/**
 * Stripe's webhook: the signature checked on the raw body, one handler per
 * event type, each event handled once (its id is stored after it succeeds),
 * and a failure answered non-2xx so Stripe delivers it again.
 */
import type Stripe from 'stripe';
import { stripe } from './stripe-client';
import { billingSettings } from '../settings';
import { eventWasHandled, recordHandledEvent } from '../db/billing';
import { syncCheckout, syncInvoice, syncSubscription } from './sync';

export type WebhookOutcome = { status: 200; handled: boolean; note: string } | { status: 400; message: string };

type Handler = (event: Stripe.Event) => Promise<unknown>;

const handlers: Partial<Record<Stripe.Event.Type, Handler>> = {
	'checkout.session.completed': (event) => syncCheckout(event.data.object as Stripe.Checkout.Session),
	'customer.subscription.created': (event) => syncSubscription((event.data.object as Stripe.Subscription).id),
	'customer.subscription.updated': (event) => syncSubscription((event.data.object as Stripe.Subscription).id),
	'customer.subscription.deleted': (event) => syncSubscription((event.data.object as Stripe.Subscription).id),
	'invoice.paid': (event) => syncInvoice(event.data.object as Stripe.Invoice),
	'invoice.payment_failed': (event) => syncInvoice(event.data.object as Stripe.Invoice)
};

export const HANDLED_EVENT_TYPES = Object.keys(handlers) as Stripe.Event.Type[];

/** Verifies and handles one delivery. Throws when handling fails (the route answers 500 and Stripe retries). */
export async function receiveWebhook(rawBody: string, signature: string | null): Promise<WebhookOutcome> {
	if (!signature) return { status: 400, message: 'The Stripe-Signature header is missing.' };
	let event: Stripe.Event;
	try {
		// Default tolerance: a signature older than 300 s is refused (replays of captured deliveries).
		event = stripe().webhooks.constructEvent(rawBody, signature, billingSettings().webhookSecret);
	} catch (e) {
		return { status: 400, message: `The signature does not match this endpoint's secret: ${(e as Error).message}` };
	}
	const handler = handlers[event.type];
	if (!handler) return { status: 200, handled: false, note: `${event.type} is not used by Tidewright` };
	if (await eventWasHandled(event.id)) return { status: 200, handled: false, note: `${event.id} was handled before` };
	await handler(event);
	await recordHandledEvent(event.id, event.type);
	return { status: 200, handled: true, note: `${event.type} handled` };
}
