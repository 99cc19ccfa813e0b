/**
 * Billing against the local Stripe stand-in, driven by the real stripe SDK,
 * with events delivered over HTTP to a receiver that calls the app's webhook
 * handler (the route, src/routes/api/v1/billing/webhook, only maps its outcome
 * to a status). A real PostgreSQL per file.
 */
import { createServer, type Server } from 'node:http';
import Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { freePort } from '../helpers/free-port';
import { newPerson, newWorkspaceOf } from '../helpers/people';
import { startStripeStandin, type StripeStandin } from '../../docker-local/stripe-standin/index';
import { receiveWebhook } from '../../src/lib/server/billing/webhook';
import { changeSeats, previewSeatChange, setCancelAtPeriodEnd, startCheckout } from '../../src/lib/server/billing/subscription';
import { getBillingAccount, listInvoices } from '../../src/lib/server/db/billing';
import { SeatLimitError, withRoomForProject, PlanRefusal } from '../../src/lib/server/billing/gates';
import { createInvitation } from '../../src/lib/server/db/invitations';
import { addMember, changeMemberRole } from '../../src/lib/server/db/memberships';
import { createProject } from '../../src/lib/server/db/projects';
import { planPrices } from '../../seeds/05_plans_and_billing';

const webhookSecret = 'whsec_billing_integration';
let database: TestDatabase;
let standin: StripeStandin;
let receiver: Server;
let sdk: Stripe;
/** Answers of the app's handler, in order, as the stand-in saw them. */
const answers: number[] = [];

beforeAll(async () => {
	database = await createTestDatabase();
	await database.knex('plan_prices').insert(planPrices.map((p) => ({ ...p })));
	const receiverPort = await freePort();
	receiver = createServer((req, res) => {
		const chunks: Buffer[] = [];
		req.on('data', (c: Buffer) => chunks.push(c));
		req.on('end', () => {
			receiveWebhook(Buffer.concat(chunks).toString('utf8'), (req.headers['stripe-signature'] as string) ?? null).then(
				(outcome) => {
					answers.push(outcome.status);
					res.writeHead(outcome.status).end();
				},
				() => {
					answers.push(500);
					res.writeHead(500).end();
				}
			);
		});
	});
	await new Promise<void>((ok) => receiver.listen(receiverPort, '127.0.0.1', () => ok()));
	standin = await startStripeStandin({
		port: await freePort(),
		webhookSecret,
		webhookUrl: `http://127.0.0.1:${receiverPort}/api/v1/billing/webhook`,
		retryDelaysMs: [150, 300, 600]
	});
	setAppEnv({
		DATABASE_URL: database.url,
		STRIPE_SECRET_KEY: 'sk_test_billing_integration',
		STRIPE_WEBHOOK_SECRET: webhookSecret,
		STRIPE_API_HOST: '127.0.0.1',
		STRIPE_API_PORT: String(standin.port),
		STRIPE_API_PROTOCOL: 'http',
		STRIPE_STANDIN_URL: standin.url
	});
	sdk = new Stripe('sk_test_billing_integration', { host: '127.0.0.1', port: standin.port, protocol: 'http', maxNetworkRetries: 0 });
});

afterAll(async () => {
	await standin?.stop();
	await new Promise<void>((ok) => receiver?.close(() => ok()));
	await database?.drop();
});

beforeEach(() => {
	answers.length = 0;
});

async function standing(workspaceId: string) {
	return database.knex('workspaces').select('plan', 'plan_status', 'past_due_since').where({ id: workspaceId }).first();
}

/** Opens a Checkout Session as the billing page does and pays it on the stand-in's page, as the owner's browser would. */
async function upgrade(workspaceId: string, owner: { email: string; name: string }, plan: 'team' | 'practice', seats: number) {
	const url = await startCheckout({ workspace: { id: workspaceId, name: 'Test workspace' }, owner, plan, seats, origin: 'http://127.0.0.1:9' });
	const paid = await fetch(`${url}/pay`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'card=working', redirect: 'manual' });
	expect(paid.status).toBe(303);
	return (await getBillingAccount(workspaceId))!;
}

function signed(payload: string, secret = webhookSecret, timestamp = Math.floor(Date.now() / 1000)) {
	return sdk.webhooks.generateTestHeaderString({ payload, secret, timestamp });
}

async function clockAdvance(seconds: number) {
	const response = await fetch(`${standin.url}/_standin/clock/advance`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ seconds }) });
	expect(response.ok).toBe(true);
}

