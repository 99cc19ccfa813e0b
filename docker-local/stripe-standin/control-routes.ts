/**
 * `/_standin/...`: the routes tests and developers use to steer the stand-in.
 *
 *   GET  /_standin/clock               { now, iso }
 *   POST /_standin/clock/advance       JSON { seconds } or { to: unixSeconds }; runs what falls due
 *   GET  /_standin/deliveries          { data: [{ eventId, eventType, attempt, status, ok, ... }] }
 *   GET  /_standin/webhook             { url }
 *   POST /_standin/webhook             JSON { url } (null turns delivery off)
 *   POST /_standin/reset               forgets everything but the webhook URL and secret
 */
import type { StandinContext } from './context';
import { StandinError } from './errors';
import { advanceClock } from './renewals';
import { json, type Reply } from './reply';

function parseJson(body: string): Record<string, unknown> {
	if (body.trim() === '') return {};
	try {
		const value: unknown = JSON.parse(body);
		if (value && typeof value === 'object' && !Array.isArray(value)) return value as Record<string, unknown>;
	} catch {
		// answered below
	}
	throw new StandinError(400, 'The body must be a JSON object');
}

function clockReply(context: StandinContext): Reply {
	const now = context.state.clock.now();
	return json(200, { now, iso: new Date(now * 1000).toISOString() });
}

function advanceTarget(context: StandinContext, body: Record<string, unknown>): number {
	const { seconds, to } = body;
	if ((seconds === undefined) === (to === undefined)) {
		throw new StandinError(400, 'Give exactly one of seconds or to', 'seconds');
	}
	if (seconds !== undefined) {
		if (typeof seconds !== 'number' || !Number.isSafeInteger(seconds) || seconds < 0) {
			throw new StandinError(400, 'seconds must be a whole number of seconds, 0 or more', 'seconds');
		}
		return context.state.clock.now() + seconds;
	}
	if (typeof to !== 'number' || !Number.isSafeInteger(to)) {
		throw new StandinError(400, 'to must be whole Unix seconds', 'to');
	}
	return to;
}

function webhookUrl(body: Record<string, unknown>): string | null {
	const { url } = body;
	if (url === null) return null;
	if (typeof url !== 'string') throw new StandinError(400, 'url must be an http(s) URL or null', 'url');
	let parsed: URL;
	try {
		parsed = new URL(url);
	} catch {
		throw new StandinError(400, `url is not a URL: ${url}`, 'url');
	}
	if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') {
		throw new StandinError(400, 'url must use http or https', 'url');
	}
	return parsed.href;
}

export async function handleControlRoute(
	context: StandinContext,
	method: string,
	path: string,
	body: string
): Promise<Reply | null> {
	const route = `${method} ${path}`;
	switch (route) {
		case 'GET /_standin/clock':
			return clockReply(context);
		case 'POST /_standin/clock/advance': {
			const target = advanceTarget(context, parseJson(body));
			await advanceClock(context.state, target, (change) => context.run(null, change));
			return clockReply(context);
		}
		case 'GET /_standin/deliveries':
			return json(200, { data: context.webhooks.deliveries });
		case 'GET /_standin/webhook':
			return json(200, { url: context.webhooks.url });
		case 'POST /_standin/webhook':
			context.webhooks.url = webhookUrl(parseJson(body));
			return json(200, { url: context.webhooks.url });
		case 'POST /_standin/reset':
			context.reset();
			return json(200, { reset: true, webhookUrl: context.webhooks.url });
		default:
			return null;
	}
}
