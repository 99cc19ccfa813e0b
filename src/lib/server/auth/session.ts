/**
 * Sessions in PostgreSQL, after the lucia authors' recipe: the cookie carries
 * a random token, the database keeps only its sha256; 30-day expiry that
 * slides forward when less than half of it is left.
 */
import type { Knex } from 'knex';
import type { Cookies } from '@sveltejs/kit';
import { db } from '../db/knex';
import { generateRandomToken, hashToken } from './tokens';
import type { WorkspaceMembership } from '../db/memberships';
import { cachedSession, forgetCachedSessions, rememberSession } from './session-cache';

export const SESSION_COOKIE = 'tw_session';
const DAY_MS = 24 * 60 * 60 * 1000;
export const SESSION_LIFETIME_MS = 30 * DAY_MS;
const LAST_SEEN_RESOLUTION_MS = 60 * 60 * 1000;

export interface Session {
	id: string;
	userId: string;
	expiresAt: Date;
	workspaceId: string | null;
}

export interface SessionUser {
	id: string;
	email: string;
	name: string;
	emailVerified: boolean;
}

/** A member's workspaces, role and plan standing in each, read with the session so a page view costs one query. */
export type SessionMembership = WorkspaceMembership;

export type SessionValidation =
	| { session: Session; user: SessionUser; memberships: SessionMembership[]; /** the expiry moved: send the cookie again */ extended: boolean }
	| { session: null; user: null; memberships: null; extended: false };

const noSession = { session: null, user: null, memberships: null, extended: false } as const;

export function generateSessionToken(): string {
	return generateRandomToken();
}

export async function createSession(
	token: string,
	userId: string,
	meta: { userAgent?: string; ip?: string; workspaceId?: string | null } = {},
	knex: Knex = db()
): Promise<Session> {
	const session: Session = {
		id: hashToken(token),
		userId,
		expiresAt: new Date(Date.now() + SESSION_LIFETIME_MS),
		workspaceId: meta.workspaceId ?? null
	};
	await knex('sessions').insert({
		id: session.id,
		user_id: userId,
		expires_at: session.expiresAt,
		user_agent: (meta.userAgent ?? '').slice(0, 300),
		ip: meta.ip ?? '',
		workspace_id: session.workspaceId
	});
	return session;
}

export async function validateSessionToken(token: string, knex: Knex = db(), now = new Date()): Promise<SessionValidation> {
	const id = hashToken(token);
	const row = await knex('sessions')
		.join('users', 'users.id', 'sessions.user_id')
		.select(
			'sessions.id',
			'sessions.user_id',
			'sessions.expires_at',
			'sessions.workspace_id',
			'sessions.last_seen_at',
			'users.email',
			'users.name',
			'users.email_verified_at',
			knex.raw(
				`(select coalesce(json_agg(json_build_object('workspaceId', m.workspace_id, 'workspaceName', w.name, 'workspaceSlug', w.slug, 'plan', w.plan, 'planStatus', w.plan_status, 'pastDueSince', w.past_due_since, 'numberLocale', w.number_locale, 'role', m.role) order by w.name), '[]'::json)
				from memberships m join workspaces w on w.id = m.workspace_id where m.user_id = sessions.user_id) as memberships`
			)
		)
		.where('sessions.id', id)
		.first();
	if (!row) return noSession;

	const expiresAt = new Date(row.expires_at);
	if (now.getTime() >= expiresAt.getTime()) {
		await knex('sessions').where({ id }).delete();
		return noSession;
	}
	const session: Session = { id, userId: row.user_id, expiresAt, workspaceId: row.workspace_id };
	let extended = false;
	if (now.getTime() >= expiresAt.getTime() - SESSION_LIFETIME_MS / 2) {
		extended = true;
		session.expiresAt = new Date(now.getTime() + SESSION_LIFETIME_MS);
		await knex('sessions').where({ id }).update({ expires_at: session.expiresAt, last_seen_at: now });
	} else if (now.getTime() - new Date(row.last_seen_at).getTime() >= LAST_SEEN_RESOLUTION_MS) {
		// Keeps "where you are signed in" honest without a write on every request.
		await knex('sessions').where({ id }).update({ last_seen_at: now });
	}
	return {
		session,
		user: { id: row.user_id, email: row.email, name: row.name, emailVerified: row.email_verified_at !== null },
		memberships: row.memberships as SessionMembership[],
		extended
	};
}

/**
 * The session behind a request's cookie, from the short-lived cache when this
 * process read it a moment ago (see session-cache.ts), else from the database.
 */
export async function sessionForRequest(token: string, now = new Date()): Promise<SessionValidation> {
	const cached = cachedSession(hashToken(token), now.getTime());
	if (cached) return { ...cached, extended: false };
	const validation = await validateSessionToken(token, db(), now);
	if (validation.session) rememberSession(validation, now.getTime());
	return validation;
}

export async function invalidateSession(sessionId: string, knex: Knex = db()): Promise<void> {
	await knex('sessions').where({ id: sessionId }).delete();
	forgetCachedSessions();
}

/** Ends every session of a user, optionally keeping the one in use. */
export async function invalidateUserSessions(userId: string, keepSessionId?: string, knex: Knex = db()): Promise<number> {
	const query = knex('sessions').where({ user_id: userId });
	if (keepSessionId) query.whereNot({ id: keepSessionId });
	const ended = await query.delete();
	forgetCachedSessions();
	return ended;
}

export async function listUserSessions(userId: string, knex: Knex = db()) {
	return knex('sessions')
		.select('id', 'created_at', 'last_seen_at', 'expires_at', 'user_agent', 'ip')
		.where({ user_id: userId })
		.orderBy('last_seen_at', 'desc');
}

export async function setSessionWorkspace(sessionId: string, workspaceId: string, knex: Knex = db()): Promise<void> {
	await knex('sessions').where({ id: sessionId }).update({ workspace_id: workspaceId });
	forgetCachedSessions();
}

export function setSessionCookie(cookies: Cookies, token: string, expiresAt: Date, secure: boolean) {
	cookies.set(SESSION_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure, path: '/', expires: expiresAt });
}

export function deleteSessionCookie(cookies: Cookies, secure: boolean) {
	cookies.delete(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure, path: '/' });
}
