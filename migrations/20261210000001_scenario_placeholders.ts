import type { Knex } from 'knex';

/**
 * The values of each scenario that are still a template's placeholders (the
 * example's or the blank defaults' figures), as document paths such as
 * `capex.lines[0].amount`; the editor marks them until they are edited.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('scenarios', (t) => {
		t.jsonb('placeholder_paths').notNullable().defaultTo(knex.raw(`'[]'::jsonb`));
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('scenarios', (t) => {
		t.dropColumn('placeholder_paths');
	});
}
