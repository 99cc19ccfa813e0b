/**
 * Every browser test signs up from 127.0.0.1, where real people would come
 * from many networks: the app allows five sign-ups an hour per network
 * address (src/lib/server/auth/mail-limits.ts), and the suite makes more than
 * that. A journey that signs up a new person first forgets this machine's
 * count, straight in the test database, as a new network would start at nought.
 */
import { queryTestDatabase } from './test-database';

export async function forgetSignUpsFromThisMachine(): Promise<void> {
	await queryTestDatabase(`delete from rate_limits where key like 'signup-ip:%'`);
}
