import type { Knex } from 'knex';
import { db } from './knex';
import { generateRandomToken, hashToken } from '../auth/tokens';
import { normaliseEmail } from './users';
import type { WorkspaceRole } from '../auth/roles';
import { SEAT_ROLES, requireFreeSeat } from '../billing/gates';

export const INVITATION_DAYS = 7;

export interface InvitationView {
	id: string;
	workspaceId: string;
	workspaceName: string;
	email: string;
	role: WorkspaceRole;
	inviterName: string;
	expiresAt: Date;
	status: 'open' | 'accepted' | 'revoked' | 'expired';
}

export async function createInvitation(
	input: { workspaceId: string; email: string; role: WorkspaceRole; invitedBy: string },
	knex: Knex = db()
): Promise<{ id: string; token: string }> {
	const token = generateRandomToken();
	return knex.transaction(async (trx) => {
		// A fresh invitation replaces an open one for the same address.
		await trx('invitations')
			.where({ workspace_id: input.workspaceId })
			.whereRaw('lower(email) = ?', [normaliseEmail(input.email)])
			.whereNull('accepted_at')
			.whereNull('revoked_at')
			.update({ revoked_at: trx.fn.now() });
		if ((SEAT_ROLES as readonly string[]).includes(input.role)) await requireFreeSeat(trx, input.workspaceId);
		const [row] = await trx('invitations')
			.insert({
				workspace_id: input.workspaceId,
				email: normaliseEmail(input.email),
				role: input.role,
				token_hash: hashToken(token),
				invited_by: input.invitedBy,
				expires_at: new Date(Date.now() + INVITATION_DAYS * 24 * 60 * 60 * 1000)
			})
			.returning(['id']);
		return { id: row.id, token };
	});
}

function statusOf(row: { accepted_at: Date | null; revoked_at: Date | null; expires_at: Date }): InvitationView['status'] {
	if (row.accepted_at) return 'accepted';
	if (row.revoked_at) return 'revoked';
	if (new Date(row.expires_at).getTime() <= Date.now()) return 'expired';
	return 'open';
}

const viewColumns = [
	'invitations.id',
	'invitations.workspace_id',
	'workspaces.name as workspace_name',
	'invitations.email',
	'invitations.role',
	'invitations.expires_at',
	'invitations.accepted_at',
	'invitations.revoked_at',
	'users.name as inviter_name'
];

interface InvitationJoinRow {
	id: string;
	workspace_id: string;
	workspace_name: string;
	email: string;
	role: WorkspaceRole;
	expires_at: Date;
	accepted_at: Date | null;
	revoked_at: Date | null;
	inviter_name: string | null;
}

function toView(row: InvitationJoinRow): InvitationView {
	return {
		id: row.id,
		workspaceId: row.workspace_id,
		workspaceName: row.workspace_name,
		email: row.email,
		role: row.role,
		inviterName: row.inviter_name ?? 'A colleague',
		expiresAt: row.expires_at,
		status: statusOf(row)
	};
}

export async function getInvitationByToken(token: string, knex: Knex = db()): Promise<InvitationView | undefined> {
	const row = await knex('invitations')
		.join('workspaces', 'workspaces.id', 'invitations.workspace_id')
		.leftJoin('users', 'users.id', 'invitations.invited_by')
		.select(viewColumns)
		.where('invitations.token_hash', hashToken(token))
		.first();
	return row ? toView(row) : undefined;
}

export async function listOpenInvitations(workspaceId: string, knex: Knex = db()): Promise<InvitationView[]> {
	const rows = await knex('invitations')
		.join('workspaces', 'workspaces.id', 'invitations.workspace_id')
		.leftJoin('users', 'users.id', 'invitations.invited_by')
		.select(viewColumns)
		.where('invitations.workspace_id', workspaceId)
		.whereNull('invitations.accepted_at')
		.whereNull('invitations.revoked_at')
		.where('invitations.expires_at', '>', knex.fn.now())
		.orderBy('invitations.created_at', 'desc');
	return rows.map(toView);
}

export async function revokeInvitation(workspaceId: string, invitationId: string, knex: Knex = db()): Promise<boolean> {
	const n = await knex('invitations')
		.where({ id: invitationId, workspace_id: workspaceId })
		.whereNull('accepted_at')
		.whereNull('revoked_at')
		.update({ revoked_at: knex.fn.now() });
	return n > 0;
}

/** Marks the invitation accepted and adds the member, in one transaction; false when it was no longer open. */
export async function acceptInvitation(token: string, userId: string, knex: Knex = db()): Promise<InvitationView | null> {
	return knex.transaction(async (trx) => {
		const [row] = await trx('invitations')
			.where({ token_hash: hashToken(token) })
			.whereNull('accepted_at')
			.whereNull('revoked_at')
			.where('expires_at', '>', trx.fn.now())
			.update({ accepted_at: trx.fn.now(), accepted_by: userId })
			.returning(['id', 'workspace_id', 'role']);
		if (!row) return null;
		// A member who accepts keeps the higher of the present and the invited role:
		// an invitation never demotes anyone.
		await trx.raw(
			`INSERT INTO memberships (workspace_id, user_id, role) VALUES (?, ?, ?)
			 ON CONFLICT (workspace_id, user_id) DO UPDATE SET role = CASE
			   WHEN array_position(ARRAY['viewer', 'analyst', 'owner'], EXCLUDED.role)
			      > array_position(ARRAY['viewer', 'analyst', 'owner'], memberships.role)
			   THEN EXCLUDED.role ELSE memberships.role END`,
			[row.workspace_id, userId, row.role]
		);
		const view = await getInvitationByToken(token, trx);
		return view ?? null;
	});
}
