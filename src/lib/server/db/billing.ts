/**
 * Billing state in PostgreSQL: prices on offer, each workspace's Stripe
 * customer and subscription as last read from Stripe, invoices, handled
 * webhook events, and the workspace's standing with its plan.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import { forgetCachedSessions } from '../auth/session-cache';
import type { PaidPlanKey, PlanStatus } from '../../billing/plans';

export interface PlanPrice {
	lookupKey: string;
	plan: PaidPlanKey;
	unitAmount: number;
	currency: string;
	interval: 'month' | 'year';
}

function toPrice(row: { lookup_key: string; plan: PaidPlanKey; unit_amount: number; currency: string; interval: 'month' | 'year' }): PlanPrice {
	return { lookupKey: row.lookup_key, plan: row.plan, unitAmount: row.unit_amount, currency: row.currency, interval: row.interval };
}

export async function listPlanPrices(knex: Knex = db()): Promise<PlanPrice[]> {
	const rows = await knex('plan_prices').select('*').where({ active: true }).orderBy('unit_amount');
	return rows.map(toPrice);
}

export async function getPlanPrice(lookupKey: string, knex: Knex = db()): Promise<PlanPrice | undefined> {
	const row = await knex('plan_prices').select('*').where({ lookup_key: lookupKey }).first();
	return row ? toPrice(row) : undefined;
}

export interface BillingAccount {
	workspaceId: string;
	customerId: string;
	subscriptionId: string | null;
	priceLookupKey: string | null;
	subscriptionStatus: string | null;
	seats: number | null;
	currentPeriodStart: Date | null;
	currentPeriodEnd: Date | null;
	cancelAtPeriodEnd: boolean;
}

interface AccountRow {
	workspace_id: string;
	stripe_customer_id: string;
	stripe_subscription_id: string | null;
	price_lookup_key: string | null;
	subscription_status: string | null;
	seats: number | null;
	current_period_start: Date | null;
	current_period_end: Date | null;
	cancel_at_period_end: boolean;
}

function toAccount(row: AccountRow): BillingAccount {
	return {
		workspaceId: row.workspace_id,
		customerId: row.stripe_customer_id,
		subscriptionId: row.stripe_subscription_id,
		priceLookupKey: row.price_lookup_key,
		subscriptionStatus: row.subscription_status,
		seats: row.seats,
		currentPeriodStart: row.current_period_start,
		currentPeriodEnd: row.current_period_end,
		cancelAtPeriodEnd: row.cancel_at_period_end
	};
}

export async function getBillingAccount(workspaceId: string, knex: Knex = db()): Promise<BillingAccount | undefined> {
	const row = await knex('billing_accounts').select('*').where({ workspace_id: workspaceId }).first();
	return row ? toAccount(row) : undefined;
}

export async function getBillingAccountOfCustomer(customerId: string, knex: Knex = db()): Promise<BillingAccount | undefined> {
	const row = await knex('billing_accounts').select('*').where({ stripe_customer_id: customerId }).first();
	return row ? toAccount(row) : undefined;
}

/** Links a Stripe customer to a workspace; the first link wins when two requests race. */
export async function linkCustomer(workspaceId: string, customerId: string, knex: Knex = db()): Promise<BillingAccount> {
	await knex('billing_accounts').insert({ workspace_id: workspaceId, stripe_customer_id: customerId }).onConflict('workspace_id').ignore();
	return (await getBillingAccount(workspaceId, knex))!;
}

export interface SubscriptionState {
	subscriptionId: string;
	priceLookupKey: string | null;
	subscriptionStatus: string;
	seats: number;
	currentPeriodStart: Date | null;
	currentPeriodEnd: Date | null;
	cancelAtPeriodEnd: boolean;
	/** The plan it pays for, and the workspace's standing that follows from its status. */
	plan: PaidPlanKey;
	planStatus: PlanStatus;
}

/**
 * Writes a subscription as Stripe now tells it, and the workspace's plan and
 * standing with it, in one transaction. A failed renewal keeps the time it
 * was first seen, so the grace period runs from then.
 */
export async function applySubscriptionState(workspaceId: string, state: SubscriptionState, knex: Knex = db()): Promise<void> {
	await knex.transaction(async (trx) => {
		await trx('billing_accounts').where({ workspace_id: workspaceId }).update({
			stripe_subscription_id: state.subscriptionId,
			price_lookup_key: state.priceLookupKey,
			subscription_status: state.subscriptionStatus,
			seats: state.seats,
			current_period_start: state.currentPeriodStart,
			current_period_end: state.currentPeriodEnd,
			cancel_at_period_end: state.cancelAtPeriodEnd,
			updated_at: trx.fn.now()
		});
		await trx('workspaces')
			.where({ id: workspaceId })
			.update({
				plan: state.plan,
				plan_status: state.planStatus,
				past_due_since: state.planStatus === 'past_due' ? trx.raw('coalesce(past_due_since, now())') : null,
				updated_at: trx.fn.now()
			});
	});
	forgetCachedSessions();
}

/** The workspace's standing with its plan, read afresh (not from the request's session). */
export async function getWorkspaceStanding(workspaceId: string, knex: Knex = db()): Promise<{ plan: string; planStatus: PlanStatus; pastDueSince: string | null }> {
	const row = await knex('workspaces').select('plan', 'plan_status', 'past_due_since').where({ id: workspaceId }).first();
	return { plan: row.plan, planStatus: row.plan_status, pastDueSince: row.past_due_since ? new Date(row.past_due_since).toISOString() : null };
}

export interface InvoiceRecord {
	id: string;
	workspaceId: string;
	number: string | null;
	status: string;
	amountDue: number;
	amountPaid: number;
	currency: string;
	periodStart: Date | null;
	periodEnd: Date | null;
	issuedAt: Date;
	hostedUrl: string | null;
}

export async function upsertInvoice(invoice: InvoiceRecord, knex: Knex = db()): Promise<void> {
	const row = {
		id: invoice.id,
		workspace_id: invoice.workspaceId,
		number: invoice.number,
		status: invoice.status,
		amount_due: invoice.amountDue,
		amount_paid: invoice.amountPaid,
		currency: invoice.currency,
		period_start: invoice.periodStart,
		period_end: invoice.periodEnd,
		issued_at: invoice.issuedAt,
		hosted_url: invoice.hostedUrl
	};
	await knex('billing_invoices').insert(row).onConflict('id').merge();
}

export async function listInvoices(workspaceId: string, limit = 24, knex: Knex = db()): Promise<InvoiceRecord[]> {
	const rows = await knex('billing_invoices').select('*').where({ workspace_id: workspaceId }).orderBy('issued_at', 'desc').limit(limit);
	return rows.map((r) => ({
		id: r.id,
		workspaceId: r.workspace_id,
		number: r.number,
		status: r.status,
		amountDue: r.amount_due,
		amountPaid: r.amount_paid,
		currency: r.currency,
		periodStart: r.period_start,
		periodEnd: r.period_end,
		issuedAt: r.issued_at,
		hostedUrl: r.hosted_url
	}));
}

export async function eventWasHandled(eventId: string, knex: Knex = db()): Promise<boolean> {
	return (await knex('billing_events').select('id').where({ id: eventId }).first()) !== undefined;
}

export async function recordHandledEvent(eventId: string, type: string, knex: Knex = db()): Promise<void> {
	await knex('billing_events').insert({ id: eventId, type }).onConflict('id').ignore();
}
