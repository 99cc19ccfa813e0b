/**
 * Personal API tokens: a member's token for one workspace, read-only or
 * read-write, with an expiry. Only the sha256 of a token is stored.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import type { WorkspaceRole } from '../auth/roles';

export type TokenAccess = 'read' | 'read-write';

export interface ApiTokenSummary {
	id: string;
	name: string;
	hint: string;
	access: TokenAccess;
	workspaceId: string;
	workspaceName: string;
	createdAt: Date;
	expiresAt: Date;
	lastUsedAt: Date | null;
	lastUsedIp: string;
	revokedAt: Date | null;
}

/** What a presented token stands for, with the owner's current membership of its workspace (null once they left). */
export interface TokenHolder {
	tokenId: string;
	tokenName: string;
	access: TokenAccess;
	expiresAt: Date;
	revokedAt: Date | null;
	lastUsedAt: Date | null;
	user: { id: string; email: string; name: string; emailVerified: boolean };
	workspaceId: string;
	role: WorkspaceRole | null;
}

export interface NewApiToken {
	userId: string;
	workspaceId: string;
	name: string;
	tokenHash: string;
	hint: string;
	access: TokenAccess;
	expiresAt: Date;
}

export async function insertApiToken(token: NewApiToken, knex: Knex = db()): Promise<string> {
	const [row] = await knex('api_tokens')
		.insert({
			user_id: token.userId,
			workspace_id: token.workspaceId,
			name: token.name,
			token_hash: token.tokenHash,
			hint: token.hint,
			access: token.access,
			expires_at: token.expiresAt
		})
		.returning('id');
	return row.id;
}

export async function findTokenHolder(tokenHash: string, knex: Knex = db()): Promise<TokenHolder | undefined> {
	const row = await knex('api_tokens')
		.join('users', 'users.id', 'api_tokens.user_id')
		.leftJoin('memberships', function () {
			this.on('memberships.user_id', '=', 'api_tokens.user_id').andOn('memberships.workspace_id', '=', 'api_tokens.workspace_id');
		})
		.select(
			'api_tokens.id',
			'api_tokens.name',
			'api_tokens.access',
			'api_tokens.expires_at',
			'api_tokens.revoked_at',
			'api_tokens.last_used_at',
			'api_tokens.workspace_id',
			'users.id as user_id',
			'users.email',
			'users.name as user_name',
			'users.email_verified_at',
			'memberships.role'
		)
		.where('api_tokens.token_hash', tokenHash)
		.first();
	return (
		row && {
			tokenId: row.id,
			tokenName: row.name,
			access: row.access,
			expiresAt: row.expires_at,
			revokedAt: row.revoked_at,
			lastUsedAt: row.last_used_at,
			user: { id: row.user_id, email: row.email, name: row.user_name, emailVerified: row.email_verified_at !== null },
			workspaceId: row.workspace_id,
			role: row.role ?? null
		}
	);
}

export async function listTokensOfUser(userId: string, knex: Knex = db()): Promise<ApiTokenSummary[]> {
	const rows = await knex('api_tokens')
		.join('workspaces', 'workspaces.id', 'api_tokens.workspace_id')
		.select(
			'api_tokens.id',
			'api_tokens.name',
			'api_tokens.hint',
			'api_tokens.access',
			'api_tokens.workspace_id',
			'workspaces.name as workspace_name',
			'api_tokens.created_at',
			'api_tokens.expires_at',
			'api_tokens.last_used_at',
			'api_tokens.last_used_ip',
			'api_tokens.revoked_at'
		)
		.where('api_tokens.user_id', userId)
		.orderBy('api_tokens.created_at', 'desc');
	return rows.map((row) => ({
		id: row.id,
		name: row.name,
		hint: row.hint,
		access: row.access,
		workspaceId: row.workspace_id,
		workspaceName: row.workspace_name,
		createdAt: row.created_at,
		expiresAt: row.expires_at,
		lastUsedAt: row.last_used_at,
		lastUsedIp: row.last_used_ip,
		revokedAt: row.revoked_at
	}));
}

/** Revokes one of the user's own live tokens; answers its workspace, or undefined when there was none to revoke. */
export async function revokeTokenOfUser(userId: string, tokenId: string, knex: Knex = db()): Promise<{ workspaceId: string; name: string } | undefined> {
	const [row] = await knex('api_tokens')
		.where({ id: tokenId, user_id: userId })
		.whereNull('revoked_at')
		.update({ revoked_at: knex.fn.now() })
		.returning(['workspace_id', 'name']);
	return row && { workspaceId: row.workspace_id, name: row.name };
}

export async function recordTokenUse(tokenId: string, ip: string, knex: Knex = db()): Promise<void> {
	await knex('api_tokens').where({ id: tokenId }).update({ last_used_at: knex.fn.now(), last_used_ip: ip });
}
