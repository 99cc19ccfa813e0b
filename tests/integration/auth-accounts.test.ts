import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { startTestMailSink, tokenFromMessage, type TestMailSink } from '../helpers/mail-sink';
import {
	SIGN_IN_REFUSED,
	requestPasswordReset,
	resendVerification,
	resetPassword,
	signIn,
	signUp,
	verifyEmail,
	type RequestContext
} from '../../src/lib/server/auth/accounts';
import { tokenProblemWords } from '../../src/lib/server/auth/email-tokens';
import { validateSessionToken, createSession, generateSessionToken } from '../../src/lib/server/auth/session';
import { getUserByEmail } from '../../src/lib/server/db/users';
import { listWorkspacesForUser } from '../../src/lib/server/db/memberships';

const PASSWORD = 'harbour-light-seven-42';
const NEW_PASSWORD = 'quayside-lantern-nine-17';
const ORIGIN = 'http://127.0.0.1:9';

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

function context(ip = '10.2.0.1'): RequestContext {
	return { ip, userAgent: 'vitest', origin: ORIGIN };
}

function nextEmail(prefix = 'account') {
	counter += 1;
	return `${prefix}-${counter}@test.example`;
}

async function signedUp(email = nextEmail()) {
	const outcome = await signUp({ email, name: 'Maren Tidy', password: PASSWORD, workspaceName: 'Tidy Tidal' }, context());
	if (!outcome.ok) throw new Error(JSON.stringify(outcome.errors));
	return outcome;
}

describe('signUp', () => {
	it('makes the account, a workspace it owns, and a session', async () => {
		const email = nextEmail();
		const outcome = await signedUp(email);
		const workspaces = await listWorkspacesForUser(outcome.userId, database.knex);
		expect(workspaces).toEqual([expect.objectContaining({ workspaceName: 'Tidy Tidal', role: 'owner' })]);
		expect((await validateSessionToken(outcome.sessionToken, database.knex)).user?.email).toBe(email);
		expect(outcome.session.workspaceId).toBe(workspaces[0].workspaceId);
	});

	it('refuses a second account for the same address in another letter case', async () => {
		const email = nextEmail();
		await signedUp(email);
		const again = await signUp({ email: email.toUpperCase(), name: 'Maren Again', password: PASSWORD }, context());
		expect(again).toEqual({
			ok: false,
			errors: { email: 'An account with this e-mail already exists. Sign in, or reset its password.' }
		});
	});

	it('refuses a password the policy refuses before making anything', async () => {
		const email = nextEmail();
		const outcome = await signUp({ email, name: 'Maren Weak', password: 'password1234' }, context());
		expect(outcome.ok).toBe(false);
		expect(await getUserByEmail(email, database.knex)).toBeUndefined();
		expect(await sink.messagesTo(email)).toEqual([]);
	});
});

describe('e-mail verification', () => {
	it('mails a link in plain text and HTML whose token verifies the address once', async () => {
		const email = nextEmail();
		await signedUp(email);
		const [message] = await sink.messagesTo(email);
		expect(message.subject).toBe('Confirm your e-mail address for Tidewright');
		const token = tokenFromMessage(message, `${ORIGIN}/verify-email`);
		expect(message.html).toContain(`${ORIGIN}/verify-email/${token}`);
		expect((await getUserByEmail(email, database.knex))?.email_verified_at).toBeNull();

		expect(await verifyEmail(token, '10.2.0.1')).toEqual({ ok: true });
		expect((await getUserByEmail(email, database.knex))?.email_verified_at).not.toBeNull();
		expect(await verifyEmail(token, '10.2.0.1')).toEqual({ ok: false, message: tokenProblemWords.used });
	});

	it('verifies an address signed up with capital letters', async () => {
		const email = nextEmail('Mixed.Case');
		await signedUp(email);
		const [message] = await sink.messagesTo(email.toLowerCase());
		const token = tokenFromMessage(message, `${ORIGIN}/verify-email`);
		expect(await verifyEmail(token, '10.2.0.1')).toEqual({ ok: true });
		expect((await getUserByEmail(email, database.knex))?.email_verified_at).not.toBeNull();
	});

	it('voids the first link when a new one is sent', async () => {
		const email = nextEmail();
		const { userId } = await signedUp(email);
		await resendVerification(userId, ORIGIN);
		const [newest, oldest] = await sink.messagesTo(email);
		const oldToken = tokenFromMessage(oldest, `${ORIGIN}/verify-email`);
		const newToken = tokenFromMessage(newest, `${ORIGIN}/verify-email`);
		expect(oldToken).not.toBe(newToken);
		expect(await verifyEmail(oldToken, '10.2.0.1')).toEqual({ ok: false, message: tokenProblemWords.used });
		expect(await verifyEmail(newToken, '10.2.0.1')).toEqual({ ok: true });
	});
});

