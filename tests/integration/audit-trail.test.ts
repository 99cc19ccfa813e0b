/**
 * The audit log's records of work, against a real PostgreSQL, the real
 * compute pool and the local Stripe stand-in: scenario saves and restores,
 * uploads applied, exports, projects renamed and archived, scenarios deleted,
 * API tokens and Stripe's billing changes each write one line naming who did
 * it and what it was done to; the confirming steps write nothing until
 * confirmed; the log's filters and pages read them back.
 */
import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import Stripe from 'stripe';
import { isActionFailure, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { freePort } from '../helpers/free-port';
import { callRoute, memberEvent, newSessionUser } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import { startStripeStandin, type StripeStandin } from '../../docker-local/stripe-standin/index';
import { planPrices } from '../../seeds/05_plans_and_billing';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { computePool } from '../../src/lib/server/compute/pool';
import { listAuditEventsPage, recordAuditEvent } from '../../src/lib/server/db/audit';
import { getBillingAccount } from '../../src/lib/server/db/billing';
import { addMember } from '../../src/lib/server/db/memberships';
import { createProject, getProjectById } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, getScenarioById, getScenarioRevisionDocument } from '../../src/lib/server/db/scenarios';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { changeSeats, startCheckout } from '../../src/lib/server/billing/subscription';
import { syncSubscription } from '../../src/lib/server/billing/sync';
import { receiveUpload } from '../../src/lib/server/workbench/receive-upload';
import * as scenarioRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/+server';
import * as exportRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/export/+server';
import * as applyRoute from '../../src/routes/api/v1/uploads/[uploadId]/apply/+server';
import { actions as historyActions, load as historyLoad } from '../../src/routes/(app)/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]/history/+page.server';
import { actions as projectActions } from '../../src/routes/(app)/app/w/[workspaceId]/projects/[projectId]/+page.server';
import { actions as accountActions } from '../../src/routes/(app)/app/account/+page.server';
import { load as auditLoad } from '../../src/routes/(app)/app/w/[workspaceId]/audit/+page.server';

const webhookSecret = 'whsec_audit_trail';
let database: TestDatabase;
let standin: StripeStandin;
let sdk: Stripe;

beforeAll(async () => {
	database = await createTestDatabase();
	await database.knex('plan_prices').insert(planPrices.map((p) => ({ ...p })));
	// No webhook address: the test calls the sync itself, as the webhook's handlers would.
	standin = await startStripeStandin({ port: await freePort(), webhookSecret });
	setAppEnv({
		DATABASE_URL: database.url,
		STRIPE_SECRET_KEY: 'sk_test_audit_trail',
		STRIPE_WEBHOOK_SECRET: webhookSecret,
		STRIPE_API_HOST: '127.0.0.1',
		STRIPE_API_PORT: String(standin.port),
		STRIPE_API_PROTOCOL: 'http',
		STRIPE_STANDIN_URL: standin.url
	});
	sdk = new Stripe('sk_test_audit_trail', { host: '127.0.0.1', port: standin.port, protocol: 'http', maxNetworkRetries: 0 });
});

afterAll(async () => {
	await (await computePool()).close();
	await standin?.stop();
	await database?.drop();
});

interface Place {
	owner: SessionUser;
	analyst: SessionUser;
	viewer: SessionUser;
	workspaceId: string;
	projectId: string;
	scenarioId: string;
}

async function newPlace(): Promise<Place> {
	const { knex } = database;
	const [owner, analyst, viewer] = [await newSessionUser(knex, 'owner'), await newSessionUser(knex, 'analyst'), await newSessionUser(knex, 'viewer')];
	const workspace = await createWorkspaceWithOwner(`Audit Sound ${randomUUID()}`, owner.id, knex);
	await addMember(workspace.id, analyst.id, 'analyst', knex);
	await addMember(workspace.id, viewer.id, 'viewer', knex);
	const project = await createProject({ workspaceId: workspace.id, name: 'Skerry Sound array', technology: 'tidal-stream', siteName: 'Skerry Sound' }, knex);
	const scenario = await createScenario({ projectId: project.id, name: 'Base case', document: tidalDocument, userId: owner.id }, knex);
	return { owner, analyst, viewer, workspaceId: workspace.id, projectId: project.id, scenarioId: scenario.id };
}

