import knexFactory, { type Knex } from 'knex';
import { databaseSettings } from '../settings';
import { knexConfig } from '../../../../knexfile';

let instance: { url: string; knex: Knex } | undefined;

/** The app's single Knex instance, created on first use from the DATABASE_URL setting (no default). */
export function db(): Knex {
	const { url } = databaseSettings();
	if (instance && instance.url !== url) void instance.knex.destroy();
	if (!instance || instance.url !== url) instance = { url, knex: knexFactory(knexConfig(url)) };
	return instance.knex;
}

/** Closes the pool, if one was opened (at shutdown). */
export async function closeDb(): Promise<void> {
	const open = instance;
	instance = undefined;
	await open?.knex.destroy();
}
