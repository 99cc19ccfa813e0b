/**
 * Brute-force limits on sign-in, kept in PostgreSQL so every app process
 * shares them (rate-limiter-flexible's Postgres store). Only failures count;
 * a success clears the account's counter. The key is the e-mail as typed, so
 * unknown and known addresses behave alike.
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

function stateOf(res: RateLimiterRes | null, points: number): LimitState {
	if (!res) return { blocked: false, retryAfterSeconds: 0 };
	return { blocked: res.consumedPoints >= points, retryAfterSeconds: Math.ceil(res.msBeforeNext / 1000) };
}

export async function signInBlocked(email: string, ip: string): Promise<LimitState> {
	const { account, ip: byIp } = get();
	const [a, i] = await Promise.all([account.get(email.toLowerCase()), byIp.get(ip)]);
	const accountState = stateOf(a, 5);
	const ipState = stateOf(i, 50);
	if (accountState.blocked) return accountState;
	return ipState;
}

async function consumeQuietly(limiter: RateLimiterPostgres, key: string) {
	try {
		await limiter.consume(key);
	} catch (rejection) {
		if (!(rejection instanceof RateLimiterRes)) throw rejection;
	}
}

export async function recordFailedSignIn(email: string, ip: string): Promise<void> {
	const { account, ip: byIp } = get();
	await Promise.all([consumeQuietly(account, email.toLowerCase()), consumeQuietly(byIp, ip)]);
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