async function logOf(workspaceId: string) {
	const rows = await database.knex('audit_events').select('event', 'actor_user_id', 'detail').where({ workspace_id: workspaceId }).orderBy('id');
	return rows as { event: string; actor_user_id: string | null; detail: Record<string, unknown> }[];
}

function form(fields: Record<string, string | number>): FormData {
	const data = new FormData();
	for (const [name, value] of Object.entries(fields)) data.set(name, String(value));
	return data;
}

/** A form action's event, as SvelteKit would hand it over for a signed-in member. */
function actionEvent(user: SessionUser, path: string, params: Record<string, string>, fields: Record<string, string | number>): never {
	return memberEvent(user, { method: 'POST', path, params, body: form(fields) }) as RequestEvent as never;
}

type ActionOutcome = { status?: number; data?: Record<string, unknown> } & Record<string, unknown>;

/** Runs an action that answers with a redirect on success; answers its location (or throws what it answered). */
async function redirected(run: () => unknown): Promise<string> {
	try {
		const outcome = await run();
		throw new Error(`expected a redirect, got ${JSON.stringify(outcome)}`);
	} catch (e) {
		if (isRedirect(e)) return e.location;
		throw e;
	}
}

describe('scenario saves', () => {
	it('records the revision a save made, by whom, in which scenario; a save that changes nothing records none', async () => {
		const place = await newPlace();
		const path = `/api/v1/scenarios/${place.scenarioId}`;
		const saved = await callRoute(scenarioRoute.PUT, place.analyst, { method: 'PUT', path, params: { scenarioId: place.scenarioId }, body: { revision: 1, notes: 'Checked against the survey' } });
		expect(saved.status, await saved.clone().text()).toBe(200);
		const again = await callRoute(scenarioRoute.PUT, place.analyst, { method: 'PUT', path, params: { scenarioId: place.scenarioId }, body: { revision: 2, notes: 'Checked against the survey' } });
		expect(again.status).toBe(200);
		expect(await logOf(place.workspaceId)).toEqual([
			{
				event: 'scenario-saved',
				actor_user_id: place.analyst.id,
				detail: { project: 'Skerry Sound array', projectId: place.projectId, scenario: 'Base case', scenarioId: place.scenarioId, revision: 2 }
			}
		]);
	});
});

describe('restoring a revision from the history page', () => {
	it('asks first, then saves the old revision as a new one and records both numbers; a stale restore writes nothing', async () => {
		const place = await newPlace();
		const params = { workspaceId: place.workspaceId, projectId: place.projectId, scenarioId: place.scenarioId };
		const path = `/app/w/${place.workspaceId}/projects/${place.projectId}/scenarios/${place.scenarioId}/history?/restore`;
		const changed = { ...tidalDocument, array: { ...tidalDocument.array, availability: 0.9 } };
		const put = await callRoute(scenarioRoute.PUT, place.analyst, { method: 'PUT', path: `/api/v1/scenarios/${place.scenarioId}`, params: { scenarioId: place.scenarioId }, body: { revision: 1, document: changed } });
		expect(put.status, await put.clone().text()).toBe(200);

		// The history page compares the two in words: 95 % then 90 % availability (the fixture's value, then the change above).
		const history = await historyLoad(memberEvent(place.viewer, { path: path.replace('?/restore', '?from=1&to=2'), params }) as never);
		expect(history && history.comparison).toEqual({
			ok: true,
			from: 1,
			to: 2,
			differences: [{ section: 'Array, losses and uncertainty', input: 'Availability', before: '95', after: '90', unit: '%' }]
		});
		expect(history && history.canRestore).toBe(false);

		const asked = (await historyActions.restore(actionEvent(place.analyst, path, params, { revision: 1, expectedRevision: 2 }))) as ActionOutcome;
		expect(asked.confirmRestore).toMatchObject({ revision: 1, expectedRevision: 2, summary: 'Created' });
		expect((await getScenarioById(place.scenarioId))!.revision).toBe(2);

		const location = await redirected(() => historyActions.restore(actionEvent(place.analyst, path, params, { revision: 1, expectedRevision: 2, confirmed: 'yes' })));
		expect(location).toMatch(/\/history\?from=2&to=3&restored=1$/);
		const restored = (await getScenarioById(place.scenarioId))!;
		expect(restored.revision).toBe(3);
		expect(restored.document.array.availability).toBe(tidalDocument.array.availability);
		expect(await getScenarioRevisionDocument(place.scenarioId, 3)).toEqual(restored.document);

		// Someone looking at revision 2 still: refused with the words of a stale save, nothing written.
		const stale = (await historyActions.restore(actionEvent(place.analyst, path, params, { revision: 2, expectedRevision: 2, confirmed: 'yes' }))) as ActionOutcome;
		expect(isActionFailure(stale)).toBe(true);
		expect(stale.status).toBe(409);
		expect(stale.data?.message).toMatch(/revision 3 was saved/);

		const log = await logOf(place.workspaceId);
		expect(log.map((l) => l.event)).toEqual(['scenario-saved', 'scenario-restored']);
		expect(log[1]).toMatchObject({ actor_user_id: place.analyst.id, detail: { scenario: 'Base case', revision: 3, restoredFrom: 1 } });
	});

	it('is not open to a viewer', async () => {
		const place = await newPlace();
		const params = { workspaceId: place.workspaceId, projectId: place.projectId, scenarioId: place.scenarioId };
		const path = `/app/w/${place.workspaceId}/projects/${place.projectId}/scenarios/${place.scenarioId}/history?/restore`;
		await expect(historyActions.restore(actionEvent(place.viewer, path, params, { revision: 1, expectedRevision: 1, confirmed: 'yes' }))).rejects.toMatchObject({ status: 403 });
		expect(await logOf(place.workspaceId)).toEqual([]);
	});
});

