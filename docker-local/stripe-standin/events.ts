/**
 * The events the stand-in sends, each a full Stripe.Event with a snapshot of
 * the object as it was at that moment.
 */
import Stripe from 'stripe';
import { newId, snapshot, type StandinState } from './state';

export type EmittedEventType =
	| 'customer.subscription.created'
	| 'customer.subscription.updated'
	| 'customer.subscription.deleted'
	| 'invoice.paid'
	| 'invoice.payment_failed'
	| 'checkout.session.completed'
	| 'checkout.session.expired';

type EventOf<T extends EmittedEventType> = Extract<Stripe.Event, { type: T }>;
export type EventObject<T extends EmittedEventType> = EventOf<T>['data']['object'];

/** Who caused an event: the API request (id, idempotency key), or null for pages and the clock. */
export interface EventCause {
	requestId: string | null;
	idempotencyKey: string | null;
}

export type Emit = <T extends EmittedEventType>(
	type: T,
	object: EventObject<T>,
	previousAttributes?: Partial<EventObject<T>>
) => void;

/**
 * An emitter that stores each event in the state and collects it in `emitted`
 * so the caller can deliver them, in order, before it answers.
 */
export function eventEmitter(
	state: StandinState,
	cause: EventCause | null,
	webhookConfigured: () => boolean
): { emit: Emit; emitted: Stripe.Event[] } {
	const emitted: Stripe.Event[] = [];
	const emit: Emit = (type, object, previousAttributes) => {
		const data = {
			object: snapshot(object),
			...(previousAttributes ? { previous_attributes: snapshot(previousAttributes) } : {})
		};
		// The union of event types cannot be narrowed from a generic `type`; data was typed by Emit.
		const event = {
			id: newId('evt'),
			object: 'event',
			api_version: Stripe.API_VERSION,
			created: state.clock.now(),
			data,
			livemode: false,
			pending_webhooks: webhookConfigured() ? 1 : 0,
			request: cause ? { id: cause.requestId, idempotency_key: cause.idempotencyKey } : { id: null, idempotency_key: null },
			type
		} as EventOf<typeof type>;
		state.events.push(event);
		emitted.push(event);
	};
	return { emit, emitted };
}

/** The top-level fields whose values differ, with their old values, as Stripe's previous_attributes. */
export function previousAttributes<T extends object>(before: T, after: T): Partial<T> {
	const changed: Partial<T> = {};
	for (const key of Object.keys(before) as Array<keyof T>) {
		if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) changed[key] = before[key];
	}
	return changed;
}
