/**
 * A browser an account has signed in from before. A successful sign-in (or a
 * password reset from the e-mailed link) leaves a long-lived random token in
 * a cookie; the database keeps its sha256 per account. Alone it grants
 * nothing: it only lets that browser's right password through while
 * strangers' failures slow the account down (sign-in-limits.ts).
 */
import type { Cookies } from '@sveltejs/kit';
import { isKnownDeviceOf, rememberKnownDevice } from '../db/known-devices';
import { generateRandomToken, hashToken } from './tokens';

export const DEVICE_COOKIE = 'tw_device';
const DEVICE_LIFETIME_MS = 365 * 24 * 60 * 60 * 1000;
// Only the sign-in form reads it; the reset page only writes it.
const DEVICE_COOKIE_PATH = '/signin';
const NOBODY = '00000000-0000-0000-0000-000000000000';

/** A token this app could have made (generateRandomToken: 20 bytes in base32), so junk never reaches the database. */
function looksLikeDeviceToken(token: string | undefined): token is string {
	return token !== undefined && /^[a-z2-7]{32}$/.test(token);
}

/**
 * The device's hash when this browser signed in to the account before, else
 * null. Asks the database whenever a cookie is present, account or not, so an
 * unknown address costs the same as a known one.
 */
export async function knownDeviceOf(token: string | undefined, userId: string | null): Promise<string | null> {
	if (!looksLikeDeviceToken(token)) return null;
	const tokenHash = hashToken(token);
	const known = await isKnownDeviceOf(tokenHash, userId ?? NOBODY);
	return known && userId !== null ? tokenHash : null;
}

/** Marks this browser as known to the account, keeping its token when it has one; answers the token for the cookie. */
export async function rememberDevice(userId: string, currentToken: string | undefined): Promise<{ token: string; expiresAt: Date }> {
	const token = looksLikeDeviceToken(currentToken) ? currentToken : generateRandomToken();
	const expiresAt = new Date(Date.now() + DEVICE_LIFETIME_MS);
	await rememberKnownDevice(hashToken(token), userId, expiresAt);
	return { token, expiresAt };
}

export function setDeviceCookie(cookies: Cookies, device: { token: string; expiresAt: Date }, secure: boolean): void {
	cookies.set(DEVICE_COOKIE, device.token, { httpOnly: true, sameSite: 'strict', secure, path: DEVICE_COOKIE_PATH, expires: device.expiresAt });
}
