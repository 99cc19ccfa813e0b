/**
 * Who is asking, remembered for a few seconds per session, so a page view and
 * the data requests around it do not each read the session, the user and the
 * memberships again. Every write to sessions, users, memberships or
 * workspaces in this process forgets the whole cache at once
 * (`forgetCachedSessions`), so a sign-out, a role change or a removal takes
 * effect on the very next request here; another process running the same
 * database sees such a change within SESSION_CACHE_TTL_MS.
 */
import type { Session, SessionMembership, SessionUser } from './session';

export const SESSION_CACHE_TTL_MS = 5_000;
const MAX_ENTRIES = 10_000;

export interface CachedSession {
	session: Session;
	user: SessionUser;
	memberships: SessionMembership[];
}

const entries = new Map<string, { value: CachedSession; until: number }>();

export function cachedSession(sessionId: string, now = Date.now()): CachedSession | undefined {
	const entry = entries.get(sessionId);
	if (!entry) return undefined;
	if (now >= entry.until) {
		entries.delete(sessionId);
		return undefined;
	}
	return entry.value;
}

export function rememberSession(value: CachedSession, now = Date.now()) {
	if (entries.size >= MAX_ENTRIES) entries.clear();
	entries.set(value.session.id, { value, until: Math.min(now + SESSION_CACHE_TTL_MS, value.session.expiresAt.getTime()) });
}

/** Called after every write that could change who someone is or what they may see. */
export function forgetCachedSessions() {
	entries.clear();
}
