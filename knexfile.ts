import type { Knex } from 'knex';
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';

const root = dirname(fileURLToPath(import.meta.url));
const migrationsDirectory = join(root, 'migrations');

export const defaultDatabaseUrl = 'postgres://postgres@127.0.0.1:54320/tidewright';

/**
 * Loads the TypeScript migrations through whatever module loader is running
 * (tsx for scripts, Vite for tests): knex's own file loader only knows plain
 * Node and refuses `.ts`.
 */
class TypeScriptMigrationSource implements Knex.MigrationSource<string> {
	async getMigrations(): Promise<string[]> {
		return readdirSync(migrationsDirectory)
			.filter((file) => /^\d{14}_.+\.ts$/.test(file))
			.sort();
	}
	getMigrationName(migration: string): string {
		return migration;
	}
	async getMigration(migration: string): Promise<Knex.Migration> {
		return import(/* @vite-ignore */ pathToFileURL(join(migrationsDirectory, migration)).href);
	}
}

/** One Knex configuration for the app, the scripts and the tests; only the URL changes. */
export function knexConfig(connectionString = process.env.DATABASE_URL ?? defaultDatabaseUrl): Knex.Config {
	return {
		client: 'pg',
		connection: { connectionString, application_name: 'tidewright' },
		pool: { min: 0, max: Number(process.env.DATABASE_POOL_MAX ?? 10) },
		acquireConnectionTimeout: 5_000,
		migrations: { migrationSource: new TypeScriptMigrationSource(), tableName: 'knex_migrations' }
	};
}

export default knexConfig();
