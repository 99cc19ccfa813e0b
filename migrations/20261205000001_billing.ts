import type { Knex } from 'knex';

/**
 * Billing state in PostgreSQL: the prices on offer (seeded, found in Stripe
 * by lookup key), each workspace's Stripe customer and subscription as last
 * read from Stripe, its invoices, the webhook events already handled (so a
 * replay changes nothing), and the workspace's standing with its plan.
 */
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('workspaces', (t) => {
		t.text('plan_status').notNullable().defaultTo('active'); // active | past_due | lapsed
		t.timestamp('past_due_since', { useTz: true }).nullable();
	});
	await knex.raw(`alter table workspaces add constraint workspaces_plan_status_check check (plan_status in ('active', 'past_due', 'lapsed'))`);

	await knex.schema.createTable('plan_prices', (t) => {
		t.text('lookup_key').primary();
		t.text('plan').notNullable();
		t.integer('unit_amount').notNullable(); // per seat, in the currency's minor unit
		t.text('currency').notNullable();
		t.text('interval').notNullable(); // month | year
		t.boolean('active').notNullable().defaultTo(true);
		t.check('unit_amount > 0', [], 'plan_prices_amount_positive');
	});

	await knex.schema.createTable('billing_accounts', (t) => {
		t.uuid('workspace_id').primary().references('id').inTable('workspaces').onDelete('CASCADE');
		t.text('stripe_customer_id').notNullable().unique();
		t.text('stripe_subscription_id').nullable().unique();
		t.text('price_lookup_key').nullable();
		t.text('subscription_status').nullable();
		t.integer('seats').nullable();
		t.timestamp('current_period_start', { useTz: true }).nullable();
		t.timestamp('current_period_end', { useTz: true }).nullable();
		t.boolean('cancel_at_period_end').notNullable().defaultTo(false);
		t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});

	await knex.schema.createTable('billing_invoices', (t) => {
		t.text('id').primary();
		t.uuid('workspace_id').notNullable().references('id').inTable('workspaces').onDelete('CASCADE');
		t.text('number').nullable();
		t.text('status').notNullable();
		t.integer('amount_due').notNullable();
		t.integer('amount_paid').notNullable();
		t.text('currency').notNullable();
		t.timestamp('period_start', { useTz: true }).nullable();
		t.timestamp('period_end', { useTz: true }).nullable();
		t.timestamp('issued_at', { useTz: true }).notNullable();
		t.text('hosted_url').nullable();
		t.index(['workspace_id', 'issued_at']);
	});

	await knex.schema.createTable('billing_events', (t) => {
		t.text('id').primary();
		t.text('type').notNullable();
		t.timestamp('handled_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('billing_events');
	await knex.schema.dropTable('billing_invoices');
	await knex.schema.dropTable('billing_accounts');
	await knex.schema.dropTable('plan_prices');
	await knex.raw('alter table workspaces drop constraint workspaces_plan_status_check');
	await knex.schema.alterTable('workspaces', (t) => {
		t.dropColumn('past_due_since');
		t.dropColumn('plan_status');
	});
}