describe('checkout and the webhook', () => {
	it('an owner pays at checkout: the events set the plan, seats, period and invoice in PostgreSQL', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		const account = await upgrade(workspaceId, owner, 'team', 3);
		expect(account).toMatchObject({ subscriptionStatus: 'active', seats: 3, priceLookupKey: 'tidewright_team_seat_monthly', cancelAtPeriodEnd: false });
		expect(account.currentPeriodEnd!.getTime()).toBeGreaterThan(account.currentPeriodStart!.getTime());
		expect(await standing(workspaceId)).toMatchObject({ plan: 'team', plan_status: 'active', past_due_since: null });
		const invoices = await listInvoices(workspaceId);
		expect(invoices).toHaveLength(1);
		// 3 seats x EUR 49.00 (seeded price, in cents).
		expect(invoices[0]).toMatchObject({ status: 'paid', amountDue: 3 * 4900, currency: 'eur' });
		expect(answers.every((s) => s === 200)).toBe(true);
	});

	it('refuses a tampered payload, a wrong secret and a signature over 300 s old with 400, and changes nothing', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 2);
		const events = await sdk.events.list({ limit: 1, type: 'customer.subscription.created' });
		const payload = JSON.stringify(events.data[0]);
		const tampered = payload.replace('"active"', '"canceled"');
		expect(await receiveWebhook(tampered, signed(payload))).toMatchObject({ status: 400 });
		expect(await receiveWebhook(payload, signed(payload, 'whsec_someone_else'))).toMatchObject({ status: 400 });
		// Stripe's default tolerance is 300 s (stripe-node webhooks.constructEvent, DEFAULT_TOLERANCE).
		expect(await receiveWebhook(payload, signed(payload, webhookSecret, Math.floor(Date.now() / 1000) - 301))).toMatchObject({ status: 400 });
		expect(await receiveWebhook(payload, null)).toMatchObject({ status: 400 });
		expect(await standing(workspaceId)).toMatchObject({ plan: 'team', plan_status: 'active' });
	});

	it('a replayed event changes nothing: handled once, then acknowledged without work', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 2);
		const [paid] = (await sdk.events.list({ limit: 1, type: 'invoice.paid' })).data;
		const payload = JSON.stringify(paid);
		const before = await database.knex('billing_invoices').where({ workspace_id: workspaceId }).select('*');
		const replay = await receiveWebhook(payload, signed(payload));
		expect(replay).toEqual({ status: 200, handled: false, note: `${paid.id} was handled before` });
		expect(await database.knex('billing_invoices').where({ workspace_id: workspaceId }).select('*')).toEqual(before);
		expect(Number((await database.knex('billing_events').where({ id: paid.id }).count({ n: '*' }))[0].n)).toBe(1);
	});

	it('"subscription updated" arriving before "created" ends in the subscription’s current state', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 2);
		const account = (await getBillingAccount(workspaceId))!;
		await sdk.subscriptions.update(account.subscriptionId!, { cancel_at_period_end: true });
		const [updated] = (await sdk.events.list({ limit: 1, type: 'customer.subscription.updated' })).data;
		const [created] = (await sdk.events.list({ limit: 10, type: 'customer.subscription.created' })).data.filter(
			(e) => (e.data.object as Stripe.Subscription).id === account.subscriptionId
		);
		// Start from nothing known here, then deliver the two out of order.
		await database.knex('billing_events').whereIn('id', [updated.id, created.id]).delete();
		await database.knex('billing_accounts').where({ workspace_id: workspaceId }).update({ stripe_subscription_id: null, subscription_status: null, cancel_at_period_end: false });
		for (const event of [updated, created]) {
			const payload = JSON.stringify(event);
			expect(await receiveWebhook(payload, signed(payload))).toMatchObject({ status: 200, handled: true });
		}
		expect(await getBillingAccount(workspaceId)).toMatchObject({ subscriptionId: account.subscriptionId, cancelAtPeriodEnd: true, subscriptionStatus: 'active' });
	});

	it('a handler that fails answers non-2xx; Stripe’s retry succeeds once the cause is gone', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		// Take the Team price off the catalogue: handling any event of this subscription now throws.
		const teamPrice = planPrices.find((p) => p.plan === 'team')!;
		const url = await startCheckout({ workspace: { id: workspaceId, name: 'Retry works' }, owner, plan: 'team', seats: 1, origin: 'http://127.0.0.1:9' });
		await database.knex('plan_prices').where({ lookup_key: teamPrice.lookup_key }).delete();
		try {
			await fetch(`${url}/pay`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'card=working', redirect: 'manual' });
			expect(answers).toContain(500);
			expect((await standing(workspaceId)).plan).toBe('free');
		} finally {
			await database.knex('plan_prices').insert({ ...teamPrice });
		}
		await expect.poll(async () => (await standing(workspaceId)).plan, { timeout: 5_000 }).toBe('team');
		// A later event's first delivery may set the plan before the failed one's retry lands: wait for the retry itself.
		const retried = async () => {
			const deliveries = (await (await fetch(`${standin.url}/_standin/deliveries`)).json()) as { data: { attempt: number; ok: boolean }[] };
			return deliveries.data.some((d) => d.attempt > 1 && d.ok);
		};
		await expect.poll(retried, { timeout: 10_000 }).toBe(true);
	});
});

