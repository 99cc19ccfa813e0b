import type { Knex } from 'knex';
import { db } from './knex';

/** True when this device hash belongs to the account and has not expired. */
export async function isKnownDeviceOf(tokenHash: string, userId: string, knex: Knex = db(), now = new Date()): Promise<boolean> {
	const row = await knex('known_devices').select('user_id').where({ token_hash: tokenHash, user_id: userId }).where('expires_at', '>', now).first();
	return row !== undefined;
}

/** Records (or renews) a device for an account, and forgets the account's expired ones. */
export async function rememberKnownDevice(tokenHash: string, userId: string, expiresAt: Date, knex: Knex = db(), now = new Date()): Promise<void> {
	await knex('known_devices')
		.insert({ token_hash: tokenHash, user_id: userId, expires_at: expiresAt, last_used_at: now })
		.onConflict(['token_hash', 'user_id'])
		.merge({ expires_at: expiresAt, last_used_at: now });
	await knex('known_devices').where({ user_id: userId }).where('expires_at', '<=', now).delete();
}
