import type { Knex } from 'knex';

/** A workspace's number and date style (a locale tag); null: each reader's own browser languages. */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('workspaces', (t) => {
		t.text('number_locale');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('workspaces', (t) => {
		t.dropColumn('number_locale');
	});
}
