/**
 * Single-use, expiring tokens sent by e-mail (address verification, password
 * reset). The link carries the token; the database keeps only its sha256.
 */
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { generateRandomToken, hashToken } from './tokens';

export type EmailTokenPurpose = 'verify-email' | 'reset-password';

export const tokenLifetimesMs: Record<EmailTokenPurpose, number> = {
	'verify-email': 48 * 60 * 60 * 1000,
	'reset-password': 30 * 60 * 1000
};

/** Makes a new token and voids the user's earlier unused tokens of the same purpose. */
export async function createEmailToken(
	userId: string,
	email: string,
	purpose: EmailTokenPurpose,
	knex: Knex = db(),
	now = new Date()
): Promise<string> {
	const token = generateRandomToken();
	await knex.transaction(async (trx) => {
		await trx('email_tokens').where({ user_id: userId, purpose }).whereNull('used_at').update({ used_at: now });
		await trx('email_tokens').insert({
			id: hashToken(token),
			user_id: userId,
			email,
			purpose,
			expires_at: new Date(now.getTime() + tokenLifetimesMs[purpose])
		});
	});
	return token;
}

export type TokenCheck = { ok: true; userId: string; email: string } | { ok: false; reason: 'unknown' | 'used' | 'expired' };

/** Looks at a token without spending it (for showing the right form). */
export async function peekEmailToken(token: string, purpose: EmailTokenPurpose, knex: Knex = db(), now = new Date()): Promise<TokenCheck> {
	const row = await knex('email_tokens').select('user_id', 'email', 'expires_at', 'used_at').where({ id: hashToken(token), purpose }).first();
	if (!row) return { ok: false, reason: 'unknown' };
	if (row.used_at) return { ok: false, reason: 'used' };
	if (new Date(row.expires_at).getTime() <= now.getTime()) return { ok: false, reason: 'expired' };
	return { ok: true, userId: row.user_id, email: row.email };
}

/** Spends a token atomically: of two concurrent uses, exactly one succeeds. */
export async function consumeEmailToken(
	token: string,
	purpose: EmailTokenPurpose,
	knex: Knex = db(),
	now = new Date()
): Promise<TokenCheck> {
	const [row] = await knex('email_tokens')
		.where({ id: hashToken(token), purpose })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.update({ used_at: now })
		.returning(['user_id', 'email']);
	if (row) return { ok: true, userId: row.user_id, email: row.email };
	const peek = await peekEmailToken(token, purpose, knex, now);
	return peek.ok ? { ok: false, reason: 'used' } : peek;
}

export const tokenProblemWords: Record<'unknown' | 'used' | 'expired', string> = {
	unknown: 'This link is not valid. Ask for a new one.',
	used: 'This link has already been used. Ask for a new one if you still need it.',
	expired: 'This link has expired. Ask for a new one.'
};
