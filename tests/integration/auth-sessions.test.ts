import { createHash } from 'node:crypto';
import type { Cookies } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import {
	SESSION_COOKIE,
	SESSION_LIFETIME_MS,
	createSession,
	generateSessionToken,
	invalidateSession,
	invalidateUserSessions,
	listUserSessions,
	sessionForRequest,
	setSessionCookie,
	validateSessionToken
} from '../../src/lib/server/auth/session';
import { SESSION_CACHE_TTL_MS, forgetCachedSessions } from '../../src/lib/server/auth/session-cache';
import { db } from '../../src/lib/server/db/knex';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { addMember, changeMemberRole, removeMember } from '../../src/lib/server/db/memberships';
import { changePassword } from '../../src/lib/server/auth/accounts';
import { hashPassword, verifyPasswordHash } from '../../src/lib/server/auth/password';
import { createUser, getPasswordHash } from '../../src/lib/server/db/users';

const DAY_MS = 24 * 60 * 60 * 1000;
const MINUTE_MS = 60 * 1000;

let database: TestDatabase;
let userCount = 0;

beforeAll(async () => {
	database = await createTestDatabase();
	// changePassword goes through the app's db() singleton.
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(() => database.drop());

async function newUser(password = 'harbour-light-seven-42') {
	userCount += 1;
	return createUser(
		{ email: `sessions-${userCount}@test.example`, name: `Session Tester ${userCount}`, passwordHash: await hashPassword(password) },
		database.knex
	);
}

async function newSession(userId: string) {
	const token = generateSessionToken();
	const session = await createSession(token, userId, { userAgent: 'vitest', ip: '127.0.0.9' }, database.knex);
	return { token, session };
}

async function sessionRow(id: string) {
	return database.knex('sessions').select('id', 'user_id', 'expires_at').where({ id }).first();
}

describe('createSession', () => {
	it('keeps only the sha256 of the token, never the token', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		// SHA-256 from node:crypto, an implementation independent of @oslojs/crypto (FIPS 180-4).
		const expectedId = createHash('sha256').update(token).digest('hex');
		expect(session.id).toBe(expectedId);
		const row = await database.knex('sessions').where({ id: expectedId }).first();
		expect(row).toBeDefined();
		expect(Object.values(row).map(String)).not.toContain(token);
	});

	it('draws tokens with at least 128 bits of entropy (OWASP Session Management Cheat Sheet: session ID entropy >= 64 bits)', () => {
		const tokens = new Set(Array.from({ length: 200 }, () => generateSessionToken()));
		expect(tokens.size).toBe(200);
		for (const token of tokens) {
			// base32 carries 5 bits per character: 32 characters are 160 bits.
			expect(token).toMatch(/^[a-z2-7]{32}$/);
		}
	});

	it('expires thirty days after creation', async () => {
		const user = await newUser();
		const before = Date.now();
		const { session } = await newSession(user.id);
		expect(session.expiresAt.getTime()).toBeGreaterThanOrEqual(before + 30 * DAY_MS);
		expect(session.expiresAt.getTime()).toBeLessThanOrEqual(Date.now() + 30 * DAY_MS);
		expect(SESSION_LIFETIME_MS).toBe(30 * DAY_MS);
	});
});

describe('validateSessionToken', () => {
	it('answers the session and its user for a live token', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		const result = await validateSessionToken(token, database.knex);
		expect(result.session?.id).toBe(session.id);
		expect(result.user).toEqual({ id: user.id, email: user.email, name: user.name, emailVerified: false });
	});

	it('answers nothing for an unknown token or for the stored hash used as a token', async () => {
		const user = await newUser();
		const { session } = await newSession(user.id);
		expect(await validateSessionToken(generateSessionToken(), database.knex)).toEqual({ session: null, user: null, memberships: null, extended: false });
		expect(await validateSessionToken(session.id, database.knex)).toEqual({ session: null, user: null, memberships: null, extended: false });
	});

	it('refuses an expired session and deletes it', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		const atExpiry = new Date(session.expiresAt.getTime());
		expect(await validateSessionToken(token, database.knex, atExpiry)).toEqual({ session: null, user: null, memberships: null, extended: false });
		expect(await sessionRow(session.id)).toBeUndefined();
		// Gone for good: even "now" no longer finds it.
		expect((await validateSessionToken(token, database.knex)).session).toBeNull();
	});

	it('is still valid one minute before expiry', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		const result = await validateSessionToken(token, database.knex, new Date(session.expiresAt.getTime() - MINUTE_MS));
		expect(result.session).not.toBeNull();
	});

	it('slides a session with less than 15 days left forward to 30 days from now', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		const now = new Date(session.expiresAt.getTime() - 15 * DAY_MS + MINUTE_MS);
		const result = await validateSessionToken(token, database.knex, now);
		expect(result.session?.expiresAt.getTime()).toBe(now.getTime() + 30 * DAY_MS);
		const row = await sessionRow(session.id);
		expect(new Date(row.expires_at).getTime()).toBe(now.getTime() + 30 * DAY_MS);
	});

	it('leaves a session with more than 15 days left as it is', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		const now = new Date(session.expiresAt.getTime() - 15 * DAY_MS - MINUTE_MS);
		const result = await validateSessionToken(token, database.knex, now);
		expect(result.session?.expiresAt.getTime()).toBe(session.expiresAt.getTime());
		const row = await sessionRow(session.id);
		expect(new Date(row.expires_at).getTime()).toBe(session.expiresAt.getTime());
	});

	it('keeps a session alive indefinitely while it is used every 20 days', async () => {
		const user = await newUser();
		const { token, session } = await newSession(user.id);
		let now = new Date(session.expiresAt.getTime() - SESSION_LIFETIME_MS);
		for (let visit = 0; visit < 4; visit += 1) {
			now = new Date(now.getTime() + 20 * DAY_MS);
			const result = await validateSessionToken(token, database.knex, now);
			expect(result.session, `visit ${visit + 1} on day ${20 * (visit + 1)}`).not.toBeNull();
		}
	});
});

