/**
 * How a room guest gets in: the invitation link (single use; the first time
 * it asks for a password), a password, or a single-use sign-in link by mail.
 * Same words for unknown and known addresses; failures and mails are limited
 * per address and per network address.
 */
import { hashPassword, passwordProblem, verifyPasswordHash, decoyPasswordHash } from '../auth/password';
import { addressKey, storedLimiter, take, takeAll, waitInWords } from '../auth/rate-limit';
import { generateRandomToken, hashToken } from '../auth/tokens';
import { getGuest, getGuestCredentials, getGuestLink, insertGuestLink, listRoomsOfGuest, setGuestPassword, spendGuestLink } from '../db/rooms';
import { sendMail } from '../mail/mailer';
import { roomSignInLinkMessage } from '../mail/templates';
import { createGuestSession } from './guest-sessions';
import { afterResponse } from '../after-response';

const FIFTEEN_MINUTES = 15 * 60;
export const SIGN_IN_LINK_MINUTES = 20;

let limiters: ReturnType<typeof makeLimiters> | undefined;
function makeLimiters() {
	return {
		failuresAddress: storedLimiter('guest-signin-address', 5, FIFTEEN_MINUTES, FIFTEEN_MINUTES),
		failuresIp: storedLimiter('guest-signin-ip', 50, FIFTEEN_MINUTES, FIFTEEN_MINUTES),
		linkMail: storedLimiter('guest-link-mail', 3, 60 * 60)
	};
}
const get = () => (limiters ??= makeLimiters());

export type GuestEntry = { ok: true; token: string; expiresAt: Date; roomId: string | null } | { ok: false; message: string };

const WRONG = 'That e-mail address and password do not match a data-room invitation.';

export async function signInGuest(input: { email: string; password: string; ip: string }): Promise<GuestEntry> {
	const attempt = await takeAll([
		// Per address and network address: a stranger elsewhere cannot lock an investor out.
		{ limiter: get().failuresAddress, key: `${addressKey(input.email)}|${input.ip}` },
		{ limiter: get().failuresIp, key: input.ip }
	]);
	if (!attempt.allowed) return { ok: false, message: `Too many attempts. Try again in ${waitInWords(attempt.retryAfterSeconds)}.` };
	const guest = await getGuestCredentials(input.email);
	// The same work for an unknown address or one without a password yet: nobody learns who is invited.
	const valid = await verifyPasswordHash(guest?.password_hash ?? (await decoyPasswordHash()), input.password);
	if (!guest || !guest.password_hash || !valid) return { ok: false, message: WRONG };
	// Every attempt took its points before the check; a success clears the address's count and gives the network address its point back, so only failures count.
	await Promise.all([get().failuresAddress.delete(`${addressKey(input.email)}|${input.ip}`), get().failuresIp.reward(input.ip, 1)]);
	const { token, session } = await createGuestSession(guest.id);
	const rooms = await listRoomsOfGuest(guest.id);
	return { ok: true, token, expiresAt: session.expiresAt, roomId: rooms.length === 1 ? rooms[0].id : null };
}

export interface LinkView {
	status: 'open' | 'used' | 'expired' | 'unknown';
	purpose: 'invitation' | 'sign-in' | null;
	roomId: string | null;
	guest: { email: string; name: string; hasPassword: boolean } | null;
}

export async function viewGuestLink(token: string): Promise<LinkView> {
	const link = await getGuestLink(hashToken(token));
	if (!link) return { status: 'unknown', purpose: null, roomId: null, guest: null };
	const status = link.used_at ? 'used' : new Date(link.expires_at).getTime() <= Date.now() ? 'expired' : 'open';
	const guest = await getGuest(link.guest_id);
	return { status, purpose: link.purpose, roomId: link.room_id, guest: guest ? { email: guest.email, name: guest.name, hasPassword: guest.hasPassword } : null };
}

/** Spends the link and opens a session; a guest without a password must choose one here. */
export async function enterByLink(token: string, input: { password?: string; name?: string }): Promise<GuestEntry> {
	const view = await viewGuestLink(token);
	if (view.status !== 'open' || !view.guest) return { ok: false, message: view.status === 'used' ? 'This link was used already: sign in with your password, or ask for a new link.' : 'This link is not valid any more: ask for a new one.' };
	const link = (await getGuestLink(hashToken(token)))!;
	if (!view.guest.hasPassword) {
		const password = input.password ?? '';
		const problem = passwordProblem(password, { email: view.guest.email, name: input.name ?? view.guest.name });
		if (problem) return { ok: false, message: problem };
	}
	if (!(await spendGuestLink(link.token_hash))) return { ok: false, message: 'This link was used already: sign in with your password, or ask for a new link.' };
	if (!view.guest.hasPassword) await setGuestPassword(link.guest_id, await hashPassword(input.password!), input.name?.trim() || null);
	const { token: sessionToken, session } = await createGuestSession(link.guest_id);
	return { ok: true, token: sessionToken, expiresAt: session.expiresAt, roomId: link.room_id };
}

/** Mails a single-use sign-in link to an invited guest with a live room; the answer is the same for anyone. */
export async function requestSignInLink(input: { email: string; origin: string }): Promise<{ message: string }> {
	const message = `If ${input.email} is invited to a data room, a sign-in link is on its way. It works once, for ${SIGN_IN_LINK_MINUTES} minutes.`;
	const allowed = await take(get().linkMail, addressKey(input.email));
	if (!allowed.allowed) return { message: `Too many links asked for this address. Try again in ${waitInWords(allowed.retryAfterSeconds)}.` };
	void afterResponse('Sending a data-room sign-in link', async () => {
		const guest = await getGuestCredentials(input.email);
		if (!guest) return;
		const rooms = await listRoomsOfGuest(guest.id);
		if (rooms.length === 0) return;
		const token = generateRandomToken();
		await insertGuestLink({ tokenHash: hashToken(token), guestId: guest.id, roomId: rooms[0].id, purpose: 'sign-in', expiresAt: new Date(Date.now() + SIGN_IN_LINK_MINUTES * 60_000) });
		await sendMail(guest.email, roomSignInLinkMessage({ url: `${input.origin}/rooms/join/${token}`, minutesValid: SIGN_IN_LINK_MINUTES }));
	});
	return { message };
}
