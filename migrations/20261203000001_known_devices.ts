import type { Knex } from 'knex';

/**
 * Devices an account has signed in from: the sha256 of a long-lived cookie,
 * per account. A known device's right password passes even while strangers'
 * failures slow the account down elsewhere (src/lib/server/auth/sign-in-limits.ts).
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('known_devices', (t) => {
		t.text('token_hash').notNullable(); // hex sha256 of the token in the device cookie
		t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
		t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('last_used_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
		t.timestamp('expires_at', { useTz: true }).notNullable();
		t.primary(['token_hash', 'user_id']);
		t.index(['user_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('known_devices');
}
