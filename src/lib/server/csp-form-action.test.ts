import { describe, expect, it } from 'vitest';
import { isBillingPage, withFormActionOrigins } from './csp-form-action';

describe('withFormActionOrigins', () => {
	it('adds the origins to the form-action directive and leaves the others alone', () => {
		const policy = "default-src 'self'; form-action 'self'; frame-ancestors 'none'";
		expect(withFormActionOrigins(policy, ['https://checkout.stripe.com'])).toBe(
			"default-src 'self'; form-action 'self' https://checkout.stripe.com; frame-ancestors 'none'"
		);
	});

	it("replaces 'none' rather than keeping a source list that blocks everything (CSP Level 3: 'none' must stand alone)", () => {
		expect(withFormActionOrigins("form-action 'none'", ['http://127.0.0.1:54327'])).toBe('form-action http://127.0.0.1:54327');
	});

	it('adds the directive when the policy has none', () => {
		expect(withFormActionOrigins("default-src 'self'", ['https://billing.stripe.com'])).toBe("default-src 'self'; form-action 'self' https://billing.stripe.com");
	});
});

describe('isBillingPage', () => {
	it('matches the billing page only', () => {
		expect(isBillingPage('/app/w/0f6c7a3e-0000-4000-8000-000000000000/billing')).toBe(true);
		expect(isBillingPage('/app/w/x/billing/else')).toBe(false);
		expect(isBillingPage('/app/w/x/members')).toBe(false);
	});
});
