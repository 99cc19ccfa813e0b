import { describe, expect, it } from 'vitest';
import { standingChange } from './standing-change';

const team = { plan: 'team', planStatus: 'active', seats: 3, cancelAtPeriodEnd: false };

describe('standingChange', () => {
	it('is null when a delivery changes nothing the log shows (a repeat, or an invoice for the same plan)', () => {
		expect(standingChange(team, { ...team })).toBeNull();
	});

	it('names each part that changed, from and to, and only those', () => {
		expect(standingChange(team, { ...team, seats: 5 })).toEqual({ source: 'stripe', seatsFrom: 3, seatsTo: 5 });
		expect(standingChange({ plan: 'free', planStatus: 'active', seats: null, cancelAtPeriodEnd: false }, team)).toEqual({
			source: 'stripe',
			planFrom: 'free',
			planTo: 'team',
			seatsFrom: null,
			seatsTo: 3
		});
		expect(standingChange(team, { ...team, planStatus: 'past_due', cancelAtPeriodEnd: true })).toEqual({
			source: 'stripe',
			statusFrom: 'active',
			statusTo: 'past_due',
			cancelAtPeriodEnd: true
		});
	});
});
