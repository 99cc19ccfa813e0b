/**
 * Sessions of room guests (investors): their own cookie, their own table,
 * never a workspace member's session. The cookie is read only under /rooms,
 * so a guest reaches no workspace route. Same recipe as member sessions: a
 * random token in the cookie, its sha256 in the database, 14 days.
 */
import type { Cookies } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { generateRandomToken, hashToken } from '../auth/tokens';
import { getGuest, type RoomGuest } from '../db/rooms';

export const GUEST_COOKIE = 'tw_guest';
export const GUEST_COOKIE_PATH = '/rooms';
const GUEST_SESSION_MS = 14 * 24 * 60 * 60 * 1000;

export interface GuestSession {
	id: string;
	guestId: string;
	expiresAt: Date;
}

export async function createGuestSession(guestId: string, knex: Knex = db()): Promise<{ token: string; session: GuestSession }> {
	const token = generateRandomToken();
	const session = { id: hashToken(token), guestId, expiresAt: new Date(Date.now() + GUEST_SESSION_MS) };
	await knex('guest_sessions').insert({ id: session.id, guest_id: guestId, expires_at: session.expiresAt });
	return { token, session };
}

export async function validateGuestSession(token: string, knex: Knex = db()): Promise<{ session: GuestSession; guest: RoomGuest } | null> {
	const id = hashToken(token);
	const row = await knex('guest_sessions').select('id', 'guest_id', 'expires_at').where({ id }).first();
	if (!row) return null;
	if (new Date(row.expires_at).getTime() <= Date.now()) {
		await knex('guest_sessions').where({ id }).delete();
		return null;
	}
	const guest = await getGuest(row.guest_id, knex);
	return guest ? { session: { id, guestId: row.guest_id, expiresAt: new Date(row.expires_at) }, guest } : null;
}

export async function endGuestSession(sessionId: string, knex: Knex = db()): Promise<void> {
	await knex('guest_sessions').where({ id: sessionId }).delete();
}

/** Ends the sessions of a guest who may no longer open any room (after a revocation or expiry). */
export async function endSessionsOfGuestWithoutRooms(guestId: string, knex: Knex = db()): Promise<void> {
	const open = await knex('room_guest_access').where({ guest_id: guestId }).whereNull('revoked_at').where('expires_at', '>', knex.fn.now()).first();
	if (!open) await knex('guest_sessions').where({ guest_id: guestId }).delete();
}

export function setGuestCookie(cookies: Cookies, token: string, expiresAt: Date, secure: boolean) {
	cookies.set(GUEST_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure, path: GUEST_COOKIE_PATH, expires: expiresAt });
}

export function deleteGuestCookie(cookies: Cookies, secure: boolean) {
	cookies.delete(GUEST_COOKIE, { httpOnly: true, sameSite: 'lax', secure, path: GUEST_COOKIE_PATH });
}
