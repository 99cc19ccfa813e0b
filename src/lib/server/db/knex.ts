import knexFactory, { type Knex } from 'knex';
import { env } from '$env/dynamic/private';
import { knexConfig } from '../../../../knexfile';

let instance: Knex | undefined;

/** The app's single Knex instance, created on first use from DATABASE_URL. */
export function db(): Knex {
	instance ??= knexFactory(knexConfig(env.DATABASE_URL));
	return instance;
}