describe('uploads applied and exports', () => {
	it('records the file applied, where it went and the revision it made', async () => {
		const place = await newPlace();
		const bytes = new Uint8Array(readFileSync('static/templates/power-curve.csv'));
		const received = await receiveUpload({ projectId: place.projectId, kind: 'power-curve', fileName: 'maker-curve.csv', contentType: 'text/csv', bytes, userId: place.analyst.id }, database.knex);
		if (!received.ok) throw new Error('the template should parse');
		const uploadId = received.upload.id;
		const applied = await callRoute(applyRoute.POST, place.analyst, { method: 'POST', path: `/api/v1/uploads/${uploadId}/apply?scenarioId=${place.scenarioId}`, params: { uploadId } });
		expect(applied.status, await applied.clone().text()).toBe(200);
		const log = await logOf(place.workspaceId);
		expect(log.map((l) => l.event)).toEqual(['upload-applied']);
		expect(log[0].detail).toMatchObject({ upload: 'maker-curve.csv', uploadId, kind: 'Power curve', scenario: 'Base case', revision: 2 });
		expect(typeof log[0].detail.section).toBe('string');
	});

	it('records each export with its format, its table and the revision exported, for a viewer too', async () => {
		const place = await newPlace();
		const path = `/api/v1/scenarios/${place.scenarioId}/export`;
		const csv = await callRoute(exportRoute.GET, place.viewer, { path: `${path}?format=csv&table=metrics`, params: { scenarioId: place.scenarioId } });
		expect(csv.status, await csv.clone().text()).toBe(200);
		const refused = await callRoute(exportRoute.GET, place.viewer, { path: `${path}?format=doc`, params: { scenarioId: place.scenarioId } });
		expect(refused.status).toBe(422);
		expect(await logOf(place.workspaceId)).toEqual([
			{
				event: 'scenario-exported',
				actor_user_id: place.viewer.id,
				detail: expect.objectContaining({ scenario: 'Base case', format: 'csv', table: 'metrics', revision: 1 })
			}
		]);
	});
});

