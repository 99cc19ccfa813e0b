import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import {
	consumeEmailToken,
	createEmailToken,
	peekEmailToken,
	tokenLifetimesMs,
	type EmailTokenPurpose
} from '../../src/lib/server/auth/email-tokens';
import { createUser } from '../../src/lib/server/db/users';

const HOUR_MS = 60 * 60 * 1000;
const MINUTE_MS = 60 * 1000;

let database: TestDatabase;
let userCount = 0;

beforeAll(async () => {
	database = await createTestDatabase();
});
afterAll(() => database.drop());

async function newUser() {
	userCount += 1;
	return createUser({ email: `tokens-${userCount}@test.example`, name: `Token Tester ${userCount}`, passwordHash: 'unused' }, database.knex);
}

function sha256Hex(value: string) {
	// node:crypto, independent of the @oslojs implementation the app uses (FIPS 180-4 SHA-256).
	return createHash('sha256').update(value).digest('hex');
}

describe('createEmailToken', () => {
	it('stores only the sha256 of the token', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'verify-email', database.knex);
		const rows = await database.knex('email_tokens').where({ user_id: user.id });
		expect(rows).toHaveLength(1);
		expect(rows[0].id).toBe(sha256Hex(token));
		expect(Object.values(rows[0]).map(String)).not.toContain(token);
	});

	it('lives 48 hours for address checks and 30 minutes for password resets', async () => {
		// OWASP Forgot Password Cheat Sheet: reset tokens short-lived; the lengths are this product's choice.
		expect(tokenLifetimesMs['verify-email']).toBe(48 * HOUR_MS);
		expect(tokenLifetimesMs['reset-password']).toBe(30 * MINUTE_MS);
		const user = await newUser();
		const now = new Date('2026-03-01T09:00:00Z');
		const token = await createEmailToken(user.id, user.email, 'reset-password', database.knex, now);
		const row = await database.knex('email_tokens').where({ id: sha256Hex(token) }).first();
		expect(new Date(row.expires_at).getTime()).toBe(now.getTime() + 30 * MINUTE_MS);
	});

	it('voids the user\u2019s earlier unused token of the same purpose, and only that purpose', async () => {
		const user = await newUser();
		const other = await newUser();
		const oldReset = await createEmailToken(user.id, user.email, 'reset-password', database.knex);
		const verify = await createEmailToken(user.id, user.email, 'verify-email', database.knex);
		const othersReset = await createEmailToken(other.id, other.email, 'reset-password', database.knex);
		const newReset = await createEmailToken(user.id, user.email, 'reset-password', database.knex);

		expect(await consumeEmailToken(oldReset, 'reset-password', database.knex)).toEqual({ ok: false, reason: 'used' });
		expect(await consumeEmailToken(newReset, 'reset-password', database.knex)).toEqual({ ok: true, userId: user.id, email: user.email });
		expect((await consumeEmailToken(verify, 'verify-email', database.knex)).ok).toBe(true);
		expect((await consumeEmailToken(othersReset, 'reset-password', database.knex)).ok).toBe(true);
	});
});

describe('consumeEmailToken', () => {
	it('works once: the second use is refused as used', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'verify-email', database.knex);
		expect(await consumeEmailToken(token, 'verify-email', database.knex)).toEqual({ ok: true, userId: user.id, email: user.email });
		expect(await consumeEmailToken(token, 'verify-email', database.knex)).toEqual({ ok: false, reason: 'used' });
	});

	it('refuses an expired token, and it stays refused', async () => {
		const user = await newUser();
		const issued = new Date('2026-03-01T09:00:00Z');
		const purposes: EmailTokenPurpose[] = ['verify-email', 'reset-password'];
		for (const purpose of purposes) {
			const token = await createEmailToken(user.id, user.email, purpose, database.knex, issued);
			const expiry = new Date(issued.getTime() + tokenLifetimesMs[purpose]);
			expect(await consumeEmailToken(token, purpose, database.knex, expiry), purpose).toEqual({ ok: false, reason: 'expired' });
			expect(await peekEmailToken(token, purpose, database.knex, expiry), purpose).toEqual({ ok: false, reason: 'expired' });
			// One minute earlier it would still have worked.
			const justBefore = new Date(expiry.getTime() - MINUTE_MS);
			expect((await consumeEmailToken(token, purpose, database.knex, justBefore)).ok, purpose).toBe(true);
		}
	});

	it('refuses an unknown token and a token used for the other purpose', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'verify-email', database.knex);
		expect(await consumeEmailToken('not-a-token-we-made', 'verify-email', database.knex)).toEqual({ ok: false, reason: 'unknown' });
		expect(await consumeEmailToken(token, 'reset-password', database.knex)).toEqual({ ok: false, reason: 'unknown' });
		// The wrong-purpose attempt did not spend it.
		expect((await consumeEmailToken(token, 'verify-email', database.knex)).ok).toBe(true);
	});

	it('refuses the stored hash offered as the token', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'reset-password', database.knex);
		expect(await consumeEmailToken(sha256Hex(token), 'reset-password', database.knex)).toEqual({ ok: false, reason: 'unknown' });
	});

	it('lets exactly one of two concurrent uses win', async () => {
		for (let round = 0; round < 10; round += 1) {
			const user = await newUser();
			const token = await createEmailToken(user.id, user.email, 'reset-password', database.knex);
			const outcomes = await Promise.all([
				consumeEmailToken(token, 'reset-password', database.knex),
				consumeEmailToken(token, 'reset-password', database.knex)
			]);
			expect(outcomes.filter((o) => o.ok), `round ${round}`).toHaveLength(1);
			expect(outcomes.filter((o) => !o.ok)).toEqual([{ ok: false, reason: 'used' }]);
		}
	});

	it('lets exactly one of two concurrent uses win inside competing transactions', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'reset-password', database.knex);
		const inTransaction = () => database.knex.transaction((trx) => consumeEmailToken(token, 'reset-password', trx));
		const outcomes = await Promise.all([inTransaction(), inTransaction(), inTransaction()]);
		expect(outcomes.filter((o) => o.ok)).toHaveLength(1);
	});
});

describe('peekEmailToken', () => {
	it('reports a live token without spending it', async () => {
		const user = await newUser();
		const token = await createEmailToken(user.id, user.email, 'verify-email', database.knex);
		expect(await peekEmailToken(token, 'verify-email', database.knex)).toEqual({ ok: true, userId: user.id, email: user.email });
		expect(await peekEmailToken(token, 'verify-email', database.knex)).toEqual({ ok: true, userId: user.id, email: user.email });
		expect((await consumeEmailToken(token, 'verify-email', database.knex)).ok).toBe(true);
		expect(await peekEmailToken(token, 'verify-email', database.knex)).toEqual({ ok: false, reason: 'used' });
	});
});
