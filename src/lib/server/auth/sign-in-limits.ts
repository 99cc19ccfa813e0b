/**
 * Sign-in limits that stop password guessing without letting a stranger lock
 * anyone out.
 *
 * - From one network address, an account gets 5 failures in 15 minutes; then
 *   that account-and-address pair waits 15 minutes. An address gets 50
 *   failures across all accounts (password spraying); then it waits 15 minutes.
 * - Across all addresses an account is never locked, only slowed down: after
 *   5 failures in a day, attempts from browsers it does not know pass one at a
 *   time, each one making the next wait, from 2 seconds doubling up to 5
 *   minutes (accountDelaySeconds).
 * - A browser the account signed in from before (known-devices.ts) is limited
 *   on its own only: 5 failures in 15 minutes, then 15 minutes' wait. No
 *   stranger's failures reach it.
 *
 * Every attempt takes its points before the password is checked, so a burst
 * of parallel guesses cannot all pass a check made before any is counted. A
 * success clears what its path counted and gives the network address its
 * point back, so in effect only failures count. Keys derive from the address
 * as typed, so an address without an account behaves exactly like one with.
 */
import { db } from '../db/knex';
import { RATE_LIMIT_TABLE, addressKey, storedLimiter, take, takeAll } from './rate-limit';

const QUARTER_HOUR = 15 * 60;
const DAY = 24 * 60 * 60;
export const FREE_FAILURES = 5;
const LONGEST_DELAY_SECONDS = 5 * 60;

/**
 * The seconds an account's next attempt from an unknown browser must wait
 * after `failures` failures from anywhere: none within the free ones, then
 * 2, 4, 8 … seconds, at most 5 minutes (exponential back-off, common practice;
 * OWASP ASVS 4.0.3 V2.2.1 asks for anti-automation that does not lock accounts out).
 */
export function accountDelaySeconds(failures: number): number {
	if (failures < FREE_FAILURES) return 0;
	return Math.min(2 ** (failures - FREE_FAILURES + 1), LONGEST_DELAY_SECONDS);
}

const prefixes = { pair: 'signin-pair', device: 'signin-device' } as const;

let limiters: ReturnType<typeof makeLimiters> | undefined;
function makeLimiters() {
	return {
		pair: storedLimiter(prefixes.pair, 5, QUARTER_HOUR, QUARTER_HOUR),
		ip: storedLimiter('signin-ip', 50, QUARTER_HOUR, QUARTER_HOUR),
		device: storedLimiter(prefixes.device, 5, QUARTER_HOUR, QUARTER_HOUR),
		// Counts only; never refuses by itself (the store's points column is a 32-bit integer).
		accountFailures: storedLimiter('signin-account-failures', 2_000_000_000, DAY),
		// One point a window; each window as long as accountDelaySeconds says.
		accountGate: storedLimiter('signin-account-gate', 1, 1)
	};
}
function get() {
	limiters ??= makeLimiters();
	return limiters;
}

export interface SignInRefusal {
	retryAfterSeconds: number;
	/** Which limit refused: this pair or network address, this known browser, or the account's slow-down. */
	limit: 'address' | 'device' | 'account';
}

/** Counts one attempt before its password is checked; null when it may go on, else why and how long to wait. */
export async function reserveSignInAttempt(email: string, ip: string, knownDevice: string | null): Promise<SignInRefusal | null> {
	const l = get();
	const account = addressKey(email);
	if (knownDevice !== null) {
		const taken = await take(l.device, `${account}:${knownDevice}`);
		return taken.allowed ? null : { retryAfterSeconds: taken.retryAfterSeconds, limit: 'device' };
	}

	const addressTakes = [
		{ limiter: l.pair, key: `${account}:${ip}` },
		{ limiter: l.ip, key: ip }
	];
	const address = await takeAll(addressTakes);
	if (!address.allowed) return { retryAfterSeconds: address.retryAfterSeconds, limit: 'address' };
	// Counted only after the address limits let the attempt through: an attempt they
	// refuse would otherwise hold an account point until its refund, and a parallel
	// attempt reading that point would be slowed down for a failure that never was.
	const failures = await l.accountFailures.consume(account, 1);

	const delay = accountDelaySeconds(failures.consumedPoints - 1);
	if (delay === 0) return null;
	const gate = await take(l.accountGate, account, { customDuration: delay });
	if (gate.allowed) return null;
	// Turned away without a password check: this attempt counts nowhere.
	const takes = [...addressTakes, { limiter: l.accountFailures, key: account }];
	await Promise.all(takes.map(({ limiter, key }) => limiter.reward(key, 1)));
	return { retryAfterSeconds: gate.retryAfterSeconds, limit: 'account' };
}

/** A right password: what this attempt's path counted starts afresh, and the attempt no longer counts against the network address. */
export async function signInSucceeded(email: string, ip: string, knownDevice: string | null): Promise<void> {
	const l = get();
	const account = addressKey(email);
	if (knownDevice !== null) {
		await l.device.delete(`${account}:${knownDevice}`);
		return;
	}
	await Promise.all([l.pair.delete(`${account}:${ip}`), l.accountFailures.delete(account), l.accountGate.delete(account), l.ip.reward(ip, 1)]);
}

/** Every sign-in limit on the account, from every address and browser (after a password reset from the e-mailed link). */
export async function clearSignInLimits(email: string): Promise<void> {
	const l = get();
	const account = addressKey(email);
	await Promise.all([
		l.accountFailures.delete(account),
		l.accountGate.delete(account),
		// The pair and browser counters of one account share a key prefix in the store (`prefix:account:…`).
		db()(RATE_LIMIT_TABLE)
			.where('key', 'like', `${prefixes.pair}:${account}:%`)
			.orWhere('key', 'like', `${prefixes.device}:${account}:%`)
			.delete()
	]);
}