describe('password reset', () => {
	it('mails a link to a known address; the reset ends every session and the new password signs in', async () => {
		const email = nextEmail();
		const { userId, sessionToken } = await signedUp(email);
		const otherDevice = generateSessionToken();
		await createSession(otherDevice, userId, {}, database.knex);
		await sink.clear();

		await requestPasswordReset(email, context());
		const [message] = await sink.messagesTo(email);
		expect(message.subject).toBe('Choose a new Tidewright password');
		const token = tokenFromMessage(message, `${ORIGIN}/reset-password`);

		expect(await resetPassword(token, NEW_PASSWORD, context())).toEqual({ ok: true });
		expect((await validateSessionToken(sessionToken, database.knex)).session).toBeNull();
		expect((await validateSessionToken(otherDevice, database.knex)).session).toBeNull();
		expect((await signIn({ email, password: PASSWORD }, context('10.2.0.2'))).ok).toBe(false);
		expect((await signIn({ email, password: NEW_PASSWORD }, context('10.2.0.2'))).ok).toBe(true);
		// The link reached the mailbox, so the address counts as verified too.
		expect((await getUserByEmail(email, database.knex))?.email_verified_at).not.toBeNull();

		expect(await resetPassword(token, 'yet-another-password-55', context())).toEqual({
			ok: false,
			errors: { token: tokenProblemWords.used },
			tokenDead: true
		});
	});

	it('sends nothing to an unknown address and answers the same way', async () => {
		const email = nextEmail('unknown');
		await expect(requestPasswordReset(email, context())).resolves.toBeUndefined();
		expect(await sink.messagesTo(email)).toEqual([]);
	});

	it('keeps the token alive when the new password is refused', async () => {
		const email = nextEmail();
		await signedUp(email);
		await requestPasswordReset(email, context());
		const [message] = await sink.messagesTo(email);
		const token = tokenFromMessage(message, `${ORIGIN}/reset-password`);
		const refused = await resetPassword(token, 'short', context());
		expect(refused).toEqual({ ok: false, errors: { password: 'Use at least 12 characters.' } });
		expect(await resetPassword(token, NEW_PASSWORD, context())).toEqual({ ok: true });
	});

	it('sends at most five reset mails an hour to one address', async () => {
		const email = nextEmail();
		await signedUp(email);
		await sink.clear();
		for (let i = 0; i < 7; i += 1) await requestPasswordReset(email, context());
		expect(await sink.messagesTo(email)).toHaveLength(5);
	});

	it('clears the sign-in block of an account whose password was reset', async () => {
		const email = nextEmail();
		await signedUp(email);
		for (let i = 0; i < 5; i += 1) {
			const outcome = await signIn({ email, password: `wrong-password-${i}-xyz` }, context('10.2.0.3'));
			expect(!outcome.ok && outcome.message).toBe(SIGN_IN_REFUSED);
		}
		expect((await signIn({ email, password: PASSWORD }, context('10.2.0.3'))).ok).toBe(false);
		await requestPasswordReset(email, context());
		const [message] = await sink.messagesTo(email);
		await resetPassword(tokenFromMessage(message, `${ORIGIN}/reset-password`), NEW_PASSWORD, context());
		expect((await signIn({ email, password: NEW_PASSWORD }, context('10.2.0.3'))).ok).toBe(true);
	});
});
