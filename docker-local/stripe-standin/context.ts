/**
 * What every route of the stand-in shares: the state, the webhook sender, and
 * `run`, which applies a change and delivers the events it emitted, in order,
 * each one's first attempt awaited, before the route answers.
 */
import { StandinClock } from './clock';
import { eventEmitter, type Emit, type EventCause } from './events';
import { StandinState } from './state';
import { WebhookSender } from './webhooks';

export interface StandinContext {
	state: StandinState;
	webhooks: WebhookSender;
	run<T>(cause: EventCause | null, change: (emit: Emit) => T): Promise<T>;
	/** Forgets every object, event, delivery and idempotent answer; the clock goes back to real time. */
	reset(): void;
	onReset(listener: () => void): void;
}

export function createStandinContext(options: {
	baseUrl: string;
	webhookUrl: string | null;
	webhookSecret: string;
	retryDelaysMs?: number[];
}): StandinContext {
	const clock = new StandinClock();
	const state = new StandinState(clock, options.baseUrl);
	const webhooks = new WebhookSender(options.webhookUrl, options.webhookSecret, options.retryDelaysMs);
	const resetListeners: Array<() => void> = [];
	return {
		state,
		webhooks,
		async run(cause, change) {
			const { emit, emitted } = eventEmitter(state, cause, () => webhooks.url !== null);
			const result = change(emit);
			for (const event of emitted) await webhooks.deliver(event);
			return result;
		},
		reset() {
			state.clear();
			clock.reset();
			webhooks.clear();
			for (const listener of resetListeners) listener();
		},
		onReset(listener) {
			resetListeners.push(listener);
		}
	};
}
