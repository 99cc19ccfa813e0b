import { hash, verify } from '@node-rs/argon2';
import { commonPasswords } from './common-passwords';

/** argon2id with OWASP's minimum: 19 MiB memory, 2 iterations, parallelism 1. */
const argon2Options = { memoryCost: 19_456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 256;

export async function hashPassword(password: string): Promise<string> {
	return hash(password, argon2Options);
}

export async function verifyPasswordHash(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

/** A hash of a random password, verified against when the e-mail is unknown so both paths cost the same. */
let decoyHash: Promise<string> | undefined;
export function decoyPasswordHash(): Promise<string> {
	decoyHash ??= hashPassword(crypto.randomUUID() + crypto.randomUUID());
	return decoyHash;
}

/** The reason a new password is refused, in words for the form, or null when it is acceptable. */
export function passwordProblem(password: string, context: { email?: string; name?: string } = {}): string | null {
	const length = [...password].length;
	if (length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
	if (length > PASSWORD_MAX_LENGTH) return `Use at most ${PASSWORD_MAX_LENGTH} characters.`;
	const lowered = password.toLowerCase();
	if (commonPasswords.has(lowered)) return 'That password is one of the most common ones. Choose another.';
	if (new Set(lowered).size <= 2) return 'That password repeats too few characters. Choose another.';
	const emailName = context.email?.split('@')[0]?.toLowerCase();
	if (emailName && emailName.length >= 4 && lowered.includes(emailName)) {
		return 'The password must not contain your e-mail address.';
	}
	return null;
}
