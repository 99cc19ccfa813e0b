import type { Knex } from 'knex';
import { db } from './knex';

export type AuditEventName =
	| 'sign-in'
	| 'sign-in-failed'
	| 'sign-in-blocked'
	| 'sign-out'
	| 'sign-out-everywhere'
	| 'sign-up'
	| 'sign-up-existing-address'
	| 'email-verified'
	| 'password-reset-requested'
	| 'password-reset'
	| 'password-changed'
	| 'role-changed'
	| 'member-removed'
	| 'member-left'
	| 'invitation-sent'
	| 'invitation-revoked'
	| 'invitation-accepted'
	| 'api-token-created'
	| 'api-token-revoked'
	| 'api-token-used'
	| 'api-token-refused'
	| 'billing-changed';

export interface AuditInput {
	event: AuditEventName;
	workspaceId?: string | null;
	actorUserId?: string | null;
	actorEmail?: string;
	ip?: string;
	detail?: Record<string, unknown>;
}

export async function recordAuditEvent(input: AuditInput, knex: Knex = db()): Promise<void> {
	await knex('audit_events').insert({
		event: input.event,
		workspace_id: input.workspaceId ?? null,
		actor_user_id: input.actorUserId ?? null,
		actor_email: input.actorEmail ?? '',
		ip: input.ip ?? '',
		detail: JSON.stringify(input.detail ?? {})
	});
}

/** The security log's groups of events, for its filter. */
export const auditEventGroups = {
	accounts: ['sign-in', 'sign-in-failed', 'sign-in-blocked', 'sign-out', 'sign-out-everywhere', 'sign-up', 'sign-up-existing-address', 'email-verified', 'password-reset-requested', 'password-reset', 'password-changed'],
	members: ['role-changed', 'member-removed', 'member-left', 'invitation-sent', 'invitation-revoked', 'invitation-accepted'],
	tokens: ['api-token-created', 'api-token-revoked', 'api-token-used', 'api-token-refused'],
	billing: ['billing-changed']
} as const satisfies Record<string, readonly AuditEventName[]>;
export type AuditEventGroup = keyof typeof auditEventGroups;

export function isAuditEventGroup(value: string): value is AuditEventGroup {
	return Object.hasOwn(auditEventGroups, value);
}

/**
 * Events an owner may read: those recorded against the workspace, plus the
 * account events (sign-in, password) of its current members; optionally one group only.
 */
export async function listAuditEventsForWorkspace(workspaceId: string, options: { limit?: number; group?: AuditEventGroup } = {}, knex: Knex = db()) {
	const query = knex('audit_events')
		.select('id', 'event', 'actor_email', 'ip', 'detail', 'created_at')
		.where((scope) =>
			scope
				.where('workspace_id', workspaceId)
				.orWhere((q) =>
					q.whereNull('workspace_id').whereIn('actor_user_id', knex('memberships').select('user_id').where({ workspace_id: workspaceId }))
				)
		);
	if (options.group) query.whereIn('event', auditEventGroups[options.group]);
	return query
		.orderBy('created_at', 'desc')
		.orderBy('id', 'desc')
		.limit(options.limit ?? 200);
}
