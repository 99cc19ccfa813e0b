import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import {
	PASSWORD_MAX_LENGTH,
	PASSWORD_MIN_LENGTH,
	hashPassword,
	passwordProblem,
	verifyPasswordHash
} from '../../src/lib/server/auth/password';
import { commonPasswords } from '../../src/lib/server/auth/common-passwords';
import { createUser, getPasswordHash, getUserCredentialsByEmail } from '../../src/lib/server/db/users';

let database: TestDatabase;

beforeAll(async () => {
	database = await createTestDatabase();
});
afterAll(() => database.drop());

/** A password of `length` code points with many distinct characters (so only the length rule can refuse it). */
function passwordOfLength(length: number): string {
	const alphabet = 'tidal-Stream7Wave9Harbour';
	return Array.from({ length }, (_, i) => alphabet[i % alphabet.length]).join('');
}

describe('hashPassword', () => {
	it('encodes argon2id, version 19, m=19456 KiB, t=2, p=1 in the PHC string', async () => {
		// OWASP Password Storage Cheat Sheet: argon2id with 19 MiB memory, 2 iterations, 1 degree of parallelism.
		// PHC string format and v=19 (0x13, the current version) per RFC 9106 / the reference implementation.
		const encoded = await hashPassword('harbour-light-seven-42');
		expect(encoded).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]+$/);
	});

	it('salts each hash with 16 random bytes and keeps a 32-byte tag', async () => {
		// RFC 9106 section 3.1: a 128-bit salt is recommended; 256-bit tag is the RFC's recommended length.
		const first = await hashPassword('harbour-light-seven-42');
		const second = await hashPassword('harbour-light-seven-42');
		expect(first).not.toBe(second);
		const [, , , , salt, tag] = first.split('$');
		expect(Buffer.from(salt, 'base64')).toHaveLength(16);
		expect(Buffer.from(tag, 'base64')).toHaveLength(32);
	});

	it('never contains the password', async () => {
		const password = 'harbour-light-seven-42';
		const encoded = await hashPassword(password);
		expect(encoded).not.toContain(password);
		expect(encoded).not.toContain(Buffer.from(password).toString('base64').replace(/=+$/, ''));
	});
});

describe('verifyPasswordHash', () => {
	it('accepts the right password and refuses a wrong one', async () => {
		const encoded = await hashPassword('harbour-light-seven-42');
		expect(await verifyPasswordHash(encoded, 'harbour-light-seven-42')).toBe(true);
		expect(await verifyPasswordHash(encoded, 'harbour-light-seven-43')).toBe(false);
		expect(await verifyPasswordHash(encoded, 'Harbour-light-seven-42')).toBe(false);
		expect(await verifyPasswordHash(encoded, '')).toBe(false);
	});

	it('verifies the reference implementation\u2019s argon2id test vectors', async () => {
		// P-H-C/phc-winner-argon2 src/test.c, version 0x13, password "password", salt "somesalt".
		const m65536 = '$argon2id$v=19$m=65536,t=2,p=1$c29tZXNhbHQ$CTFhFdXPJO1aFaMaO6Mm5c8y7cJHAph8ArZWb2GRPPc';
		const m256 = '$argon2id$v=19$m=256,t=2,p=1$c29tZXNhbHQ$nf65EOgLrQMR/uIPnA4rEsF5h7TKyQwu9U1bMCHGi/4';
		expect(await verifyPasswordHash(m65536, 'password')).toBe(true);
		expect(await verifyPasswordHash(m256, 'password')).toBe(true);
		expect(await verifyPasswordHash(m65536, 'passwore')).toBe(false);
	});

	it('answers false, not an exception, for a stored value that is not a hash', async () => {
		expect(await verifyPasswordHash('x', 'harbour-light-seven-42')).toBe(false);
		expect(await verifyPasswordHash('', 'harbour-light-seven-42')).toBe(false);
		expect(await verifyPasswordHash('$argon2id$v=19$m=19456,t=2,p=1$broken', 'harbour-light-seven-42')).toBe(false);
	});

	it('verifies a hash stored in and read back from the users table', async () => {
		const user = await createUser(
			{ email: 'hash-roundtrip@test.example', name: 'Hash Roundtrip', passwordHash: await hashPassword('quayside-lantern-nine-17') },
			database.knex
		);
		const stored = (await getPasswordHash(user.id, database.knex))!;
		expect(stored.startsWith('$argon2id$v=19$m=19456,t=2,p=1$')).toBe(true);
		expect(await verifyPasswordHash(stored, 'quayside-lantern-nine-17')).toBe(true);
		expect(await verifyPasswordHash(stored, 'quayside-lantern-nine-18')).toBe(false);
		// The sign-in lookup matches the address case-insensitively and reads the same hash.
		expect((await getUserCredentialsByEmail('Hash-Roundtrip@TEST.example', database.knex))?.password_hash).toBe(stored);
	});

	it('keeps the hash out of the ordinary user columns', async () => {
		const user = await createUser(
			{ email: 'no-hash-leak@test.example', name: 'No Leak', passwordHash: await hashPassword('quayside-lantern-nine-17') },
			database.knex
		);
		expect(Object.keys(user)).not.toContain('password_hash');
	});
});

