/**
 * The workspace's audit log: who did what to whom. Account and security
 * events (sign-ins, roles, tokens, billing) and the work done in the
 * workbench (scenario saves and restores, uploads applied, exports, projects
 * renamed, given another currency or archived, scenarios deleted) go into
 * one table; `detail` keeps the names of what was acted on as they were
 * then, so the log still reads after a rename or a deletion.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import { exactTimestamp, keysetPage, type KeysetPage, type KeysetRequest } from './keyset';

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
	| 'billing-changed'
	| 'billing-synced'
	| 'scenario-saved'
	| 'scenario-restored'
	| 'scenario-deleted'
	| 'upload-applied'
	| 'scenario-exported'
	| 'project-renamed'
	| 'project-currency-changed'
	| 'project-archived'
	| 'project-restored'
	| 'workspace-settings-changed';

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

/** The log's kinds of event, for its filter. */
export const auditEventGroups = {
	accounts: ['sign-in', 'sign-in-failed', 'sign-in-blocked', 'sign-out', 'sign-out-everywhere', 'sign-up', 'sign-up-existing-address', 'email-verified', 'password-reset-requested', 'password-reset', 'password-changed'],
	members: ['role-changed', 'member-removed', 'member-left', 'invitation-sent', 'invitation-revoked', 'invitation-accepted'],
	tokens: ['api-token-created', 'api-token-revoked', 'api-token-used', 'api-token-refused'],
	billing: ['billing-changed', 'billing-synced', 'workspace-settings-changed'],
	work: ['scenario-saved', 'scenario-restored', 'upload-applied', 'scenario-deleted', 'project-renamed', 'project-currency-changed', 'project-archived', 'project-restored'],
	exports: ['scenario-exported']
} as const satisfies Record<string, readonly AuditEventName[]>;
export type AuditEventGroup = keyof typeof auditEventGroups;

export function isAuditEventGroup(value: string): value is AuditEventGroup {
	return Object.hasOwn(auditEventGroups, value);
}

export interface AuditFilter {
	group?: AuditEventGroup;
	/** Only what this person did. */
	actorUserId?: string;
	/** First and last day, inclusive, as YYYY-MM-DD in UTC. */
	fromDay?: string;
	toDay?: string;
}

export interface AuditEntry {
	id: string;
	event: string;
	actorUserId: string | null;
	/** The actor's name now; '' when the account is gone or there was no person (Stripe's sync). */
	actorName: string;
	actorEmail: string;
	ip: string;
	detail: Record<string, unknown>;
	at: Date;
}

/** Where an entry sits in the log, newest first: when (to the microsecond), then id. */
export type AuditKey = [at: string, id: string];

/**
 * One page of the events an owner may read, newest first: those recorded
 * against the workspace, plus the account events (sign-in, password) of its
 * current members; narrowed by kind, person and days.
 */
export async function listAuditEventsPage(
	workspaceId: string,
	filter: AuditFilter,
	request: KeysetRequest<AuditKey>,
	knex: Knex = db()
): Promise<KeysetPage<AuditEntry, AuditKey>> {
	const query = knex('audit_events')
		.leftJoin('users', 'users.id', 'audit_events.actor_user_id')
		.select(
			'audit_events.id',
			'audit_events.event',
			'audit_events.actor_user_id',
			'audit_events.actor_email',
			'users.name as actor_name',
			'audit_events.ip',
			'audit_events.detail',
			'audit_events.created_at',
			knex.raw(`${exactTimestamp('audit_events.created_at')} as at_key`)
		)
		.where((scope) =>
			scope
				.where('audit_events.workspace_id', workspaceId)
				.orWhere((q) =>
					q
						.whereNull('audit_events.workspace_id')
						.whereIn('audit_events.actor_user_id', knex('memberships').select('user_id').where({ workspace_id: workspaceId }))
				)
		);
	if (filter.group) query.whereIn('audit_events.event', auditEventGroups[filter.group]);
	if (filter.actorUserId) query.where('audit_events.actor_user_id', filter.actorUserId);
	if (filter.fromDay) query.whereRaw(`audit_events.created_at >= (?::date)::timestamp at time zone 'UTC'`, [filter.fromDay]);
	if (filter.toDay) query.whereRaw(`audit_events.created_at < (?::date + 1)::timestamp at time zone 'UTC'`, [filter.toDay]);
	if (request.after) query.whereRaw('(audit_events.created_at, audit_events.id) < (?::timestamptz, ?::bigint)', request.after);
	const rows = await query
		.orderBy('audit_events.created_at', 'desc')
		.orderBy('audit_events.id', 'desc')
		.limit(request.limit + 1);
	const page = keysetPage(rows, request.limit, (row): AuditKey => [row.at_key, String(row.id)]);
	return {
		items: page.items.map((row) => ({
			id: String(row.id),
			event: row.event,
			actorUserId: row.actor_user_id,
			actorName: row.actor_name ?? '',
			actorEmail: row.actor_email,
			ip: row.ip,
			detail: row.detail,
			at: new Date(row.created_at)
		})),
		nextKey: page.nextKey
	};
}
