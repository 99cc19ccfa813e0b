/**
 * Bring a database up to date: run pending migrations, then seed it when it is empty.
 *   tsx scripts/migrate.ts [--no-seed] [--rollback-all]
 */
import knexFactory from 'knex';
import { knexConfig } from '../knexfile';
import { runSeeds } from '../seeds/index';

export async function migrateAndSeed(databaseUrl: string, options: { seed?: boolean } = {}) {
	const knex = knexFactory(knexConfig(databaseUrl));
	try {
		const [, applied] = await knex.migrate.latest();
		if (applied.length) console.log(`[migrate] applied ${applied.length} migration(s)`);
		if (options.seed !== false) await runSeeds(knex);
	} finally {
		await knex.destroy();
	}
}

async function main() {
	const url = process.env.DATABASE_URL;
	if (!url) {
		console.error('DATABASE_URL is not set');
		process.exit(2);
	}
	if (process.argv.includes('--rollback-all')) {
		const knex = knexFactory(knexConfig(url));
		await knex.migrate.rollback(undefined, true);
		await knex.destroy();
		return;
	}
	await migrateAndSeed(url, { seed: !process.argv.includes('--no-seed') });
}

if (import.meta.url === `file://${process.argv[1]}`) {
	main().catch((error) => {
		console.error(error);
		process.exit(1);
	});
}