describe('the project page’s rename, archive and delete', () => {
	it('records a rename with the old name, and asks before archiving', async () => {
		const place = await newPlace();
		const params = { workspaceId: place.workspaceId, projectId: place.projectId };
		const path = (action: string) => `/app/w/${place.workspaceId}/projects/${place.projectId}?/${action}`;
		const renamed = (await projectActions.rename(actionEvent(place.analyst, path('rename'), params, { name: 'Skerry Sound phase 1' }))) as ActionOutcome;
		expect(isActionFailure(renamed)).toBe(false);
		await expect(projectActions.archive(actionEvent(place.analyst, path('archive'), params, { confirmed: 'yes' }))).rejects.toMatchObject({ status: 403 });

		const asked = (await projectActions.archive(actionEvent(place.owner, path('archive'), params, {}))) as ActionOutcome;
		expect(asked.confirmArchive).toEqual({ name: 'Skerry Sound phase 1' });
		expect((await getProjectById(place.projectId))!.archived_at).toBeNull();
		await projectActions.archive(actionEvent(place.owner, path('archive'), params, { confirmed: 'yes' }));
		expect((await getProjectById(place.projectId))!.archived_at).not.toBeNull();

		expect(await logOf(place.workspaceId)).toEqual([
			{ event: 'project-renamed', actor_user_id: place.analyst.id, detail: { project: 'Skerry Sound phase 1', projectId: place.projectId, from: 'Skerry Sound array' } },
			{ event: 'project-archived', actor_user_id: place.owner.id, detail: { project: 'Skerry Sound phase 1', projectId: place.projectId } }
		]);
	});

	it('deletes only an archived scenario, after a question naming it, and records it by name', async () => {
		const place = await newPlace();
		const params = { workspaceId: place.workspaceId, projectId: place.projectId };
		const path = `/app/w/${place.workspaceId}/projects/${place.projectId}?/deleteScenario`;
		const live = (await projectActions.deleteScenario(actionEvent(place.owner, path, params, { scenarioId: place.scenarioId, confirmed: 'yes' }))) as ActionOutcome;
		expect(live.status).toBe(409);
		expect(live.data?.message).toMatch(/Archive Base case before deleting/);

		await archiveScenario(place.scenarioId, place.owner.id, database.knex);
		const asked = (await projectActions.deleteScenario(actionEvent(place.owner, path, params, { scenarioId: place.scenarioId }))) as ActionOutcome;
		expect(asked.confirmDelete).toEqual({ scenarioId: place.scenarioId, name: 'Base case', revision: 1 });
		expect(await getScenarioById(place.scenarioId)).toBeDefined();

		const done = (await projectActions.deleteScenario(actionEvent(place.owner, path, params, { scenarioId: place.scenarioId, confirmed: 'yes' }))) as ActionOutcome;
		expect(done.done).toMatch(/Base case is deleted for good/);
		expect(await getScenarioById(place.scenarioId)).toBeUndefined();
		expect(await logOf(place.workspaceId)).toEqual([
			{ event: 'scenario-deleted', actor_user_id: place.owner.id, detail: expect.objectContaining({ scenario: 'Base case', project: 'Skerry Sound array', revision: 1 }) }
		]);
	});
});

describe('API tokens', () => {
	it('a token made and revoked on the account page is in its workspace’s log, under API tokens', async () => {
		const place = await newPlace();
		const made = (await accountActions.createToken(
			actionEvent(place.analyst, '/app/account?/createToken', {}, { name: 'Nightly export', workspaceId: place.workspaceId, access: 'read', lifetimeDays: 30 })
		)) as ActionOutcome;
		expect(isActionFailure(made)).toBe(false);
		const [{ id: tokenId }] = await database.knex('api_tokens').select('id').where({ user_id: place.analyst.id });
		await accountActions.revokeToken(actionEvent(place.analyst, '/app/account?/revokeToken', {}, { tokenId }));
		const page = await listAuditEventsPage(place.workspaceId, { group: 'tokens' }, { limit: 10, after: null });
		expect(page.items.map((e) => [e.event, e.detail.token, e.actorName])).toEqual([
			['api-token-revoked', 'Nightly export', place.analyst.name],
			['api-token-created', 'Nightly export', place.analyst.name]
		]);
	});
});

describe('billing changes synced from Stripe', () => {
	it('records the plan and seats a sync changed, once, with Stripe as the one who did it', async () => {
		const place = await newPlace();
		const url = await startCheckout({ workspace: { id: place.workspaceId, name: 'Audit Sound' }, owner: place.owner, plan: 'team', seats: 2, origin: 'http://127.0.0.1:9' });
		const paid = await fetch(`${url}/pay`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'card=working', redirect: 'manual' });
		expect(paid.status).toBe(303);
		const { customerId } = (await getBillingAccount(place.workspaceId))!;
		const [subscription] = (await sdk.subscriptions.list({ customer: customerId, limit: 1 })).data;

		await syncSubscription(subscription.id);
		// Delivered again (Stripe retries; several events carry one subscription): nothing new to record.
		await syncSubscription(subscription.id);
		await changeSeats(place.workspaceId, 4);

		const log = (await logOf(place.workspaceId)).filter((l) => l.event === 'billing-synced');
		expect(log).toEqual([
			{ event: 'billing-synced', actor_user_id: null, detail: { source: 'stripe', planFrom: 'free', planTo: 'team', seatsFrom: null, seatsTo: 2, subscriptionId: subscription.id } },
			{ event: 'billing-synced', actor_user_id: null, detail: { source: 'stripe', seatsFrom: 2, seatsTo: 4, subscriptionId: subscription.id } }
		]);
	});
});

