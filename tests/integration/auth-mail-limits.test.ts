import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { startTestMailSink, type TestMailSink } from '../helpers/mail-sink';
import { resendVerification, signUp, signUpInvited, type RequestContext } from '../../src/lib/server/auth/accounts';
import { takeInvitationAllowance } from '../../src/lib/server/auth/mail-limits';
import { getUserByEmail } from '../../src/lib/server/db/users';

const PASSWORD = 'harbour-light-seven-42';
const SIGN_UPS_REFUSED = /^Too many sign-ups for this address or from this network\. Try again in \d+ minutes?\.$/;

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

function from(ip: string): RequestContext {
	return { ip, userAgent: 'vitest', origin: 'http://127.0.0.1:9' };
}

function nextEmail(prefix = 'mailed') {
	counter += 1;
	return `${prefix}-${counter}@test.example`;
}

async function askForAccount(email: string, context: RequestContext) {
	const outcome = await signUp({ email, name: 'Oona Strand', password: PASSWORD }, context);
	if (outcome.ok) await outcome.delivery;
	return outcome;
}

describe('sign-up limits', () => {
	it('takes five sign-ups an hour for one address, then names the wait; no mail goes out for the sixth', async () => {
		const email = nextEmail();
		for (let i = 1; i <= 5; i += 1) expect((await askForAccount(email, from(`10.4.0.${i}`))).ok, `sign-up ${i}`).toBe(true);
		const mailsBefore = (await sink.messagesTo(email)).length;
		const sixth = await askForAccount(email, from('10.4.0.6'));
		expect(sixth).toEqual({ ok: false, errors: {}, message: expect.stringMatching(SIGN_UPS_REFUSED), limited: true });
		expect(await sink.messagesTo(email)).toHaveLength(mailsBefore);
	});

	it('answers an address with a confirmed account in the same words when its allowance is used up', async () => {
		const known = nextEmail();
		await signUpInvited({ email: known, name: 'Oona Strand', password: PASSWORD }, from('10.4.1.99'));
		const unknown = nextEmail();
		const answers: string[] = [];
		for (const email of [known, unknown]) {
			for (let i = 1; i <= 5; i += 1) await askForAccount(email, from(`10.4.${counter}.${i}`));
			const sixth = await askForAccount(email, from(`10.4.${counter}.6`));
			answers.push(!sixth.ok && sixth.message ? sixth.message : 'allowed');
		}
		expect(answers[0]).toMatch(SIGN_UPS_REFUSED);
		// The same words; only the wait may differ by the time the loop took.
		const withoutWait = (message: string) => message.replace(/\d+ minutes?/, 'N minutes');
		expect(withoutWait(answers[1])).toBe(withoutWait(answers[0]));
	});

	it('takes five sign-ups an hour from one network address, whatever the e-mail addresses', async () => {
		const office = from('10.4.200.1');
		for (let i = 1; i <= 5; i += 1) expect((await askForAccount(nextEmail(), office)).ok, `sign-up ${i}`).toBe(true);
		const sixth = await askForAccount(nextEmail(), office);
		expect(!sixth.ok && sixth.message).toMatch(SIGN_UPS_REFUSED);
		// The refused sign-up did not use up the address's own allowance: from elsewhere it goes through.
		const email = nextEmail();
		expect((await askForAccount(email, office)).ok).toBe(false);
		expect((await askForAccount(email, from('10.4.200.2'))).ok).toBe(true);
	});

	it('does not count a sign-up refused for its password', async () => {
		const office = from('10.4.201.1');
		for (let i = 0; i < 6; i += 1) {
			const outcome = await signUp({ email: nextEmail(), name: 'Oona Strand', password: 'short' }, office);
			expect(outcome).toMatchObject({ ok: false, limited: false });
		}
		expect((await askForAccount(nextEmail(), office)).ok).toBe(true);
	});
});

describe('resendVerification limit', () => {
	it('sends three new links an hour to one account, then names the wait', async () => {
		const email = nextEmail();
		await askForAccount(email, from('10.4.202.1'));
		const user = await getUserByEmail(email, database.knex);
		for (let i = 0; i < 3; i += 1) expect(await resendVerification(user!.id, 'http://127.0.0.1:9')).toEqual({ ok: true });
		const fourth = await resendVerification(user!.id, 'http://127.0.0.1:9');
		expect(fourth).toEqual({
			ok: false,
			message: expect.stringMatching(/^You asked for a new link three times in the last hour\. Use the newest one, or ask again in \d+ minutes?\.$/)
		});
		// The sign-up's own link and three more.
		expect(await sink.messagesTo(email)).toHaveLength(4);
	});
});

describe('invitation limit', () => {
	it('lets a workspace send twenty invitations an hour, and no more; another workspace is not affected', async () => {
		const busy = randomUUID();
		for (let i = 1; i <= 20; i += 1) expect(await takeInvitationAllowance(busy), `invitation ${i}`).toEqual({ allowed: true });
		const next = await takeInvitationAllowance(busy);
		expect(next.allowed).toBe(false);
		expect(!next.allowed && next.retryAfterSeconds).toBeGreaterThan(3000);
		expect(!next.allowed && next.retryAfterSeconds).toBeLessThanOrEqual(3600);
		expect(await takeInvitationAllowance(randomUUID())).toEqual({ allowed: true });
	});
});
