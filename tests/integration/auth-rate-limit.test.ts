import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { startTestMailSink, type TestMailSink } from '../helpers/mail-sink';
import { SIGN_IN_REFUSED, signIn, signUp, type RequestContext } from '../../src/lib/server/auth/accounts';

const PASSWORD = 'harbour-light-seven-42';
const BLOCKED = /^Too many failed attempts\. Try again in \d+ minutes?\.$/;

let database: TestDatabase;
let sink: TestMailSink;
let counter = 0;

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

async function newAccount() {
	counter += 1;
	const email = `limited-${counter}@test.example`;
	const outcome = await signUp({ email, name: `Limited ${counter}`, password: PASSWORD }, contextFrom('10.9.9.9'), { emailAlreadyVerified: true });
	if (!outcome.ok) throw new Error(JSON.stringify(outcome.errors));
	return { email, userId: outcome.userId };
}

async function failTimes(email: string, times: number, context: RequestContext) {
	const messages: string[] = [];
	for (let i = 0; i < times; i += 1) {
		const outcome = await signIn({ email, password: `wrong-password-${i}-xyz` }, context);
		if (outcome.ok) throw new Error('a wrong password signed in');
		messages.push(outcome.message);
	}
	return messages;
}

async function sessionCount(userId: string) {
	const [row] = await database.knex('sessions').where({ user_id: userId }).count<{ count: string }[]>({ count: '*' });
	return Number(row.count);
}

describe('sign-in rate limit per account', () => {
	// OWASP ASVS 4.0.3 V2.2.1 (anti-automation against credential guessing); five tries per 15 minutes is this product's choice.
	it('blocks the sixth attempt after five failures, even with the right password', async () => {
		const { email, userId } = await newAccount();
		const context = contextFrom('10.0.0.1');
		const sessionsBefore = await sessionCount(userId);
		expect(await failTimes(email, 5, context)).toEqual(Array(5).fill(SIGN_IN_REFUSED));

		const sixth = await signIn({ email, password: PASSWORD }, context);
		expect(sixth.ok).toBe(false);
		expect(!sixth.ok && sixth.message).toMatch(BLOCKED);
		expect(await sessionCount(userId)).toBe(sessionsBefore);
		// From another address the account is just as blocked: the counter belongs to the account.
		const elsewhere = await signIn({ email, password: PASSWORD }, contextFrom('10.0.0.2'));
		expect(!elsewhere.ok && elsewhere.message).toMatch(BLOCKED);
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
		expect(unknownBlocked).toEqual(knownBlocked);
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
		const events = await database.knex('audit_events').select('event', 'actor_user_id', 'ip').where({ actor_email: email }).orderBy('id');
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
	});
});

describe('sign-in rate limit under a burst', () => {
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
