import type { Knex } from 'knex';
import { db } from './knex';
import { forgetCachedSessions } from '../auth/session-cache';

export interface UserRow {
	id: string;
	email: string;
	name: string;
	email_verified_at: Date | null;
	created_at: Date;
}

const userColumns = ['id', 'email', 'name', 'email_verified_at', 'created_at'] as const;

export function normaliseEmail(email: string): string {
	return email.trim().toLowerCase();
}

export async function getUserById(id: string, knex: Knex = db()): Promise<UserRow | undefined> {
	return knex('users').select(userColumns).where({ id }).first();
}

export async function getUserByEmail(email: string, knex: Knex = db()): Promise<UserRow | undefined> {
	return knex('users').select(userColumns).whereRaw('lower(email) = ?', [normaliseEmail(email)]).first();
}

/** The only query that reads a password hash, for sign-in and password change. */
export async function getUserCredentialsByEmail(email: string, knex: Knex = db()) {
	return knex('users')
		.select('id', 'email', 'password_hash', 'email_verified_at')
		.whereRaw('lower(email) = ?', [normaliseEmail(email)])
		.first<{ id: string; email: string; password_hash: string; email_verified_at: Date | null } | undefined>();
}

export async function getPasswordHash(userId: string, knex: Knex = db()): Promise<string | undefined> {
	const row = await knex('users').select('password_hash').where({ id: userId }).first();
	return row?.password_hash;
}

export async function createUser(
	input: { email: string; name: string; passwordHash: string; emailVerified?: boolean },
	knex: Knex = db()
): Promise<UserRow> {
	const [row] = await knex('users')
		.insert({
			email: normaliseEmail(input.email),
			name: input.name.trim(),
			password_hash: input.passwordHash,
			email_verified_at: input.emailVerified ? knex.fn.now() : null
		})
		.returning(userColumns);
	return row;
}

export async function markEmailVerified(userId: string, knex: Knex = db()) {
	await knex('users').where({ id: userId }).whereNull('email_verified_at').update({ email_verified_at: knex.fn.now() });
	forgetCachedSessions();
}

export async function updateUserName(userId: string, name: string, knex: Knex = db()) {
	await knex('users').where({ id: userId }).update({ name: name.trim(), updated_at: knex.fn.now() });
	forgetCachedSessions();
}

export async function updatePasswordHash(userId: string, passwordHash: string, knex: Knex = db()) {
	await knex('users')
		.where({ id: userId })
		.update({ password_hash: passwordHash, password_changed_at: knex.fn.now(), updated_at: knex.fn.now() });
	forgetCachedSessions();
}

export function isUniqueViolation(error: unknown): boolean {
	return typeof error === 'object' && error !== null && (error as { code?: string }).code === '23505';
}
