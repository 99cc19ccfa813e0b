/**
 * The one place that asks whether a workspace's plan allows something. A
 * refusal is a 402 naming the plan it needs, with the billing page's address
 * (pages show the same words with a link for owners). Counted limits (live
 * projects, seats) are checked with the workspace row locked, so requests
 * that race each other cannot both take the last place.
 */
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { ApiProblem } from '../workbench/api-route';
import { planAllows, projectAllowance, seatLimit, type FeatureUse, type PlanFeature, type PlanStanding, type PlanStatus } from '../../billing/plans';
import type { WorkspaceMembership } from '../db/memberships';

export function billingPath(workspaceId: string): string {
	return `/app/w/${workspaceId}/billing`;
}

/** A refusal for want of a plan: 402 Payment Required, with where to change the plan. */
export class PlanRefusal extends ApiProblem {
	constructor(message: string, workspaceId: string) {
		super(402, message, [], { billingUrl: billingPath(workspaceId) });
		this.name = 'PlanRefusal';
	}
}

/** Throws PlanRefusal unless the membership's workspace plan allows the feature for this use. */
export function requireFeature(membership: WorkspaceMembership, feature: PlanFeature, use: FeatureUse, now = new Date()): void {
	const answer = planAllows(membership, feature, use, now);
	if (!answer.allowed) throw new PlanRefusal(answer.message, membership.workspaceId);
}

interface LockedWorkspace extends PlanStanding {
	paidSeats: number | null;
}

/** Locks the workspace row for the rest of the transaction and reads its standing and paid seats. */
export async function lockWorkspacePlan(trx: Knex.Transaction, workspaceId: string): Promise<LockedWorkspace> {
	const row = await trx('workspaces')
		.leftJoin('billing_accounts', 'billing_accounts.workspace_id', 'workspaces.id')
		.select('workspaces.plan', 'workspaces.plan_status', 'workspaces.past_due_since', 'billing_accounts.seats')
		.where('workspaces.id', workspaceId)
		.forUpdate('workspaces')
		.first<{ plan: string; plan_status: PlanStatus; past_due_since: Date | null; seats: number | null } | undefined>();
	if (!row) throw new Error(`workspace ${workspaceId} not found`);
	return {
		plan: row.plan,
		planStatus: row.plan_status,
		pastDueSince: row.past_due_since ? new Date(row.past_due_since).toISOString() : null,
		paidSeats: row.seats
	};
}

/** Runs `work` only when one more live project fits the workspace's plan (checked under the lock). */
export async function withRoomForProject<T>(workspaceId: string, work: (trx: Knex.Transaction) => Promise<T>, knex: Knex = db()): Promise<T> {
	return knex.transaction(async (trx) => {
		const standing = await lockWorkspacePlan(trx, workspaceId);
		const [{ count }] = await trx('projects').where({ workspace_id: workspaceId }).whereNull('archived_at').count<{ count: string }[]>({ count: '*' });
		const answer = projectAllowance(standing, Number(count));
		if (!answer.allowed) throw new PlanRefusal(answer.message, workspaceId);
		return work(trx);
	});
}

export const SEAT_ROLES = ['owner', 'analyst'] as const;

export interface SeatHolders {
	members: { name: string; email: string; role: string }[];
	/** Open invitations for a seat role hold their seat until accepted, withdrawn or expired. */
	invitations: { email: string; role: string }[];
}

export async function seatHolders(workspaceId: string, knex: Knex = db()): Promise<SeatHolders> {
	const [members, invitations] = await Promise.all([
		knex('memberships')
			.join('users', 'users.id', 'memberships.user_id')
			.select('users.name', 'users.email', 'memberships.role')
			.where('memberships.workspace_id', workspaceId)
			.whereIn('memberships.role', SEAT_ROLES)
			.orderBy('users.name'),
		knex('invitations')
			.select('email', 'role')
			.where({ workspace_id: workspaceId })
			.whereIn('role', SEAT_ROLES)
			.whereNull('accepted_at')
			.whereNull('revoked_at')
			.where('expires_at', '>', knex.fn.now())
			.orderBy('email')
	]);
	return { members, invitations };
}

export function seatsUsed(holders: SeatHolders): number {
	return holders.members.length + holders.invitations.length;
}

/** "Isla Penrow, Tomas Vell and an invitation to a@b.example" */
export function holderNames(holders: SeatHolders): string {
	const names = [...holders.members.map((m) => m.name || m.email), ...holders.invitations.map((i) => `an open invitation to ${i.email}`)];
	return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

export class SeatLimitError extends Error {
	constructor(
		readonly seats: number,
		readonly workspaceId: string
	) {
		super(
			`All ${seats} seat${seats === 1 ? '' : 's'} of this workspace are taken (owners, analysts and open invitations for those roles hold one each; viewers do not). An owner can add seats on the billing page, or invite this person as a viewer.`
		);
		this.name = 'SeatLimitError';
	}
}

/**
 * Inside a transaction: refuses (SeatLimitError) when one more owner or
 * analyst would exceed the seats. Locks the workspace row first, so
 * concurrent invitations and promotions are counted one after another.
 */
export async function requireFreeSeat(trx: Knex.Transaction, workspaceId: string): Promise<void> {
	const standing = await lockWorkspacePlan(trx, workspaceId);
	const limit = seatLimit(standing, standing.paidSeats);
	const used = seatsUsed(await seatHolders(workspaceId, trx));
	if (used >= limit) throw new SeatLimitError(limit, workspaceId);
}
