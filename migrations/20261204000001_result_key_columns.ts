import type { Knex } from 'knex';

/**
 * A stored result's metrics and currency as columns of their own, kept by
 * PostgreSQL from the result itself: lists of scenarios read a few hundred
 * bytes per row instead of decompressing the whole result with its annual table.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.raw(`alter table scenario_results
		add column metrics jsonb generated always as (result -> 'metrics') stored,
		add column currency text generated always as (result ->> 'currency') stored`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('scenario_results', (t) => {
		t.dropColumn('metrics');
		t.dropColumn('currency');
	});
}
