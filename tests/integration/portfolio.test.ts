/**
 * The portfolio against a real PostgreSQL: one query for every project with
 * its base case's stored figures, the reasons a project has none, filters,
 * order with missing figures last, who sees which workspace (members and API
 * tokens, through the routes), the CSV file, and the consultant demo seed.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import Papa from 'papaparse';
import Decimal from 'decimal.js';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { newPerson, newWorkspaceOf } from '../helpers/people';
import { setAppEnv } from '../helpers/app-env';
import { memberEvent } from '../helpers/route-event';
import { tidalDocument, waveDocument } from '../fixtures/scenario-documents';
import type { SessionUser } from '../../src/lib/server/auth/session';
import type { ApiTokenPrincipal } from '../../src/lib/server/auth/principal';
import { addMember, listWorkspacesForUser } from '../../src/lib/server/db/memberships';
import { archiveProject, createProject } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, saveScenario } from '../../src/lib/server/db/scenarios';
import { getStoredMetricsOf, putStoredResult } from '../../src/lib/server/db/scenario-results';
import { evaluateScenario, type EngineResult } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { resultOfSavedScenario } from '../../src/lib/server/workbench/stored-results';
import { loadPortfolio } from '../../src/lib/server/workbench/portfolio';
import { portfolioQuerySchema, type PortfolioQuery } from '../../src/lib/schemas/portfolio';
import { CAUTIONS } from '../../src/lib/cautions';
import { METRICS } from '../../src/lib/metrics/catalogue';
import { runSeeds } from '../../seeds/index';
import { consultantProjects } from '../../seeds/04_consultant_portfolio';
import { demoUsers, otherWorkspace } from '../../seeds/02_demo_users';
import { demoWorkspace } from '../../seeds/01_demo_workspace';
import * as portfolioRoute from '../../src/routes/api/v1/portfolio/+server';
import * as portfolioCsvRoute from '../../src/routes/api/v1/portfolio.csv/+server';

let database: TestDatabase;

/** Workspace A: five projects, one for each case the table must handle; workspace B: one project. */
const place = {} as {
	ownerA: SessionUser;
	viewerA: SessionUser;
	ownerB: SessionUser;
	workspaceA: string;
	workspaceB: string;
	evaluated: { id: string; result: EngineResult };
	archivedWave: { id: string; result: EngineResult };
	noBaseCase: string;
	notEvaluated: string;
	staleResult: string;
	inB: string;
};

const query = (given: Partial<PortfolioQuery> = {}) => portfolioQuerySchema.parse(given);
const workspaceOf = (workspaceId: string, name = 'A') => ({ workspaceId, workspaceName: name, role: 'viewer' as const });

async function projectWithBaseCase(workspaceId: string, name: string, document = tidalDocument) {
	const project = await createProject({ workspaceId, name, technology: document.technology }, database.knex);
	const scenario = await createScenario({ projectId: project.id, name: 'Base case', document, userId: null }, database.knex);
	return { project, scenario };
}

async function stored(scenario: { id: string; revision: number; document: typeof tidalDocument }, technology: string) {
	return (await resultOfSavedScenario(scenario, { technology }, { evaluate: evaluateScenario, knex: database.knex })).result;
}

beforeAll(async () => {
	database = await createTestDatabase();
	// The access module reads memberships through the app's db() singleton.
	setAppEnv({ DATABASE_URL: database.url });
	const a = await newWorkspaceOf(database.knex);
	const b = await newWorkspaceOf(database.knex);
	place.ownerA = a.owner;
	place.ownerB = b.owner;
	place.workspaceA = a.workspaceId;
	place.workspaceB = b.workspaceId;
	place.viewerA = await newPerson(database.knex, 'viewer');
	await addMember(a.workspaceId, place.viewerA.id, 'viewer', database.knex);
	// A's owner also works in B, so a token of A's owner must still see A only.
	await addMember(b.workspaceId, a.owner.id, 'analyst', database.knex);

	const evaluated = await projectWithBaseCase(a.workspaceId, 'Aldgate Sound Array');
	place.evaluated = { id: evaluated.project.id, result: await stored(evaluated.scenario, 'tidal-stream') };

	const wave = await projectWithBaseCase(a.workspaceId, 'Brindle Reach Wave Farm', waveDocument);
	place.archivedWave = { id: wave.project.id, result: await stored(wave.scenario, 'wave') };
	await archiveProject(wave.project.id, database.knex);

	const withoutBase = await projectWithBaseCase(a.workspaceId, 'Cobble Race Pilot');
	await archiveScenario(withoutBase.scenario.id, null, database.knex);
	place.noBaseCase = withoutBase.project.id;

	const notEvaluated = await projectWithBaseCase(a.workspaceId, 'Dunmere Narrows Array');
	place.notEvaluated = notEvaluated.project.id;

	// Results exist, but for an older revision and another engine: neither is the current one's.
	const stale = await projectWithBaseCase(a.workspaceId, 'Eskby Sound Array');
	await stored(stale.scenario, 'tidal-stream');
	await putStoredResult({ scenarioId: stale.scenario.id, revision: 2, engineVersion: `${ENGINE_VERSION}-old`, result: place.evaluated.result }, database.knex);
	await saveScenario({ scenarioId: stale.scenario.id, expectedRevision: 1, userId: null, notes: 'Revised after the survey' }, database.knex);
	place.staleResult = stale.project.id;

	const inB = await projectWithBaseCase(b.workspaceId, 'Farrow Deep Array');
	await stored(inB.scenario, 'tidal-stream');
	place.inB = inB.project.id;
});
afterAll(() => database.drop());

