import type { Knex } from 'knex';

/**
 * Probabilistic runs: a run of N draws over one scenario revision (revisions
 * are never changed, so the run keeps only the scenario id and revision
 * number), computed in chunks by worker processes through the job queue.
 * A chunk is recorded once (its primary key) and adds its draws to the run's
 * `draws_done` in the same transaction; the run is finished when
 * `draws_done = draws`.
 */
export async function up(knex: Knex): Promise<void> {
	const at = (t: Knex.CreateTableBuilder, name: string) => t.timestamp(name, { useTz: true });

	await knex.schema.createTable('probabilistic_runs', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
		t.uuid('scenario_id').notNullable().references('id').inTable('scenarios').onDelete('CASCADE');
		t.integer('scenario_revision').notNullable();
		t.text('engine_version').notNullable();
		t.jsonb('input').notNullable();
		t.bigInteger('seed').notNullable();
		t.integer('draws').notNullable();
		t.integer('chunk_size').notNullable();
		t.text('state').notNullable().defaultTo('queued');
		t.integer('draws_done').notNullable().defaultTo(0);
		t.text('failure').nullable();
		t.jsonb('summary').nullable();
		t.uuid('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'started_at').nullable();
		at(t, 'finished_at').nullable();
		// The revision the run was drawn on exists (and goes with its scenario).
		t.foreign(['scenario_id', 'scenario_revision']).references(['scenario_id', 'revision']).inTable('scenario_revisions').onDelete('CASCADE');
		t.check(`state in ('queued', 'running', 'done', 'cancelled', 'failed')`, [], 'probabilistic_runs_state_check');
		t.check('draws >= 1 and chunk_size >= 1', [], 'probabilistic_runs_draws_check');
		t.check('draws_done between 0 and draws', [], 'probabilistic_runs_draws_done_check');
		t.check(`(state = 'done') = (summary is not null)`, [], 'probabilistic_runs_summary_check');
	});
	await knex.raw('create index probabilistic_runs_workspace_created on probabilistic_runs (workspace_id, created_at desc)');
	await knex.raw('create index probabilistic_runs_scenario_created on probabilistic_runs (scenario_id, created_at desc)');

	await knex.schema.createTable('probabilistic_run_chunks', (t) => {
		t.uuid('run_id').notNullable().references('id').inTable('probabilistic_runs').onDelete('CASCADE');
		t.integer('chunk_index').notNullable();
		t.integer('first_draw').notNullable();
		t.integer('draw_count').notNullable();
		// { outputs: { [output]: (number | null)[] }, drivers: { [driver]: number[] }, energyFactor: number[] }, in draw order
		t.jsonb('outcomes').notNullable();
		t.text('worker').notNullable().defaultTo('');
		at(t, 'completed_at').notNullable().defaultTo(knex.fn.now());
		t.primary(['run_id', 'chunk_index']);
		t.check('chunk_index >= 0 and first_draw >= 0 and draw_count >= 1', [], 'probabilistic_run_chunks_range_check');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('probabilistic_run_chunks');
	await knex.schema.dropTable('probabilistic_runs');
}
