import { db } from './knex';

/** True when the database answers a trivial query within the timeout. */
export async function databaseIsReachable(timeoutMs = 2_000): Promise<boolean> {
	try {
		await db().raw('select 1').timeout(timeoutMs, { cancel: false });
		return true;
	} catch {
		return false;
	}
}