const portfolioOfA = (given: Partial<PortfolioQuery> = {}) => loadPortfolio([workspaceOf(place.workspaceA)], query(given), { knex: database.knex });

describe('loadPortfolio', () => {
	it('reads every project of the workspaces, with base-case figures, in one query', async () => {
		const queries: string[] = [];
		const count = (q: { sql: string }) => queries.push(q.sql);
		database.knex.on('query', count);
		const portfolio = await loadPortfolio([workspaceOf(place.workspaceA), workspaceOf(place.workspaceB, 'B')], query(), { knex: database.knex });
		database.knex.removeListener('query', count);
		expect(queries).toHaveLength(1);
		expect(portfolio.rows).toHaveLength(6);
		expect(portfolio.counts).toEqual({ projects: 6, withResults: 3 });
	});

	it("gives the base case's stored metrics, its capacity in MW and its capex, beside the currency", async () => {
		const row = (await portfolioOfA()).rows.find((r) => r.projectId === place.evaluated.id)!;
		const { result } = place.evaluated;
		expect(row.missing).toBeNull();
		expect(row.baseCase?.name).toBe('Base case');
		expect(row.currency).toBe(result.currency);
		expect(row.figures.lcoeReal).toBe(result.metrics.lcoeReal);
		expect(row.figures.equityIrr).toBe(result.metrics.equityIrr);
		expect(row.figures.minDscr).toBe(result.metrics.minDscr);
		expect(row.figures.netAepMWh).toBe(result.metrics.netAepMWh);
		expect(row.figures.capexRealTotal).toBe(result.costs.capexRealTotal);
		expect(new Decimal(row.figures.installedCapacityMW!).times(1000).eq(result.energy.installedCapacityKW)).toBe(true);
	});

	it('lists projects without figures too, saying why', async () => {
		const rows = (await portfolioOfA()).rows;
		const byId = (id: string) => rows.find((r) => r.projectId === id)!;
		expect([byId(place.noBaseCase).missing, byId(place.noBaseCase).reason]).toEqual(['no-base-case', 'no base case yet']);
		expect(byId(place.noBaseCase).baseCase).toBeNull();
		expect([byId(place.notEvaluated).missing, byId(place.notEvaluated).reason]).toEqual(['not-evaluated', 'not evaluated by the current engine yet']);
		expect(byId(place.staleResult).missing).toBe('not-evaluated');
		expect(Object.values(byId(place.staleResult).figures).every((v) => v === null)).toBe(true);
	});

	it('marks archived projects and filters by status and technology', async () => {
		const all = await portfolioOfA();
		expect(all.rows.find((r) => r.projectId === place.archivedWave.id)?.status).toBe('archived');
		expect(all.rows.filter((r) => r.status === 'live')).toHaveLength(4);
		expect((await portfolioOfA({ status: 'archived' })).rows.map((r) => r.projectId)).toEqual([place.archivedWave.id]);
		expect((await portfolioOfA({ status: 'live' })).rows.map((r) => r.projectId)).not.toContain(place.archivedWave.id);
		const waves = await portfolioOfA({ technology: 'wave' });
		expect(waves.rows.map((r) => r.projectName)).toEqual(['Brindle Reach Wave Farm']);
		expect(waves.counts).toEqual({ projects: 1, withResults: 1 });
		expect((await portfolioOfA({ technology: 'ocean-current' })).rows).toEqual([]);
	});

	it('sorts by a figure both ways with projects lacking it last', async () => {
		const lcoe = (r: { figures: { lcoeReal: string | null } }) => r.figures.lcoeReal;
		const ascending = (await portfolioOfA({ sort: 'lcoeReal', dir: 'asc' })).rows;
		const descending = (await portfolioOfA({ sort: 'lcoeReal', dir: 'desc' })).rows;
		for (const rows of [ascending, descending]) {
			expect(rows.slice(0, 2).every((r) => lcoe(r) !== null)).toBe(true);
			expect(rows.slice(2).every((r) => lcoe(r) === null)).toBe(true);
			// Among themselves, the rows without figures keep name order.
			expect(rows.slice(2).map((r) => r.projectName)).toEqual(['Cobble Race Pilot', 'Dunmere Narrows Array', 'Eskby Sound Array']);
		}
		const [first, second] = ascending;
		expect(new Decimal(lcoe(first)!).lte(lcoe(second)!)).toBe(true);
		expect(descending.slice(0, 2).map((r) => r.projectId)).toEqual([second.projectId, first.projectId]);
	});
});

