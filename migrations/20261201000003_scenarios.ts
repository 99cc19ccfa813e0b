import type { Knex } from 'knex';

/**
 * The workbench: scenarios (a project's cases, each holding one validated
 * scenario document), the revision history of every scenario's document, and
 * uploaded resource and device files kept in Postgres with what was parsed
 * from them.
 *
 * `scenarios.revision` is the optimistic-concurrency counter: a save names the
 * revision it was editing and is refused when the row has moved on.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('scenarios', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('notes').notNullable().defaultTo('');
		t.jsonb('document').notNullable();
		t.integer('schema_version').notNullable();
		t.integer('revision').notNullable().defaultTo(1);
		t.boolean('is_base_case').notNullable().defaultTo(false);
		t.timestamp('archived_at', { useTz: true });
		t.uuid('created_by').references('id').inTable('users').onDelete('SET NULL');
		t.uuid('updated_by').references('id').inTable('users').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['project_id']);
	});
	await knex.raw(`ALTER TABLE scenarios ADD CONSTRAINT scenarios_revision_check CHECK (revision >= 1)`);
	await knex.raw(`ALTER TABLE scenarios ADD CONSTRAINT scenarios_name_check CHECK (length(name) BETWEEN 1 AND 200)`);
	// An archived scenario is never the base case; at most one base case per project.
	await knex.raw(
		`ALTER TABLE scenarios ADD CONSTRAINT scenarios_base_case_not_archived CHECK (NOT (is_base_case AND archived_at IS NOT NULL))`
	);
	await knex.raw(`CREATE UNIQUE INDEX scenarios_one_base_case_per_project ON scenarios (project_id) WHERE is_base_case`);

	await knex.schema.createTable('scenario_revisions', (t) => {
		t.bigIncrements('id').primary();
		t.uuid('scenario_id').notNullable().references('id').inTable('scenarios').onDelete('CASCADE');
		t.integer('revision').notNullable();
		t.text('name').notNullable();
		t.jsonb('document').notNullable();
		t.specificType('changed_sections', 'text[]').notNullable().defaultTo('{}');
		t.text('summary').notNullable().defaultTo('');
		t.uuid('changed_by').references('id').inTable('users').onDelete('SET NULL');
		t.timestamp('changed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.unique(['scenario_id', 'revision']);
	});

	await knex.schema.createTable('uploads', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
		t.text('kind').notNullable();
		t.text('file_name').notNullable();
		t.text('content_type').notNullable().defaultTo('');
		t.integer('byte_size').notNullable();
		t.string('sha256', 64).notNullable();
		t.binary('content').notNullable();
		t.jsonb('parsed').notNullable();
		t.uuid('uploaded_by').references('id').inTable('users').onDelete('SET NULL');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['project_id', 'created_at']);
	});
	await knex.raw(
		`ALTER TABLE uploads ADD CONSTRAINT uploads_kind_check CHECK (kind IN ('current-speed-time-series', 'speed-histogram', 'power-curve', 'sea-state-table', 'power-matrix'))`
	);
	await knex.raw(`ALTER TABLE uploads ADD CONSTRAINT uploads_byte_size_check CHECK (byte_size = octet_length(content))`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('uploads');
	await knex.schema.dropTable('scenario_revisions');
	await knex.schema.dropTable('scenarios');
}
