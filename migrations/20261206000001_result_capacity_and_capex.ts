import type { Knex } from 'knex';

/**
 * A stored result's installed capacity (kW) and real capex total as columns of
 * their own, kept by PostgreSQL from the result itself (as its metrics and
 * currency are): the portfolio lists them for every project without reading
 * each whole result with its annual table. Decimal strings, as the engine wrote them.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.raw(`alter table scenario_results
		add column installed_capacity_kw text generated always as (result -> 'energy' ->> 'installedCapacityKW') stored,
		add column capex_real_total text generated always as (result -> 'costs' ->> 'capexRealTotal') stored`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('scenario_results', (t) => {
		t.dropColumn('installed_capacity_kw');
		t.dropColumn('capex_real_total');
	});
}