function tokenEvent(user: SessionUser, workspaceId: string, path: string): RequestEvent {
	const principal: ApiTokenPrincipal = { kind: 'token', user, token: { id: 'test-token', name: 'script', access: 'read', workspaceId } };
	const url = new URL(path, 'http://127.0.0.1');
	return { params: {}, url, request: new Request(url), locals: { principal, user: null, session: null }, getClientAddress: () => '127.0.0.1' } as unknown as RequestEvent;
}

const asMember = (user: SessionUser, path: string) => portfolioRoute.GET(memberEvent(user, { path, params: {} }) as never);

async function projectIdsOf(response: Response): Promise<string[]> {
	expect(response.status).toBe(200);
	return ((await response.json()) as { rows: { projectId: string }[] }).rows.map((r) => r.projectId);
}

describe('GET /api/v1/portfolio: who sees what', () => {
	it('shows a member of A only A, and answers 404 for B', async () => {
		const ids = await projectIdsOf(await asMember(place.viewerA, '/api/v1/portfolio'));
		expect(ids).toHaveLength(5);
		expect(ids).not.toContain(place.inB);
		expect((await asMember(place.viewerA, `/api/v1/portfolio?workspaceId=${place.workspaceB}`)).status).toBe(404);
		expect(await projectIdsOf(await asMember(place.ownerB, '/api/v1/portfolio'))).toEqual([place.inB]);
	});

	it('spans every workspace of a member of several, or the one asked for', async () => {
		expect((await projectIdsOf(await asMember(place.ownerA, '/api/v1/portfolio'))).sort()).toHaveLength(6);
		expect(await projectIdsOf(await asMember(place.ownerA, `/api/v1/portfolio?workspaceId=${place.workspaceB}`))).toEqual([place.inB]);
	});

	it("keeps an API token to its own workspace, even when its member belongs to others", async () => {
		const inA = await projectIdsOf(await portfolioRoute.GET(tokenEvent(place.ownerA, place.workspaceA, '/api/v1/portfolio') as never));
		expect(inA).toHaveLength(5);
		expect(inA).not.toContain(place.inB);
		const refused = await portfolioRoute.GET(tokenEvent(place.ownerA, place.workspaceA, `/api/v1/portfolio?workspaceId=${place.workspaceB}`) as never);
		expect(refused.status).toBe(404);
	});

	it('answers figures as numbers or null, with the currency', async () => {
		const body = await (await asMember(place.viewerA, '/api/v1/portfolio?sort=lcoeReal')).json();
		const row = body.rows.find((r: { projectId: string }) => r.projectId === place.evaluated.id);
		expect(row.currency).toBe(place.evaluated.result.currency);
		expect(row.metrics.lcoeReal).toBe(Number(place.evaluated.result.metrics.lcoeReal));
		expect(typeof row.capexRealTotal).toBe('number');
		const missing = body.rows.find((r: { projectId: string }) => r.projectId === place.notEvaluated);
		expect(missing.metrics.lcoeReal).toBeNull();
		expect(missing.reason).toBe('not evaluated by the current engine yet');
		expect(body.query).toEqual({ workspaceId: null, technology: null, status: null, sort: 'lcoeReal', dir: 'asc' });
	});

	it('refuses a bad filter with 422 naming it', async () => {
		const response = await asMember(place.viewerA, '/api/v1/portfolio?status=deleted');
		expect(response.status).toBe(422);
		const { error } = await response.json();
		expect(error.issues.map((i: { path: string }) => i.path)).toEqual(['status']);
	});
});

