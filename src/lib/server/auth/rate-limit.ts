/**
 * Brute-force limits on sign-in, kept in PostgreSQL so every app process
 * shares them (rate-limiter-flexible's Postgres store). Each attempt takes its
 * point before the password is checked, so a burst of parallel guesses cannot
 * all pass a check made before any of them is counted; a success clears the
 * account's counter and hands the address's point back, so in effect only
 * failures count. The key is the e-mail as typed, so unknown and known
 * addresses behave alike.
 */
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { db } from '../db/knex';

const FIFTEEN_MINUTES = 15 * 60;

let limiters: { account: RateLimiterPostgres; ip: RateLimiterPostgres; resetMail: RateLimiterPostgres } | undefined;

function make(keyPrefix: string, points: number, duration: number, blockDuration = 0) {
	return new RateLimiterPostgres({
		storeClient: db(),
		storeType: 'knex',
		tableName: 'rate_limits',
		tableCreated: true,
		keyPrefix,
		points,
		duration,
		blockDuration
	});
}

function get() {
	limiters ??= {
		account: make('signin-account', 5, FIFTEEN_MINUTES, FIFTEEN_MINUTES),
		ip: make('signin-ip', 50, FIFTEEN_MINUTES, FIFTEEN_MINUTES),
		resetMail: make('reset-mail', 5, 60 * 60)
	};
	return limiters;
}

export interface LimitState {
	blocked: boolean;
	retryAfterSeconds: number;
}

function refusal(outcome: PromiseSettledResult<RateLimiterRes>): RateLimiterRes | null {
	if (outcome.status === 'fulfilled') return null;
	if (outcome.reason instanceof RateLimiterRes) return outcome.reason;
	throw outcome.reason;
}

/**
 * Counts one sign-in attempt against the account and the address; blocked
 * once the account has used its 5 attempts or the address its 50. A blocked
 * attempt leaves the other counter as it was.
 */
export async function reserveSignInAttempt(email: string, ip: string): Promise<LimitState> {
	const { account, ip: byIp } = get();
	const key = email.toLowerCase();
	const [a, i] = await Promise.allSettled([account.consume(key), byIp.consume(ip)]);
	const accountRefusal = refusal(a);
	const ipRefusal = refusal(i);
	const refused = accountRefusal ?? ipRefusal;
	if (!refused) return { blocked: false, retryAfterSeconds: 0 };
	if (!accountRefusal) await account.reward(key, 1);
	if (!ipRefusal) await byIp.reward(ip, 1);
	return { blocked: true, retryAfterSeconds: Math.ceil(refused.msBeforeNext / 1000) };
}

/** A right password: the account starts afresh and the attempt no longer counts against the address. */
export async function signInSucceeded(email: string, ip: string): Promise<void> {
	const { account, ip: byIp } = get();
	await Promise.all([account.delete(email.toLowerCase()), byIp.reward(ip, 1)]);
}

export async function clearSignInFailures(email: string): Promise<void> {
	await get().account.delete(email.toLowerCase());
}

/** True when another reset mail to this address may go out now (5 an hour). */
export async function mayRequestResetMail(email: string): Promise<boolean> {
	try {
		await get().resetMail.consume(email.toLowerCase());
		return true;
	} catch (rejection) {
		if (rejection instanceof RateLimiterRes) return false;
		throw rejection;
	}
}
