import type { Knex } from 'knex';
import { db } from './knex';
import { forgetCachedSessions } from '../auth/session-cache';
import type { WorkspaceRole } from '../auth/roles';
import { SEAT_ROLES, requireFreeSeat } from '../billing/gates';
import type { PlanStatus } from '../../billing/plans';
import { numberLocaleSchema, type NumberLocale } from '../../locale/locales';

/** Sets how a workspace's pages write numbers and dates (null: each reader's own). */
export async function setWorkspaceNumberLocale(workspaceId: string, locale: NumberLocale | null, knex: Knex = db()): Promise<void> {
	await knex('workspaces').where({ id: workspaceId }).update({ number_locale: locale });
	forgetCachedSessions();
}

export interface WorkspaceMembership {
	workspaceId: string;
	workspaceName: string;
	workspaceSlug: string;
	/** The workspace's plan (free until billing sets another). */
	plan: string;
	planStatus: PlanStatus;
	/** ISO time a renewal first failed, while past due. */
	pastDueSince: string | null;
	role: WorkspaceRole;
	/** How the workspace's pages write numbers and dates; null: each reader's own browser languages. */
	numberLocale: NumberLocale | null;
}

const membershipColumns = [
	'memberships.workspace_id',
	'workspaces.name',
	'workspaces.slug',
	'workspaces.plan',
	'workspaces.plan_status',
	'workspaces.past_due_since',
	'workspaces.number_locale',
	'memberships.role'
];

interface MembershipColumns {
	workspace_id: string;
	name: string;
	slug: string;
	plan: string;
	plan_status: PlanStatus;
	past_due_since: Date | string | null;
	number_locale: string | null;
	role: WorkspaceRole;
}

function membershipOf(row: MembershipColumns): WorkspaceMembership {
	return {
		workspaceId: row.workspace_id,
		workspaceName: row.name,
		workspaceSlug: row.slug,
		plan: row.plan,
		planStatus: row.plan_status,
		pastDueSince: isoOrNull(row.past_due_since),
		role: row.role,
		numberLocale: numberLocaleSchema.safeParse(row.number_locale).data ?? null
	};
}

function isoOrNull(value: Date | string | null): string | null {
	return value === null ? null : new Date(value).toISOString();
}

export async function getMembership(
	workspaceId: string,
	userId: string,
	knex: Knex = db()
): Promise<WorkspaceMembership | undefined> {
	const row = await knex('memberships')
		.join('workspaces', 'workspaces.id', 'memberships.workspace_id')
		.select(membershipColumns)
		.where({ 'memberships.workspace_id': workspaceId, 'memberships.user_id': userId })
		.first();
	return row && membershipOf(row);
}

export async function listWorkspacesForUser(userId: string, knex: Knex = db()): Promise<WorkspaceMembership[]> {
	const rows = await knex('memberships')
		.join('workspaces', 'workspaces.id', 'memberships.workspace_id')
		.select(membershipColumns)
		.where({ 'memberships.user_id': userId })
		.orderBy('workspaces.name');
	return rows.map(membershipOf);
}

export interface MemberRow {
	userId: string;
	email: string;
	name: string;
	role: WorkspaceRole;
	joinedAt: Date;
}

export async function listMembers(workspaceId: string, knex: Knex = db()): Promise<MemberRow[]> {
	const rows = await knex('memberships')
		.join('users', 'users.id', 'memberships.user_id')
		.select('users.id', 'users.email', 'users.name', 'memberships.role', 'memberships.created_at')
		.where({ 'memberships.workspace_id': workspaceId })
		.orderBy([{ column: 'memberships.role', order: 'asc' }, { column: 'users.email' }]);
	return rows.map((r) => ({ userId: r.id, email: r.email, name: r.name, role: r.role, joinedAt: r.created_at }));
}

/** One member of the workspace with their name and address; undefined for someone who is not a member. */
export async function getMember(workspaceId: string, userId: string, knex: Knex = db()): Promise<MemberRow | undefined> {
	const r = await knex('memberships')
		.join('users', 'users.id', 'memberships.user_id')
		.select('users.id', 'users.email', 'users.name', 'memberships.role', 'memberships.created_at')
		.where({ 'memberships.workspace_id': workspaceId, 'memberships.user_id': userId })
		.first();
	return r && { userId: r.id, email: r.email, name: r.name, role: r.role, joinedAt: r.created_at };
}

export async function addMember(workspaceId: string, userId: string, role: WorkspaceRole, knex: Knex = db()) {
	await knex('memberships')
		.insert({ workspace_id: workspaceId, user_id: userId, role })
		.onConflict(['workspace_id', 'user_id'])
		.ignore();
	forgetCachedSessions();
}

export class LastOwnerError extends Error {
	constructor() {
		super('A workspace needs at least one owner: make someone else an owner first.');
	}
}

async function lockOwners(workspaceId: string, trx: Knex.Transaction): Promise<string[]> {
	const rows = await trx('memberships')
		.select('user_id')
		.where({ workspace_id: workspaceId, role: 'owner' })
		.forUpdate();
	return rows.map((r) => r.user_id);
}

/** Changes a member's role; refuses to demote the last owner. Returns the previous role. */
export async function changeMemberRole(
	workspaceId: string,
	userId: string,
	role: WorkspaceRole,
	knex: Knex = db()
): Promise<WorkspaceRole | null> {
	const previous = await knex.transaction(async (trx) => {
		const owners = await lockOwners(workspaceId, trx);
		const current = await trx('memberships').select('role').where({ workspace_id: workspaceId, user_id: userId }).first();
		if (!current) return null;
		if (current.role === 'owner' && role !== 'owner' && owners.length <= 1) throw new LastOwnerError();
		const takesSeat = (SEAT_ROLES as readonly string[]).includes(role) && !(SEAT_ROLES as readonly string[]).includes(current.role);
		if (takesSeat) await requireFreeSeat(trx, workspaceId);
		await trx('memberships').where({ workspace_id: workspaceId, user_id: userId }).update({ role });
		return current.role as WorkspaceRole;
	});
	forgetCachedSessions();
	return previous;
}

/** Removes a member (or lets one leave); refuses to remove the last owner. False, with nothing written, for someone who is not a member. */
export async function removeMember(workspaceId: string, userId: string, knex: Knex = db()): Promise<boolean> {
	const wasMember = await knex.transaction(async (trx) => {
		const owners = await lockOwners(workspaceId, trx);
		if (owners.includes(userId) && owners.length <= 1) throw new LastOwnerError();
		const removed = await trx('memberships').where({ workspace_id: workspaceId, user_id: userId }).delete();
		if (removed === 0) return false;
		await trx('sessions').where({ user_id: userId, workspace_id: workspaceId }).update({ workspace_id: null });
		// A member who leaves takes no live token along: coming back later does not revive old tokens.
		await trx('api_tokens').where({ user_id: userId, workspace_id: workspaceId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
		return true;
	});
	forgetCachedSessions();
	return wasMember;
}
