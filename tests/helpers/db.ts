/**
 * Each integration test file works in a database of its own inside the run's
 * throw-away cluster (tests/setup/global-postgres.ts), so files never collide.
 */
import knexFactory, { type Knex } from 'knex';
import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { knexConfig } from '../../knexfile';
import { runSeeds } from '../../seeds/index';

export interface TestDatabase {
	url: string;
	knex: Knex;
	drop: () => Promise<void>;
}

export async function createTestDatabase(options: { migrate?: boolean; seed?: boolean } = {}): Promise<TestDatabase> {
	const adminUrl = inject('postgresAdminUrl');
	const name = `t_${randomBytes(6).toString('hex')}`;
	const admin = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
	await admin.raw(`CREATE DATABASE ${name}`);
	await admin.destroy();

	const url = adminUrl.replace(/\/[^/]*$/, `/${name}`);
	const knex = knexFactory(knexConfig(url));
	if (options.migrate !== false) await knex.migrate.latest();
	if (options.seed) await runSeeds(knex);

	return {
		url,
		knex,
		drop: async () => {
			await knex.destroy();
			const cleanup = knexFactory({ client: 'pg', connection: adminUrl, pool: { min: 0, max: 1 } });
			await cleanup.raw(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
			await cleanup.destroy();
		}
	};
}
