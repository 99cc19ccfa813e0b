import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { startTestMailSink, type TestMailSink } from '../helpers/mail-sink';
import { addressKey } from '../../src/lib/server/auth/rate-limit';
import { SIGN_IN_REFUSED, signIn, signUpInvited, type RequestContext } from '../../src/lib/server/auth/accounts';

const PASSWORD = 'harbour-light-seven-42';
const BLOCKED = /^Too many failed attempts\. Try again in \d+ (seconds?|minutes?)\.$/;
const SLOWED = /^Too many failed attempts on this account\. Try again in (\d+) (seconds?|minutes?); a browser you signed in with before is not held up\.$/;

let database: TestDatabase;
let sink: TestMailSink;
let counter = 0;
let strangerAddresses = 0;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	sink = await startTestMailSink();
});
afterAll(async () => {
	await sink.stop();
	await database.drop();
});

/** Each test signs in from an address of its own, so the per-IP counter of one test does not reach the next. */
function contextFrom(ip: string): RequestContext {
	return { ip, userAgent: 'vitest', origin: 'http://127.0.0.1:9' };
}

/** A network address never used before in this file: a stranger moving from address to address. */
function strangerContext(): RequestContext {
	strangerAddresses += 1;
	return contextFrom(`10.200.${Math.floor(strangerAddresses / 250)}.${(strangerAddresses % 250) + 1}`);
}

/** A confirmed account (an invited person's, so no mail round trip is needed). */
async function newAccount() {
	counter += 1;
	const email = `limited-${counter}@test.example`;
	const outcome = await signUpInvited({ email, name: `Limited ${counter}`, password: PASSWORD }, contextFrom('10.9.9.9'));
	if (!outcome.ok) throw new Error(JSON.stringify(outcome.errors));
	return { email, userId: outcome.userId };
}

async function failTimes(email: string, times: number, context: RequestContext | (() => RequestContext)) {
	const messages: string[] = [];
	for (let i = 0; i < times; i += 1) {
		const outcome = await signIn({ email, password: `wrong-password-${i}-xyz` }, typeof context === 'function' ? context() : context);
		if (outcome.ok) throw new Error('a wrong password signed in');
		messages.push(outcome.message);
	}
	return messages;
}

/** Signs in once with the right password so this "browser" becomes known; answers its device cookie. */
async function knownBrowserOf(email: string): Promise<string> {
	const outcome = await signIn({ email, password: PASSWORD }, contextFrom('10.8.8.8'));
	if (!outcome.ok) throw new Error(outcome.message);
	return outcome.device.token;
}

