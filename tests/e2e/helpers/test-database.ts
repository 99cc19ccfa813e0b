/**
 * A statement straight in the browser tests' own database (see
 * playwright.config.ts), from outside the app, as a script or another
 * process would send it.
 */
import pg from 'pg';
import { clusterSettingsFromEnv, databaseUrl } from '../../../docker-local/postgres';
import { e2eClusterDir, e2ePgPort } from '../../../playwright.config';

export async function queryTestDatabase<T extends pg.QueryResultRow>(sql: string, values: unknown[] = []): Promise<T[]> {
	const settings = clusterSettingsFromEnv({ ...process.env, PGPORT_LOCAL: String(e2ePgPort), PG_DATA_DIR: e2eClusterDir });
	const client = new pg.Client({ connectionString: databaseUrl(settings) });
	await client.connect();
	try {
		return (await client.query<T>(sql, values)).rows;
	} finally {
		await client.end();
	}
}
