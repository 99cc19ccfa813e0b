import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/api';
import { receiveWebhook } from '$lib/server/billing/webhook';
import { billingSettings } from '$lib/server/settings';
import type { RequestHandler } from './$types';

/** Stripe's deliveries. No session or token: the signature over the raw body is the credential. */
export const POST: RequestHandler = async ({ request }) => {
	if (!billingSettings().enabled) return apiError(404, 'Billing is not set up on this server.');
	const outcome = await receiveWebhook(await request.text(), request.headers.get('stripe-signature'));
	if (outcome.status === 400) return apiError(400, outcome.message);
	return json({ received: true, handled: outcome.handled, note: outcome.note });
};