describe('passwordProblem', () => {
	// OWASP ASVS 4.0.3 V2.1.1 (at least 12 characters); the 256 ceiling is this product's choice (issue 4);
	// NIST SP 800-63B 5.1.1.2 (refuse commonly used passwords).
	it('refuses 11 characters and accepts 12', () => {
		expect(PASSWORD_MIN_LENGTH).toBe(12);
		expect(passwordProblem(passwordOfLength(11))).toBe('Use at least 12 characters.');
		expect(passwordProblem(passwordOfLength(12))).toBeNull();
	});

	it('accepts 256 characters and refuses 257', () => {
		expect(PASSWORD_MAX_LENGTH).toBe(256);
		expect(passwordProblem(passwordOfLength(256))).toBeNull();
		expect(passwordProblem(passwordOfLength(257))).toBe('Use at most 256 characters.');
	});

	it('counts characters, not UTF-16 units (ASVS V2.1.4: any Unicode character is allowed)', () => {
		const waves = ['🌊', '🐚', '⚓', '🐟', '🦀', '🐙'];
		const twelve = Array.from({ length: 12 }, (_, i) => waves[i % waves.length]).join('');
		const six = waves.join('');
		expect(six.length).toBe(11); // '⚓' is one UTF-16 unit, the others two
		expect(passwordProblem(twelve)).toBeNull();
		expect(passwordProblem(six)).toBe('Use at least 12 characters.');
	});

	it('refuses every entry of the common-password list, in any letter case', () => {
		expect(commonPasswords.size).toBeGreaterThan(20);
		for (const common of commonPasswords) {
			expect(common.length, common).toBeGreaterThanOrEqual(12);
			expect(passwordProblem(common), common).toBe('That password is one of the most common ones. Choose another.');
		}
		expect(passwordProblem('Password1234')).toBe('That password is one of the most common ones. Choose another.');
		expect(passwordProblem('QWERTY123456')).toBe('That password is one of the most common ones. Choose another.');
	});

	it('refuses a password of one or two repeated characters', () => {
		expect(passwordProblem('abababababab')).toBe('That password repeats too few characters. Choose another.');
		expect(passwordProblem('zzzzzzzzzzzzzz')).toBe('That password repeats too few characters. Choose another.');
	});

	it('refuses a password that contains the e-mail\u2019s name part', () => {
		expect(passwordProblem('my-isla.penrow-2026', { email: 'isla.penrow@halvard-marine.example' })).toBe(
			'The password must not contain your e-mail address.'
		);
		expect(passwordProblem('my-isla.penrow-2026', { email: 'someone.else@halvard-marine.example' })).toBeNull();
	});
});
