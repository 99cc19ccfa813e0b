import type { Knex } from 'knex';

/**
 * Investor data rooms: a room per project with published versions (frozen
 * snapshots), documents, room guests (investors, not workspace members) with
 * their own sessions, single-use links and accepted terms, the access log and
 * questions with answers.
 */
export async function up(knex: Knex): Promise<void> {
	const id = (t: Knex.CreateTableBuilder) => t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
	const at = (t: Knex.CreateTableBuilder, name: string) => t.timestamp(name, { useTz: true });

	await knex.schema.createTable('data_rooms', (t) => {
		id(t);
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.uuid('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
		t.text('name').notNullable();
		t.text('terms').notNullable();
		t.integer('terms_version').notNullable().defaultTo(1);
		t.uuid('created_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'updated_at').notNullable().defaultTo(knex.fn.now());
		t.index(['workspace_id']);
		t.index(['project_id']);
	});

	await knex.schema.createTable('data_room_versions', (t) => {
		id(t);
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.integer('version').notNullable();
		t.jsonb('snapshot').notNullable();
		t.text('engine_version').notNullable();
		t.uuid('published_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'published_at').notNullable().defaultTo(knex.fn.now());
		t.unique(['room_id', 'version']);
	});

	await knex.schema.createTable('data_room_documents', (t) => {
		id(t);
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.text('folder').notNullable().defaultTo('');
		t.text('file_name').notNullable();
		t.text('kind').notNullable();
		t.text('content_type').notNullable();
		t.integer('byte_size').notNullable();
		t.text('sha256').notNullable();
		t.binary('content').notNullable();
		t.text('access').notNullable().defaultTo('view');
		t.uuid('uploaded_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'removed_at').nullable();
		t.check(`access in ('view', 'download')`, [], 'data_room_documents_access_check');
		t.index(['room_id']);
	});

	await knex.schema.createTable('room_guests', (t) => {
		id(t);
		t.text('email').notNullable();
		t.text('name').notNullable().defaultTo('');
		t.text('password_hash').nullable();
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
	});
	await knex.raw('create unique index room_guests_email_unique on room_guests (lower(email))');

	await knex.schema.createTable('room_guest_access', (t) => {
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.uuid('guest_id').notNullable().references('id').inTable('room_guests').onDelete('CASCADE');
		t.uuid('invited_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'invited_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'expires_at').notNullable();
		at(t, 'revoked_at').nullable();
		t.primary(['room_id', 'guest_id']);
	});

	await knex.schema.createTable('room_guest_links', (t) => {
		t.text('token_hash').primary();
		t.uuid('guest_id').notNullable().references('id').inTable('room_guests').onDelete('CASCADE');
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.text('purpose').notNullable(); // invitation | sign-in
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'expires_at').notNullable();
		at(t, 'used_at').nullable();
	});

	await knex.schema.createTable('guest_sessions', (t) => {
		t.text('id').primary(); // sha256 of the cookie token
		t.uuid('guest_id').notNullable().references('id').inTable('room_guests').onDelete('CASCADE');
		at(t, 'created_at').notNullable().defaultTo(knex.fn.now());
		at(t, 'expires_at').notNullable();
		t.index(['guest_id']);
	});

	await knex.schema.createTable('room_terms_acceptances', (t) => {
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.uuid('guest_id').notNullable().references('id').inTable('room_guests').onDelete('CASCADE');
		t.integer('terms_version').notNullable();
		at(t, 'accepted_at').notNullable().defaultTo(knex.fn.now());
		t.text('ip').notNullable().defaultTo('');
		t.primary(['room_id', 'guest_id', 'terms_version']);
	});

	await knex.schema.createTable('room_access_events', (t) => {
		t.bigIncrements('id').primary();
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.integer('version').nullable();
		t.uuid('guest_id').nullable().references('id').inTable('room_guests').onDelete('SET NULL');
		t.uuid('user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
		t.text('kind').notNullable(); // room-view | scenario-view | document-view | document-download | pdf-download
		t.text('target_id').nullable();
		t.text('target_name').notNullable().defaultTo('');
		at(t, 'at').notNullable().defaultTo(knex.fn.now());
		t.index(['room_id', 'at']);
	});

	await knex.schema.createTable('room_questions', (t) => {
		id(t);
		t.uuid('room_id').notNullable().references('id').inTable('data_rooms').onDelete('CASCADE');
		t.uuid('guest_id').notNullable().references('id').inTable('room_guests').onDelete('CASCADE');
		t.text('question').notNullable();
		at(t, 'asked_at').notNullable().defaultTo(knex.fn.now());
		t.text('answer').nullable();
		t.text('visibility').nullable(); // asker | all, once answered
		t.uuid('answered_by').nullable().references('id').inTable('users').onDelete('SET NULL');
		at(t, 'answered_at').nullable();
		t.index(['room_id', 'asked_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const table of [
		'room_questions',
		'room_access_events',
		'room_terms_acceptances',
		'guest_sessions',
		'room_guest_links',
		'room_guest_access',
		'room_guests',
		'data_room_documents',
		'data_room_versions',
		'data_rooms'
	]) {
		await knex.schema.dropTable(table);
	}
}