describe('GET /api/v1/portfolio.csv', () => {
	it('is the filtered, ordered table with units in the headers and the cautions after a blank line', async () => {
		const response = await portfolioCsvRoute.GET(
			memberEvent(place.viewerA, { path: `/api/v1/portfolio.csv?workspaceId=${place.workspaceA}&status=live&sort=lcoeReal&dir=desc`, params: {} }) as never
		);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(response.headers.get('content-disposition')).toBe('attachment; filename="portfolio.csv"');
		const text = await response.text();
		const [table, cautions] = text.replace(/^\uFEFF/, '').split('\r\n\r\n');
		const [header, ...rows] = Papa.parse<string[]>(table, { skipEmptyLines: true }).data;
		const currency = place.evaluated.result.currency;
		expect(header.slice(0, 5)).toEqual(['Project', 'Technology', 'Status', 'Base case', 'Currency']);
		expect(header).toContain(`${METRICS.lcoeReal.label} (${currency}/MWh; real, COD-year money)`);
		expect(header.at(-1)).toBe('Why no figures');
		// Four live projects; the one with figures first, the rest by name.
		expect(rows.map((r) => r[0])).toEqual(['Aldgate Sound Array', 'Cobble Race Pilot', 'Dunmere Narrows Array', 'Eskby Sound Array']);
		expect(rows[0][4]).toBe(currency);
		expect(rows[1].at(-1)).toBe('no base case yet');
		expect(Papa.parse<string[]>(cautions, { skipEmptyLines: true }).data.map((r) => r[0])).toEqual(CAUTIONS.map((c) => `Caution: ${c}`));
	});

	it('shows an outsider nothing of the workspace', async () => {
		const response = await portfolioCsvRoute.GET(memberEvent(place.ownerB, { path: `/api/v1/portfolio.csv?workspaceId=${place.workspaceA}`, params: {} }) as never);
		expect(response.status).toBe(404);
	});
});

describe('the consultant portfolio seed', () => {
	let seeded: TestDatabase;
	beforeAll(async () => {
		seeded = await createTestDatabase({ seed: true });
	});
	afterAll(() => seeded.drop());

	it('gives Corvane Advisory five client projects, one archived, each base case with a stored result of the current engine', async () => {
		const corvane = await seeded.knex('workspaces').select('id').where({ slug: otherWorkspace.slug }).first();
		const portfolio = await loadPortfolio([workspaceOf(corvane.id, 'Corvane Advisory')], query({ sort: 'installedCapacityMW' }), { knex: seeded.knex });
		expect(portfolio.rows.map((r) => r.projectName).sort()).toEqual(consultantProjects.map((p) => p.name).sort());
		expect(portfolio.counts).toEqual({ projects: 5, withResults: 5 });
		expect(portfolio.rows.filter((r) => r.status === 'archived')).toHaveLength(1);
		expect(new Set(portfolio.rows.map((r) => r.technology))).toEqual(new Set(['tidal-stream', 'ocean-current', 'wave']));
		expect(new Set(portfolio.rows.map((r) => r.currency))).toEqual(new Set(['EUR', 'USD']));
		// Spread out for the chart: capacities and LCOEs all differ, every base case has an LCOE.
		expect(new Set(portfolio.rows.map((r) => r.figures.installedCapacityMW)).size).toBe(5);
		expect(new Set(portfolio.rows.map((r) => r.figures.lcoeReal)).size).toBe(5);
		expect(portfolio.rows.every((r) => r.figures.lcoeReal !== null && r.figures.capexRealTotal !== null)).toBe(true);
		// The project page reads the same store for its key figures.
		const bases = await seeded.knex('scenarios').select('id', 'revision').whereIn('id', portfolio.rows.map((r) => r.baseCase!.id));
		const figures = await getStoredMetricsOf(bases.map((s) => ({ scenarioId: s.id, revision: s.revision })), ENGINE_VERSION, seeded.knex);
		expect(figures.size).toBe(5);
	});

	it('gives the consultant both workspaces and leaves the outsider outside Halvard', async () => {
		const idOf = async (email: string) => (await seeded.knex('users').select('id').where({ email }).first()).id as string;
		const names = async (email: string) => (await listWorkspacesForUser(await idOf(email), seeded.knex)).map((w) => [w.workspaceName, w.role]);
		expect(await names(demoUsers.consultant.email)).toEqual([
			[otherWorkspace.name, 'analyst'],
			[demoWorkspace.name, 'viewer']
		]);
		expect((await names(demoUsers.outsider.email)).map(([name]) => name)).not.toContain(demoWorkspace.name);
	});

	it('adds nothing on a second run', async () => {
		const count = async () => Number((await seeded.knex('projects').count<{ count: string }[]>({ count: '*' }))[0].count);
		const before = await count();
		await runSeeds(seeded.knex);
		expect(await count()).toBe(before);
	});
});
