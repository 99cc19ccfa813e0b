/**
 * The Stripe SDK, pointed by settings alone at Stripe or at the local
 * stand-in (docker-local/stripe-standin): the same calls either way.
 */
import Stripe from 'stripe';
import { billingSettings } from '../settings';

let client: { key: string; stripe: Stripe } | null = null;

export class BillingNotSetUpError extends Error {
	constructor() {
		super('Billing is not set up on this server (no Stripe key): ask whoever runs it.');
	}
}

export function stripe(): Stripe {
	const settings = billingSettings();
	if (!settings.enabled) throw new BillingNotSetUpError();
	const key = JSON.stringify([settings.secretKey, settings.api]);
	if (client?.key !== key) {
		client = {
			key,
			stripe: new Stripe(settings.secretKey, {
				...(settings.api ?? {}),
				maxNetworkRetries: settings.api ? 0 : 2,
				timeout: 20_000,
				appInfo: { name: 'Tidewright' }
			})
		};
	}
	return client.stripe;
}