describe('revocation', () => {
	it('ends one session and leaves the user\u2019s others', async () => {
		const user = await newUser();
		const first = await newSession(user.id);
		const second = await newSession(user.id);
		await invalidateSession(first.session.id, database.knex);
		expect((await validateSessionToken(first.token, database.knex)).session).toBeNull();
		expect((await validateSessionToken(second.token, database.knex)).session).not.toBeNull();
	});

	it('ends every session of a user, and no one else\u2019s', async () => {
		const user = await newUser();
		const other = await newUser();
		const mine = [await newSession(user.id), await newSession(user.id), await newSession(user.id)];
		const theirs = await newSession(other.id);
		expect(await invalidateUserSessions(user.id, undefined, database.knex)).toBe(3);
		for (const { token } of mine) expect((await validateSessionToken(token, database.knex)).session).toBeNull();
		expect((await validateSessionToken(theirs.token, database.knex)).session).not.toBeNull();
	});

	it('ends all but the current session ("sign out everywhere else")', async () => {
		const user = await newUser();
		const current = await newSession(user.id);
		const others = [await newSession(user.id), await newSession(user.id)];
		expect(await invalidateUserSessions(user.id, current.session.id, database.knex)).toBe(2);
		expect((await validateSessionToken(current.token, database.knex)).session).not.toBeNull();
		for (const { token } of others) expect((await validateSessionToken(token, database.knex)).session).toBeNull();
		expect((await listUserSessions(user.id, database.knex)).map((s) => s.id)).toEqual([current.session.id]);
	});
});

describe('changePassword', () => {
	it('ends the user\u2019s other sessions, keeps the current one, and stores the new hash', async () => {
		const user = await newUser('harbour-light-seven-42');
		const current = await newSession(user.id);
		const others = [await newSession(user.id), await newSession(user.id)];
		const outcome = await changePassword(
			user.id,
			user.email,
			current.session.id,
			{ currentPassword: 'harbour-light-seven-42', newPassword: 'quayside-lantern-nine-17' },
			'127.0.0.9'
		);
		expect(outcome).toEqual({ ok: true });
		expect((await validateSessionToken(current.token, database.knex)).session).not.toBeNull();
		for (const { token } of others) expect((await validateSessionToken(token, database.knex)).session).toBeNull();
		const stored = (await getPasswordHash(user.id, database.knex))!;
		expect(await verifyPasswordHash(stored, 'quayside-lantern-nine-17')).toBe(true);
		expect(await verifyPasswordHash(stored, 'harbour-light-seven-42')).toBe(false);
		const audit = await database.knex('audit_events').where({ actor_user_id: user.id, event: 'password-changed' });
		expect(audit).toHaveLength(1);
	});

	it('refuses a wrong current password and ends no session', async () => {
		const user = await newUser('harbour-light-seven-42');
		const current = await newSession(user.id);
		const other = await newSession(user.id);
		const outcome = await changePassword(
			user.id,
			user.email,
			current.session.id,
			{ currentPassword: 'not-the-password-at-all', newPassword: 'quayside-lantern-nine-17' },
			'127.0.0.9'
		);
		expect(outcome).toEqual({ ok: false, errors: { currentPassword: 'That is not your current password.' } });
		expect((await validateSessionToken(other.token, database.knex)).session).not.toBeNull();
	});

	it('refuses a new password the policy refuses, and ends no session', async () => {
		const user = await newUser('harbour-light-seven-42');
		const current = await newSession(user.id);
		const other = await newSession(user.id);
		const outcome = await changePassword(
			user.id,
			user.email,
			current.session.id,
			{ currentPassword: 'harbour-light-seven-42', newPassword: 'short-pw' },
			'127.0.0.9'
		);
		expect(outcome.ok).toBe(false);
		expect((await validateSessionToken(other.token, database.knex)).session).not.toBeNull();
	});
});

