import type { Knex } from 'knex';

/**
 * Personal API tokens (only the sha256 of each token is kept), stored engine
 * results per scenario revision and engine version, and the workspace's plan
 * (read through the principal; the plan table itself lives in code).
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('workspaces', (t) => {
		t.text('plan').notNullable().defaultTo('free');
	});

	await knex.schema.createTable('api_tokens', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('token_hash').notNullable().unique(); // hex sha256 of the token; the token itself is shown once
		t.text('hint').notNullable(); // the token's first characters, to recognise it in a list
		t.text('access').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('last_used_at', { useTz: true });
		t.text('last_used_ip').notNullable().defaultTo('');
		t.timestamp('revoked_at', { useTz: true });
		t.index(['user_id']);
	});
	await knex.raw(`ALTER TABLE api_tokens ADD CONSTRAINT api_tokens_access_check CHECK (access IN ('read', 'read-write'))`);

	await knex.schema.createTable('scenario_results', (t) => {
		t.uuid('scenario_id').notNullable().references('id').inTable('scenarios').onDelete('CASCADE');
		t.integer('revision').notNullable();
		t.text('engine_version').notNullable();
		t.jsonb('result').notNullable();
		t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.primary(['scenario_id', 'revision', 'engine_version']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('scenario_results');
	await knex.schema.dropTable('api_tokens');
	await knex.schema.alterTable('workspaces', (t) => {
		t.dropColumn('plan');
	});
}