describe('renewals, lapses and paying again', () => {
	it('cancel at period end, then the period passes: the plan lapses; a new checkout reopens it', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'practice', 2);
		await setCancelAtPeriodEnd(workspaceId, true);
		expect((await getBillingAccount(workspaceId))!.cancelAtPeriodEnd).toBe(true);
		await setCancelAtPeriodEnd(workspaceId, false);
		expect((await getBillingAccount(workspaceId))!.cancelAtPeriodEnd).toBe(false);
		await setCancelAtPeriodEnd(workspaceId, true);
		await clockAdvance(32 * 24 * 3600);
		await expect.poll(async () => (await standing(workspaceId)).plan_status).toBe('lapsed');
		expect((await standing(workspaceId)).plan).toBe('practice');
		await upgrade(workspaceId, owner, 'practice', 2);
		expect(await standing(workspaceId)).toMatchObject({ plan: 'practice', plan_status: 'active' });
	});

	it('a failed renewal makes the plan past due, from the first failure on', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		const account = await upgrade(workspaceId, owner, 'team', 1);
		// The portal's "declining card" switch, as an owner would press it.
		const portal = await sdk.billingPortal.sessions.create({ customer: account.customerId, return_url: 'http://127.0.0.1:9/' });
		const switched = await fetch(`${portal.url}/card`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'card=declining', redirect: 'manual' });
		expect(switched.status).toBe(303);
		await clockAdvance(32 * 24 * 3600);
		await expect.poll(async () => (await standing(workspaceId)).plan_status).toBe('past_due');
		expect((await standing(workspaceId)).past_due_since).not.toBeNull();
		expect((await listInvoices(workspaceId)).some((i) => i.status === 'open')).toBe(true);
	});
});

describe('seats', () => {
	it('prices a seat change before it is made, then invoices the difference at once', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 2);
		const preview = await previewSeatChange(workspaceId, 4);
		expect(preview).toMatchObject({ seats: 4, currentSeats: 2, perPeriod: 4 * 4900, currency: 'eur' });
		// Two more seats for almost the whole period: close to 2 x 49.00 (prorated by the seconds left).
		expect(preview.dueNow).toBeGreaterThan(9000);
		expect(preview.dueNow).toBeLessThanOrEqual(9800);
		await changeSeats(workspaceId, 4);
		expect((await getBillingAccount(workspaceId))!.seats).toBe(4);
	});

	it('refuses going below the seats in use, naming who holds them', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 3);
		const analyst = await newPerson(database.knex, 'analyst');
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		const refusal = await changeSeats(workspaceId, 1).then(() => null, (e: Error) => e.message);
		expect(refusal).toMatch(/^2 seats are in use, by /);
		expect(refusal).toContain(owner.name);
		expect(refusal).toContain(analyst.name);
		expect((await getBillingAccount(workspaceId))!.seats).toBe(3);
	});

	it('lets exactly as many of many concurrent invitations through as there are free seats', async () => {
		const { owner, workspaceId } = await newWorkspaceOf(database.knex);
		await upgrade(workspaceId, owner, 'team', 3); // the owner holds one: two free
		const outcomes = await Promise.allSettled(
			Array.from({ length: 8 }, (_, i) => createInvitation({ workspaceId, email: `seat-${i}@test.example`, role: 'analyst', invitedBy: owner.id }))
		);
		expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(2);
		const refused = outcomes.filter((o): o is PromiseRejectedResult => o.status === 'rejected');
		expect(refused.every((o) => o.reason instanceof SeatLimitError)).toBe(true);
		// Viewers take no seat.
		await expect(createInvitation({ workspaceId, email: 'viewer@test.example', role: 'viewer', invitedBy: owner.id })).resolves.toBeDefined();
	});

	it('refuses making a viewer an analyst when no seat is free (free plan: two seats)', async () => {
		const { workspaceId } = await newWorkspaceOf(database.knex);
		const [a, b] = [await newPerson(database.knex), await newPerson(database.knex)];
		await addMember(workspaceId, a.id, 'viewer', database.knex);
		await addMember(workspaceId, b.id, 'viewer', database.knex);
		await changeMemberRole(workspaceId, a.id, 'analyst', database.knex);
		await expect(changeMemberRole(workspaceId, b.id, 'analyst', database.knex)).rejects.toBeInstanceOf(SeatLimitError);
		expect((await database.knex('memberships').where({ workspace_id: workspaceId, user_id: b.id }).first()).role).toBe('viewer');
	});
});

describe('live projects under the plan', () => {
	it('free: three live projects, the fourth refused with 402 and the billing address; concurrent creations never pass the limit', async () => {
		const { workspaceId } = await newWorkspaceOf(database.knex);
		const attempts = await Promise.allSettled(
			Array.from({ length: 6 }, (_, i) =>
				withRoomForProject(workspaceId, (trx) => createProject({ workspaceId, name: `Reef ${i}`, technology: 'tidal-stream' }, trx), database.knex)
			)
		);
		expect(attempts.filter((a) => a.status === 'fulfilled')).toHaveLength(3);
		const refusal = attempts.find((a): a is PromiseRejectedResult => a.status === 'rejected')!.reason;
		expect(refusal).toBeInstanceOf(PlanRefusal);
		expect(refusal.status).toBe(402);
		expect(refusal.details).toEqual({ billingUrl: `/app/w/${workspaceId}/billing` });
	});
});