async function sessionCount(userId: string) {
	const [row] = await database.knex('sessions').where({ user_id: userId }).count<{ count: string }[]>({ count: '*' });
	return Number(row.count);
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('sign-in limit per account and network address', () => {
	// OWASP ASVS 4.0.3 V2.2.1 (anti-automation against credential guessing); five tries per 15 minutes is this product's choice.
	it('blocks the sixth attempt from one address after five failures, even with the right password', async () => {
		const { email, userId } = await newAccount();
		const context = contextFrom('10.0.0.1');
		const sessionsBefore = await sessionCount(userId);
		expect(await failTimes(email, 5, context)).toEqual(Array(5).fill(SIGN_IN_REFUSED));

		const sixth = await signIn({ email, password: PASSWORD }, context);
		expect(sixth.ok).toBe(false);
		expect(!sixth.ok && sixth.message).toMatch(BLOCKED);
		expect(await sessionCount(userId)).toBe(sessionsBefore);
	});

	it('does not lock the account itself: the right password from another address still signs in', async () => {
		const { email } = await newAccount();
		await failTimes(email, 5, contextFrom('10.0.1.1'));
		expect((await signIn({ email, password: PASSWORD }, contextFrom('10.0.1.2'))).ok).toBe(true);
	});

	it('lets the fifth attempt through when it has the right password', async () => {
		const { email } = await newAccount();
		const context = contextFrom('10.0.0.3');
		await failTimes(email, 4, context);
		expect((await signIn({ email, password: PASSWORD }, context)).ok).toBe(true);
	});

	it('answers an unknown address in the same words, before and after the block', async () => {
		const known = await newAccount();
		const unknown = `nobody-${counter}@test.example`;
		const knownMessages = await failTimes(known.email, 5, contextFrom('10.0.0.4'));
		const unknownMessages = await failTimes(unknown, 5, contextFrom('10.0.0.5'));
		expect(unknownMessages).toEqual(knownMessages);

		const knownBlocked = await signIn({ email: known.email, password: PASSWORD }, contextFrom('10.0.0.4'));
		const unknownBlocked = await signIn({ email: unknown, password: PASSWORD }, contextFrom('10.0.0.5'));
		expect(!knownBlocked.ok && knownBlocked.message).toMatch(BLOCKED);
		expect(!unknownBlocked.ok && unknownBlocked.message).toBe(!knownBlocked.ok && knownBlocked.message);
	});

	it('clears the counter on a successful sign-in', async () => {
		const { email } = await newAccount();
		const context = contextFrom('10.0.0.6');
		await failTimes(email, 4, context);
		expect((await signIn({ email, password: PASSWORD }, context)).ok).toBe(true);
		// Four more failures: eight in all, but only four since the success.
		await failTimes(email, 4, context);
		expect((await signIn({ email, password: PASSWORD }, context)).ok).toBe(true);
	});

	it('counts an address however it is typed (case, surrounding spaces)', async () => {
		const { email } = await newAccount();
		const context = contextFrom('10.0.0.7');
		await failTimes(email.toUpperCase(), 2, context);
		await failTimes(`  ${email}  `, 2, context);
		await failTimes(email.replace('limited', 'LIMITED'), 1, context);
		const sixth = await signIn({ email, password: PASSWORD }, context);
		expect(!sixth.ok && sixth.message).toMatch(BLOCKED);
	});

	it('keeps one account\u2019s block from touching another account', async () => {
		const blocked = await newAccount();
		const neighbour = await newAccount();
		const context = contextFrom('10.0.0.8');
		await failTimes(blocked.email, 5, context);
		expect((await signIn({ email: neighbour.email, password: PASSWORD }, context)).ok).toBe(true);
	});

	it('writes failed and blocked attempts to the audit log', async () => {
		const { email, userId } = await newAccount();
		const context = contextFrom('10.0.0.9');
		await failTimes(email, 5, context);
		await signIn({ email, password: PASSWORD }, context);
		const events = await database.knex('audit_events').select('event', 'actor_user_id', 'ip', 'detail').where({ actor_email: email }).orderBy('id');
		expect(events.map((e) => e.event)).toEqual([
			'sign-up',
			'sign-in-failed',
			'sign-in-failed',
			'sign-in-failed',
			'sign-in-failed',
			'sign-in-failed',
			'sign-in-blocked'
		]);
		expect(events.filter((e) => e.event === 'sign-in-failed').every((e) => e.actor_user_id === userId && e.ip === '10.0.0.9')).toBe(true);
		expect(events.at(-1)).toMatchObject({ actor_user_id: userId, detail: { limit: 'address' } });
	});
});

describe('sign-in slow-down of an account across network addresses', () => {
	it('never stops the right password from a browser that signed in before, whatever strangers try', async () => {
		const { email, userId } = await newAccount();
		const device = await knownBrowserOf(email);
		// A stranger moving from address to address: five free failures, one more through the gate, then slowed.
		const strangers = await failTimes(email, 12, strangerContext);
		expect(strangers.slice(0, 6)).toEqual(Array(6).fill(SIGN_IN_REFUSED));
		for (const message of strangers.slice(6)) expect(message).toMatch(SLOWED);

		const sessionsBefore = await sessionCount(userId);
		const fromKnownBrowser = await signIn({ email, password: PASSWORD }, strangerContext(), device);
		expect(fromKnownBrowser.ok).toBe(true);
		expect(await sessionCount(userId)).toBe(sessionsBefore + 1);
		// The same browser keeps its cookie: the token it had is the one it gets back.
		expect(fromKnownBrowser.ok && fromKnownBrowser.device.token).toBe(device);
		// A browser the account does not know is still held up.
		const fromNewBrowser = await signIn({ email, password: PASSWORD }, strangerContext());
		expect(!fromNewBrowser.ok && fromNewBrowser.message).toMatch(SLOWED);
	});

	it('lets the right password from a new browser through once the wait is over', async () => {
		const { email } = await newAccount();
		await failTimes(email, 6, strangerContext);
		const early = await signIn({ email, password: PASSWORD }, strangerContext());
		expect(!early.ok && early.message).toMatch(SLOWED);
		const [, seconds, unit] = SLOWED.exec(!early.ok ? early.message : '')!.map(String);
		// The sixth failure makes the next attempt wait 2 seconds (sign-in-limits.ts accountDelaySeconds).
		expect(unit).toMatch(/^seconds?$/);
		expect(Number(seconds)).toBeLessThanOrEqual(2);
		await sleep(Number(seconds) * 1000 + 300);
		expect((await signIn({ email, password: PASSWORD }, strangerContext())).ok).toBe(true);
	});

	it('answers an unknown address in the same words while it is slowed down', async () => {
		const known = await newAccount();
		const unknown = `nobody-slowed-${counter}@test.example`;
		const knownMessages = await failTimes(known.email, 8, strangerContext);
		const unknownMessages = await failTimes(unknown, 8, strangerContext);
		const withoutWait = (message: string) => message.replace(/\d+ (seconds?|minutes?)/, 'a while');
		expect(unknownMessages.map(withoutWait)).toEqual(knownMessages.map(withoutWait));
		expect(knownMessages.at(-1)).toMatch(SLOWED);
	});

	it('counts a device cookie only for the account that signed in with it', async () => {
		const owner = await newAccount();
		const target = await newAccount();
		const ownersDevice = await knownBrowserOf(owner.email);
		await failTimes(target.email, 7, strangerContext);
		const borrowed = await signIn({ email: target.email, password: PASSWORD }, strangerContext(), ownersDevice);
		expect(!borrowed.ok && borrowed.message).toMatch(SLOWED);
		// A made-up cookie is no known browser either.
		const forged = await signIn({ email: target.email, password: PASSWORD }, strangerContext(), 'a'.repeat(32));
		expect(!forged.ok && forged.message).toMatch(SLOWED);
	});

	it('limits a known browser on its own: five failures, then it waits, while other browsers are not held up by it', async () => {
		const { email } = await newAccount();
		const device = await knownBrowserOf(email);
		for (let i = 0; i < 5; i += 1) {
			const outcome = await signIn({ email, password: `wrong-password-${i}-xyz` }, strangerContext(), device);
			expect(!outcome.ok && outcome.message).toBe(SIGN_IN_REFUSED);
		}
		const sixth = await signIn({ email, password: PASSWORD }, strangerContext(), device);
		expect(!sixth.ok && sixth.message).toMatch(BLOCKED);
		expect((await signIn({ email, password: PASSWORD }, strangerContext())).ok).toBe(true);
	});

	it('checks no more than six passwords when twenty guesses arrive at once from twenty addresses', async () => {
		const { email } = await newAccount();
		const outcomes = await Promise.all(
			Array.from({ length: 20 }, (_, i) => signIn({ email, password: `burst-guess-${i}-xyz` }, strangerContext()))
		);
		const refused = outcomes.filter((o) => !o.ok && o.message === SIGN_IN_REFUSED);
		const slowed = outcomes.filter((o) => !o.ok && SLOWED.test(o.message));
		expect(refused.length).toBeLessThanOrEqual(6);
		expect(outcomes.filter((o) => !refused.includes(o) && !slowed.includes(o))).toEqual([]);
		expect(refused.length + slowed.length).toBe(20);
		const failures = await database.knex('audit_events').where({ actor_email: email, event: 'sign-in-failed' });
		expect(failures.length).toBe(refused.length);
	});
});

describe('sign-in rate limit under a burst from one address', () => {
	it('checks no more than five passwords when twenty guesses arrive at once', async () => {
		const { email } = await newAccount();
		const context = contextFrom('10.0.0.10');
		const outcomes = await Promise.all(
			Array.from({ length: 20 }, (_, i) => signIn({ email, password: `burst-guess-${i}-xyz` }, context))
		);
		const refused = outcomes.filter((o) => !o.ok && o.message === SIGN_IN_REFUSED);
		const blocked = outcomes.filter((o) => !o.ok && BLOCKED.test(o.message));
		expect(refused.length).toBeLessThanOrEqual(5);
		expect(refused.length + blocked.length).toBe(20);
		const failures = await database.knex('audit_events').where({ actor_email: email, event: 'sign-in-failed' });
		expect(failures.length).toBeLessThanOrEqual(5);
	});

	// Without this, a refused guess in a burst held an account point until its refund, and a
	// parallel guess that read it was slowed down on the account for a failure that never was.
	it('does not count against the account while the address limit is still deciding', async () => {
		const { email } = await newAccount();
		const context = contextFrom('10.0.0.11');
		await failTimes(email, 5, context);
		const account = addressKey(email);
		const accountPoints = async () => {
			const row = await database.knex('rate_limits').where({ key: `signin-account-failures:${account}` }).first('points');
			return Number(row?.points);
		};
		expect(await accountPoints()).toBe(5);

		// Hold the pair counter's row so the attempt's address check waits on it.
		const holder = await database.knex.transaction();
		let attempt: ReturnType<typeof signIn> | undefined;
		try {
			await holder('rate_limits').where({ key: `signin-pair:${account}:${context.ip}` }).forUpdate().first();
			attempt = signIn({ email, password: 'one-more-guess-xyz' }, context);
			await sleep(300);
			expect(await accountPoints()).toBe(5);
		} finally {
			await holder.commit();
		}
		const refused = await attempt;
		expect(refused && !refused.ok && refused.message).toMatch(BLOCKED);
		expect(await accountPoints()).toBe(5);
	});
});

describe('sign-in rate limit per IP', () => {
	it('blocks an address after fifty failures across many accounts, and only that address', async () => {
		const { email } = await newAccount();
		const sprayer = contextFrom('10.1.0.1');
		for (let i = 0; i < 50; i += 1) {
			const outcome = await signIn({ email: `spray-${i}@test.example`, password: 'wrong-password-xyz' }, sprayer);
			expect(!outcome.ok && outcome.message, `attempt ${i + 1}`).toBe(SIGN_IN_REFUSED);
		}
		const fromSprayer = await signIn({ email, password: PASSWORD }, sprayer);
		expect(!fromSprayer.ok && fromSprayer.message).toMatch(BLOCKED);
		expect((await signIn({ email, password: PASSWORD }, contextFrom('10.1.0.2'))).ok).toBe(true);
	});

	it('does not count successful sign-ins against the address', async () => {
		const { email } = await newAccount();
		const office = contextFrom('10.1.0.3');
		for (let i = 0; i < 45; i += 1) await signIn({ email: `typo-${i}@test.example`, password: 'wrong-password-xyz' }, office);
		// Ten colleagues' successes behind one office address: 55 attempts, but only 45 failures.
		for (let i = 0; i < 10; i += 1) expect((await signIn({ email, password: PASSWORD }, office)).ok, `success ${i + 1}`).toBe(true);
		expect((await signIn({ email, password: PASSWORD }, office)).ok).toBe(true);
	});
});