describe('session cookie', () => {
	function recordingCookies() {
		const calls: { name: string; value: string; options: Record<string, unknown> }[] = [];
		const cookies = {
			set: (name: string, value: string, options: Record<string, unknown>) => calls.push({ name, value, options })
		} as unknown as Cookies;
		return { cookies, calls };
	}

	it('is httpOnly, sameSite lax, site-wide, expires with the session, and secure when asked (OWASP Session Management Cheat Sheet, cookie attributes)', () => {
		const expiresAt = new Date(Date.now() + SESSION_LIFETIME_MS);
		const { cookies, calls } = recordingCookies();
		setSessionCookie(cookies, 'token-value', expiresAt, true);
		setSessionCookie(cookies, 'token-value', expiresAt, false);
		expect(calls[0]).toEqual({
			name: SESSION_COOKIE,
			value: 'token-value',
			options: { httpOnly: true, sameSite: 'lax', secure: true, path: '/', expires: expiresAt }
		});
		expect(calls[1].options.secure).toBe(false);
	});
});

describe('validateSessionToken memberships', () => {
	it('reads the member’s workspaces and roles with the session, in one query', async () => {
		const user = await newUser();
		const [a] = await database.knex('workspaces').insert({ name: 'Brine Works', slug: `brine-${userCount}` }).returning('id');
		const [b] = await database.knex('workspaces').insert({ name: 'Alder Tidal', slug: `alder-${userCount}`, plan: 'free' }).returning('id');
		await database.knex('memberships').insert([
			{ workspace_id: a.id, user_id: user.id, role: 'viewer' },
			{ workspace_id: b.id, user_id: user.id, role: 'owner' }
		]);
		const { token } = await newSession(user.id);
		let queries = 0;
		const count = () => (queries += 1);
		database.knex.on('query', count);
		const validated = await validateSessionToken(token, database.knex);
		database.knex.off('query', count);
		expect(queries).toBe(1);
		expect(validated.memberships).toEqual([
			{ workspaceId: b.id, workspaceName: 'Alder Tidal', workspaceSlug: `alder-${userCount}`, plan: 'free', planStatus: 'active', pastDueSince: null, numberLocale: null, role: 'owner' },
			{ workspaceId: a.id, workspaceName: 'Brine Works', workspaceSlug: `brine-${userCount}`, plan: 'free', planStatus: 'active', pastDueSince: null, numberLocale: null, role: 'viewer' }
		]);
		const loner = await newUser();
		expect((await validateSessionToken((await newSession(loner.id)).token, database.knex)).memberships).toEqual([]);
	});
});

describe('sessionForRequest (the few-second cache in front of validateSessionToken)', () => {
	it('reads the database once for repeated requests, and sees a sign-out, a role change and a removal at once', async () => {
		const user = await newUser();
		const owner = await newUser();
		const workspace = await createWorkspaceWithOwner('Cache Reef', owner.id, database.knex);
		await addMember(workspace.id, user.id, 'viewer', database.knex);
		const { token } = await newSession(user.id);
		const appDb = db();
		let queries = 0;
		const count = () => (queries += 1);
		appDb.on('query', count);
		try {
			expect((await sessionForRequest(token)).memberships?.[0].role).toBe('viewer');
			const afterFirst = queries;
			expect((await sessionForRequest(token)).memberships?.[0].role).toBe('viewer');
			expect(queries).toBe(afterFirst);

			await changeMemberRole(workspace.id, user.id, 'analyst', database.knex);
			expect((await sessionForRequest(token)).memberships?.[0].role).toBe('analyst');

			await removeMember(workspace.id, user.id, database.knex);
			expect((await sessionForRequest(token)).memberships).toEqual([]);

			const session = await sessionForRequest(token);
			await invalidateSession(session.session!.id, database.knex);
			expect((await sessionForRequest(token)).session).toBeNull();
		} finally {
			appDb.off('query', count);
		}
	});

	it('reads the database again once the cache time has passed, so another process’s sign-out is seen within it', async () => {
		const user = await newUser();
		const { token } = await newSession(user.id);
		const start = new Date();
		expect((await sessionForRequest(token, start)).session).not.toBeNull();
		// A write this process does not see (another app process, or SQL by hand).
		await database.knex('sessions').where({ user_id: user.id }).delete();
		expect((await sessionForRequest(token, new Date(start.getTime() + 1_000))).session).not.toBeNull();
		expect((await sessionForRequest(token, new Date(start.getTime() + SESSION_CACHE_TTL_MS))).session).toBeNull();
	});

	it('asks for the cookie to be sent again only when the expiry moved', async () => {
		const user = await newUser();
		const { token } = await newSession(user.id);
		expect((await sessionForRequest(token)).extended).toBe(false);
		await database.knex('sessions').where({ user_id: user.id }).update({ expires_at: new Date(Date.now() + 10 * DAY_MS) });
		forgetCachedSessions();
		expect((await sessionForRequest(token)).extended).toBe(true);
		expect((await sessionForRequest(token)).extended).toBe(false);
	});
});
