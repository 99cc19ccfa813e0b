/**
 * The prices on offer (per seat per month; found in Stripe by lookup key) and
 * the demo's billing: Halvard Marine Energy pays for the Team plan, the
 * consultancy Corvane Advisory for the Practice plan, and the demo owner also
 * owns a small free workspace, Penrow Tidal Ventures, to try an upgrade on.
 * The paid subscriptions themselves are made in the Stripe stand-in when
 * `npm start` runs (scripts/demo-billing.ts): its state lives in memory.
 */
import type { Knex } from 'knex';
import { demoWorkspace } from './01_demo_workspace';
import { demoUsers, otherWorkspace } from './02_demo_users';
import type { PaidPlanKey } from '../src/lib/billing/plans';

export const planPrices = [
	{ lookup_key: 'tidewright_team_seat_monthly', plan: 'team', unit_amount: 4900, currency: 'eur', interval: 'month' },
	{ lookup_key: 'tidewright_practice_seat_monthly', plan: 'practice', unit_amount: 7900, currency: 'eur', interval: 'month' }
] as const;

export const freeDemoWorkspace = { name: 'Penrow Tidal Ventures', slug: 'penrow-tidal-ventures' };

/** The workspaces the demo shows on a paid plan, with their seats. */
export const demoSubscriptions: { slug: string; plan: PaidPlanKey; seats: number; ownerEmail: string }[] = [
	{ slug: demoWorkspace.slug, plan: 'team', seats: 12, ownerEmail: demoUsers.owner.email },
	{ slug: otherWorkspace.slug, plan: 'practice', seats: 3, ownerEmail: demoUsers.outsider.email }
];

export async function seed(knex: Knex): Promise<void> {
	const [{ count }] = await knex('plan_prices').count<{ count: string }[]>({ count: '*' });
	if (Number(count) === 0) await knex('plan_prices').insert(planPrices.map((p) => ({ ...p })));

	const owner = await knex('users').select('id').where({ email: demoUsers.owner.email }).first();
	const existing = await knex('workspaces').select('id').where({ slug: freeDemoWorkspace.slug }).first();
	if (!owner || existing) return;
	await knex.transaction(async (trx) => {
		const [workspace] = await trx('workspaces').insert(freeDemoWorkspace).returning(['id']);
		await trx('memberships').insert({ workspace_id: workspace.id, user_id: owner.id, role: 'owner' });
	});
}
