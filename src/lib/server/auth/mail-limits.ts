/**
 * Limits on the requests that make the app send mail, so a script can neither
 * fill one inbox nor use the app to send mail in bulk: sign-up 5 an hour per
 * address and per network address, a new confirmation link 3 an hour per
 * account, invitations 20 an hour per workspace, reset links 5 an hour per
 * address. Keys for typed addresses derive from the address alone, so an
 * address with an account and one without run out alike.
 */
import type { RateLimiterPostgres } from 'rate-limiter-flexible';
import { addressKey, storedLimiter, take, takeAll } from './rate-limit';

const HOUR = 60 * 60;

let limiters: ReturnType<typeof makeLimiters> | undefined;
function makeLimiters() {
	return {
		signUpAddress: storedLimiter('signup-address', 5, HOUR),
		signUpIp: storedLimiter('signup-ip', 5, HOUR),
		confirmationMail: storedLimiter('confirmation-mail', 3, HOUR),
		invitations: storedLimiter('invitations', 20, HOUR),
		resetMail: storedLimiter('reset-mail', 5, HOUR)
	};
}
function get() {
	limiters ??= makeLimiters();
	return limiters;
}

export type Allowance = { allowed: true } | { allowed: false; retryAfterSeconds: number };

async function one(limiter: RateLimiterPostgres, key: string): Promise<Allowance> {
	const taken = await take(limiter, key);
	return taken.allowed ? { allowed: true } : taken;
}

/** One sign-up for this address from this network address. */
export async function takeSignUpAllowance(email: string, ip: string): Promise<Allowance> {
	const { signUpAddress, signUpIp } = get();
	const taken = await takeAll([
		{ limiter: signUpAddress, key: addressKey(email) },
		{ limiter: signUpIp, key: ip }
	]);
	return taken.allowed ? { allowed: true } : taken;
}

/** One more confirmation link for this account. */
export function takeConfirmationMailAllowance(userId: string): Promise<Allowance> {
	return one(get().confirmationMail, userId);
}

/** One more invitation from this workspace. */
export function takeInvitationAllowance(workspaceId: string): Promise<Allowance> {
	return one(get().invitations, workspaceId);
}

/** One more reset link to this address (the caller never tells the requester the outcome). */
export function takeResetMailAllowance(email: string): Promise<Allowance> {
	return one(get().resetMail, addressKey(email));
}