describe('reading the log back', () => {
	/** Five lines on three days: the analyst's saves and export, the owner's rename and token. */
	async function seededLog() {
		const place = await newPlace();
		const lines: [string, SessionUser, string][] = [
			['scenario-saved', place.analyst, '2026-11-30T09:00:00Z'],
			['scenario-exported', place.analyst, '2026-12-01T10:00:00Z'],
			['project-renamed', place.owner, '2026-12-01T23:59:59Z'],
			['api-token-created', place.owner, '2026-12-02T00:00:00Z'],
			['scenario-saved', place.analyst, '2026-12-02T12:00:00Z']
		];
		for (const [event, user, at] of lines) {
			await recordAuditEvent({ event: event as never, workspaceId: place.workspaceId, actorUserId: user.id, actorEmail: user.email, detail: { at } }, database.knex);
			await database.knex('audit_events').where({ workspace_id: place.workspaceId }).whereRaw(`detail->>'at' = ?`, [at]).update({ created_at: at });
		}
		return place;
	}

	const atsOf = (items: { detail: Record<string, unknown> }[]) => items.map((e) => e.detail.at);

	it('filters by kind, by person and by days (both ends included, in UTC)', async () => {
		const place = await seededLog();
		const read = async (filter: Parameters<typeof listAuditEventsPage>[1]) => atsOf((await listAuditEventsPage(place.workspaceId, filter, { limit: 50, after: null })).items);
		expect(await read({ group: 'work' })).toEqual(['2026-12-02T12:00:00Z', '2026-12-01T23:59:59Z', '2026-11-30T09:00:00Z']);
		expect(await read({ actorUserId: place.owner.id })).toEqual(['2026-12-02T00:00:00Z', '2026-12-01T23:59:59Z']);
		expect(await read({ fromDay: '2026-12-01', toDay: '2026-12-01' })).toEqual(['2026-12-01T23:59:59Z', '2026-12-01T10:00:00Z']);
		expect(await read({ group: 'exports', actorUserId: place.analyst.id, fromDay: '2026-12-02' })).toEqual([]);
	});

	it('pages newest first without repeating or skipping a line', async () => {
		const place = await seededLog();
		const seen: unknown[] = [];
		let after: [string, string] | null = null;
		do {
			const page: Awaited<ReturnType<typeof listAuditEventsPage>> = await listAuditEventsPage(place.workspaceId, {}, { limit: 2, after });
			seen.push(...atsOf(page.items));
			after = page.nextKey;
		} while (after);
		expect(seen).toEqual(['2026-12-02T12:00:00Z', '2026-12-02T00:00:00Z', '2026-12-01T23:59:59Z', '2026-12-01T10:00:00Z', '2026-11-30T09:00:00Z']);
	});

	it('the page filters from its address and names who did it', async () => {
		const place = await seededLog();
		const event = memberEvent(place.owner, { path: `/app/w/${place.workspaceId}/audit?person=${place.analyst.id}&to=2026-12-01`, params: { workspaceId: place.workspaceId } });
		const data = (await auditLoad(event as never)) as { events: { event: string; actor: { name: string } }[]; errors: Record<string, string> };
		expect(data.events.map((e) => [e.event, e.actor.name])).toEqual([
			['scenario-exported', place.analyst.name],
			['scenario-saved', place.analyst.name]
		]);
		expect(data.errors).toEqual({});
		await expect(auditLoad(memberEvent(place.analyst, { path: `/app/w/${place.workspaceId}/audit`, params: { workspaceId: place.workspaceId } }) as never)).rejects.toMatchObject({ status: 403 });
	});
});
