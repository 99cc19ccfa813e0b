/**
 * Per-user limits on the routes that make the server calculate or parse: far
 * above what an analyst at work ever reaches (the editor evaluates its draft
 * as the user types, a second or so apart), low enough that one user cannot
 * keep the compute pool (./pool.ts) busy for everyone else. Kept in
 * PostgreSQL through rate-limiter-flexible, as the sign-in limits are, so
 * every app process shares them.
 */
import type { RateLimiterPostgres } from 'rate-limiter-flexible';
import { storedLimiter, take } from '../auth/rate-limit';
import { ApiProblem } from '../workbench/api-route';
import { computeSettings } from '../settings';

/** Requests each user may make per window, by kind of work. */
export const COMPUTE_LIMITS = {
	'evaluate-draft': { points: 120, windowSeconds: 60, words: 'evaluations of a draft' },
	tornado: { points: 30, windowSeconds: 60, words: 'tornado runs' },
	spider: { points: 30, windowSeconds: 60, words: 'spider runs' },
	compare: { points: 60, windowSeconds: 60, words: 'comparisons' },
	export: { points: 60, windowSeconds: 60, words: 'exports' },
	upload: { points: 60, windowSeconds: 60, words: 'uploads' },
	'probabilistic-run': { points: 10, windowSeconds: 60, words: 'probabilistic runs started' }
} as const satisfies Record<string, { points: number; windowSeconds: number; words: string }>;

export type ComputeAction = keyof typeof COMPUTE_LIMITS;

let limiters: Map<ComputeAction, RateLimiterPostgres> | undefined;

function limiterFor(action: ComputeAction): RateLimiterPostgres {
	limiters ??= new Map();
	let limiter = limiters.get(action);
	if (!limiter) {
		limiter = storedLimiter(`compute-${action}`, COMPUTE_LIMITS[action].points, COMPUTE_LIMITS[action].windowSeconds);
		limiters.set(action, limiter);
	}
	return limiter;
}

function windowWords(seconds: number): string {
	return seconds === 60 ? 'a minute' : `${seconds} seconds`;
}

/** `12 seconds`, `1 second` */
function secondsWords(seconds: number): string {
	return seconds === 1 ? '1 second' : `${seconds} seconds`;
}

/**
 * Counts one request of this kind against the user; over the limit, throws
 * the 429 answer with Retry-After. Call it after the request has been read
 * and checked, just before the work, so a refused body costs nothing.
 */
export async function takeComputeAllowance(userId: string, action: ComputeAction): Promise<void> {
	if (computeSettings().benchLimitsLifted) return;
	const taken = await take(limiterFor(action), userId);
	if (taken.allowed) return;
	const { points, windowSeconds, words } = COMPUTE_LIMITS[action];
	const retryAfterSeconds = taken.retryAfterSeconds;
	throw new ApiProblem(
		429,
		`Too many ${words}: each user may make ${points} in ${windowWords(windowSeconds)}. Try again in ${secondsWords(retryAfterSeconds)}.`,
		[],
		{ retryAfterSeconds },
		{ 'retry-after': String(retryAfterSeconds) }
	);
}
