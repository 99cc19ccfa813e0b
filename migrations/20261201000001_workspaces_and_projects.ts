import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('workspaces', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('name').notNullable();
		t.text('slug').notNullable().unique();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});

	await knex.schema.createTable('projects', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('technology').notNullable();
		t.text('site_name').notNullable().defaultTo('');
		t.text('site_description').notNullable().defaultTo('');
		t.string('currency', 3).notNullable().defaultTo('EUR');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('archived_at', { useTz: true });
		t.index(['workspace_id']);
	});
	await knex.raw(
		`ALTER TABLE projects ADD CONSTRAINT projects_technology_check CHECK (technology IN ('tidal-stream', 'ocean-current', 'wave'))`
	);
	await knex.raw(`ALTER TABLE projects ADD CONSTRAINT projects_currency_check CHECK (currency ~ '^[A-Z]{3}$')`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('projects');
	await knex.schema.dropTable('workspaces');
}
