/**
 * The tools every limit in the app is built from: counters kept in PostgreSQL
 * (rate-limiter-flexible's Postgres store, table rate_limits) so every app
 * process shares them, a key for an e-mail address that neither stores the
 * address nor depends on whether it has an account, and the wait in words.
 * The policies live beside their journeys (sign-in-limits.ts, mail-limits.ts).
 */
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { db } from '../db/knex';
import { normaliseEmail } from '../db/users';
import { hashToken } from './tokens';

export const RATE_LIMIT_TABLE = 'rate_limits';

export function storedLimiter(keyPrefix: string, points: number, durationSeconds: number, blockSeconds = 0): RateLimiterPostgres {
	return new RateLimiterPostgres({
		storeClient: db(),
		storeType: 'knex',
		tableName: RATE_LIMIT_TABLE,
		tableCreated: true,
		keyPrefix,
		points,
		duration: durationSeconds,
		blockDuration: blockSeconds
	});
}

/**
 * An address as a counter key: the sha256 of its normalised form. The same
 * for an address with an account and one without; fits the store's 255
 * characters whatever the address's length; keeps addresses out of the table.
 */
export function addressKey(email: string): string {
	return hashToken(normaliseEmail(email));
}

export type Take = { allowed: true; used: number } | { allowed: false; retryAfterSeconds: number };

/** Takes one point; refused once the limiter's points are used up, with the seconds until it frees up. */
export async function take(limiter: RateLimiterPostgres, key: string, options: { customDuration?: number } = {}): Promise<Take> {
	try {
		const result = await limiter.consume(key, 1, options);
		return { allowed: true, used: result.consumedPoints };
	} catch (rejection) {
		if (rejection instanceof RateLimiterRes) return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil(rejection.msBeforeNext / 1000)) };
		throw rejection;
	}
}

/** Takes one point from each limiter at once; when any refuses, the others get theirs back and the longest wait is answered. */
export async function takeAll(
	takes: { limiter: RateLimiterPostgres; key: string }[]
): Promise<{ allowed: true } | { allowed: false; retryAfterSeconds: number }> {
	const outcomes = await Promise.all(takes.map(({ limiter, key }) => take(limiter, key)));
	const waits = outcomes.flatMap((o) => (o.allowed ? [] : [o.retryAfterSeconds]));
	if (waits.length === 0) return { allowed: true };
	await Promise.all(takes.map(({ limiter, key }, i) => (outcomes[i].allowed ? limiter.reward(key, 1) : null)));
	return { allowed: false, retryAfterSeconds: Math.max(...waits) };
}

/** "42 seconds", "1 minute", "60 minutes", "2 hours": a wait rounded up to the unit a person would use. */
export function waitInWords(seconds: number): string {
	const plural = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
	const whole = Math.max(1, Math.ceil(seconds));
	if (whole < 60) return plural(whole, 'second');
	if (whole <= 3600) return plural(Math.ceil(whole / 60), 'minute');
	return plural(Math.ceil(whole / 3600), 'hour');
}
