import type { Knex } from 'knex';

/**
 * Accounts: users, sessions (sha256 of the cookie token only), workspace
 * memberships with roles, single-use e-mail tokens, invitations, the security
 * audit log and the sign-in rate-limit counters.
 *
 * Data-room guests come later as their own table (room_guests: room, user),
 * not as a workspace role: a guest is a user with no membership at all.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('users', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.text('email').notNullable();
		t.text('name').notNullable().defaultTo('');
		t.text('password_hash').notNullable();
		t.timestamp('email_verified_at', { useTz: true });
		t.timestamp('password_changed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
	await knex.raw('CREATE UNIQUE INDEX users_email_lower_unique ON users (lower(email))');

	await knex.schema.createTable('sessions', (t) => {
		t.text('id').primary(); // hex sha256 of the token in the cookie
		t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('last_seen_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.text('user_agent').notNullable().defaultTo('');
		t.text('ip').notNullable().defaultTo('');
		t.uuid('workspace_id').references('id').inTable('workspaces').onDelete('SET NULL');
		t.index(['user_id']);
	});

	await knex.schema.createTable('memberships', (t) => {
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
		t.text('role').notNullable();
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.primary(['workspace_id', 'user_id']);
		t.index(['user_id']);
	});
	await knex.raw(
		`ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('owner', 'analyst', 'viewer'))`
	);

	await knex.schema.createTable('email_tokens', (t) => {
		t.text('id').primary(); // hex sha256 of the token in the link
		t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
		t.text('purpose').notNullable();
		t.text('email').notNullable();
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('used_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['user_id', 'purpose']);
	});
	await knex.raw(
		`ALTER TABLE email_tokens ADD CONSTRAINT email_tokens_purpose_check CHECK (purpose IN ('verify-email', 'reset-password'))`
	);

	await knex.schema.createTable('invitations', (t) => {
		t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.text('email').notNullable();
		t.text('role').notNullable();
		t.text('token_hash').notNullable().unique();
		t.uuid('invited_by').references('id').inTable('users').onDelete('SET NULL');
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.timestamp('accepted_at', { useTz: true });
		t.uuid('accepted_by').references('id').inTable('users').onDelete('SET NULL');
		t.timestamp('revoked_at', { useTz: true });
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['workspace_id']);
	});
	await knex.raw(
		`ALTER TABLE invitations ADD CONSTRAINT invitations_role_check CHECK (role IN ('owner', 'analyst', 'viewer'))`
	);

	await knex.schema.createTable('audit_events', (t) => {
		t.bigIncrements('id').primary();
		t.uuid('workspace_id').references('id').inTable('workspaces').onDelete('CASCADE');
		t.uuid('actor_user_id').references('id').inTable('users').onDelete('SET NULL');
		t.text('actor_email').notNullable().defaultTo('');
		t.text('event').notNullable();
		t.text('ip').notNullable().defaultTo('');
		t.jsonb('detail').notNullable().defaultTo('{}');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.index(['workspace_id', 'created_at']);
		t.index(['actor_user_id', 'created_at']);
	});

	// The shape rate-limiter-flexible's Postgres store expects (created here so
	// the app never issues DDL at run time).
	await knex.raw(`CREATE TABLE rate_limits (
		key varchar(255) PRIMARY KEY,
		points integer NOT NULL DEFAULT 0,
		expire bigint
	)`);
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('rate_limits');
	await knex.schema.dropTable('audit_events');
	await knex.schema.dropTable('invitations');
	await knex.schema.dropTable('email_tokens');
	await knex.schema.dropTable('memberships');
	await knex.schema.dropTable('sessions');
	await knex.schema.dropTable('users');
}
