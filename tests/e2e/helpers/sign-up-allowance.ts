/**
 * Every browser test signs up from 127.0.0.1, where real people would come
 * from many networks: the app allows five sign-ups an hour per network
 * address (src/lib/server/auth/mail-limits.ts), and the suite makes more than
 * that. A journey that signs up a new person first forgets this machine's
 * count, straight in the test database, as a new network would start at nought.
 */
import pg from 'pg';
import { clusterSettingsFromEnv, databaseUrl } from '../../../docker-local/postgres';
import { e2eClusterDir, e2ePgPort } from '../../../playwright.config';

export async function forgetSignUpsFromThisMachine(): Promise<void> {
	const settings = clusterSettingsFromEnv({ ...process.env, PGPORT_LOCAL: String(e2ePgPort), PG_DATA_DIR: e2eClusterDir });
	const client = new pg.Client({ connectionString: databaseUrl(settings) });
	await client.connect();
	try {
		await client.query(`delete from rate_limits where key like 'signup-ip:%'`);
	} finally {
		await client.end();
	}
}
