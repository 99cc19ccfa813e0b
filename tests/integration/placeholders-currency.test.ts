/**
 * Placeholder marks through the API (set when a scenario starts from the
 * example or from blank defaults, dropped by edits, narrowed by the editor,
 * copied by a duplicate, cleared by an upload), and a project's new currency,
 * which never relabels money unasked: refused without a word on the amounts,
 * then kept or converted, each scenario saved as a new revision, the change
 * in the audit log.
 */
import { readFileSync } from 'node:fs';
import DecimalJs from 'decimal.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { callRoute, newSessionUser } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { createProject } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, getScenarioById, listScenarioRevisions } from '../../src/lib/server/db/scenarios';
import { storeUpload } from '../../src/lib/server/db/uploads';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { UPLOAD_KINDS } from '../../src/lib/server/uploads';
import { blankDocument } from '../../src/lib/workbench/document-defaults';
import { placeholderPathsOf } from '../../src/lib/workbench/placeholders';
import * as projectRoute from '../../src/routes/api/v1/projects/[projectId]/+server';
import * as projectScenariosRoute from '../../src/routes/api/v1/projects/[projectId]/scenarios/+server';
import * as scenarioRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/+server';
import * as duplicateRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/duplicate/+server';
import * as applyRoute from '../../src/routes/api/v1/uploads/[uploadId]/apply/+server';

let database: TestDatabase;
let owner: SessionUser;
let workspaceId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	owner = await newSessionUser(database.knex, 'keeper');
	workspaceId = (await createWorkspaceWithOwner('Fennick Tide Works', owner.id, database.knex)).id;
});
afterAll(() => database.drop());

async function newProject(currency = 'EUR') {
	return createProject({ workspaceId, name: `Brathay Race ${Math.random()}`, technology: 'tidal-stream', currency }, database.knex);
}

async function createVia(projectId: string, body: unknown) {
	const response = await callRoute(projectScenariosRoute.POST, owner, { method: 'POST', path: `/api/v1/projects/${projectId}/scenarios`, params: { projectId }, body });
	expect(response.status, await response.clone().text()).toBe(201);
	return (await response.json()).scenario;
}

async function saveVia(scenarioId: string, body: unknown) {
	return callRoute(scenarioRoute.PUT, owner, { method: 'PUT', path: `/api/v1/scenarios/${scenarioId}`, params: { scenarioId }, body });
}

async function patchProject(projectId: string, body: unknown) {
	return callRoute(projectRoute.PATCH, owner, { method: 'PATCH', path: `/api/v1/projects/${projectId}`, params: { projectId }, body });
}

describe('placeholder marks', () => {
	it("mark the example's figures when a scenario starts from the example, and nothing when a document is sent without marks", async () => {
		const project = await newProject();
		const started = await createVia(project.id, { name: 'Base case' });
		expect(started.placeholderPaths.length).toBeGreaterThan(30);
		expect(started.placeholderPaths).toContain('capex.lines[0].amount');
		expect(started.placeholderPaths).not.toContain('site.waterDensityKgPerM3');

		const own = await createVia(project.id, { name: 'Own figures', document: tidalDocument });
		expect(own.placeholderPaths).toEqual([]);
	});

	it("keep the blank defaults' marks the editor sends, less any that name no placeholder value", async () => {
		const project = await newProject();
		const blank = blankDocument('tidal-stream', { name: 'Blank', currency: 'EUR' });
		const marks = placeholderPathsOf(blank);
		const created = await createVia(project.id, { name: 'Blank', document: blank, placeholderPaths: [...marks, 'site.gravityMPerS2', 'nonsense'] });
		expect(created.placeholderPaths).toEqual(marks);
	});

	it('go when their values are edited, narrow without a revision when kept, and are never added by a save', async () => {
		const project = await newProject();
		const started = await createVia(project.id, { name: 'Base case' });
		const all: string[] = started.placeholderPaths;

		const document = structuredClone(started.document);
		document.capex.lines[0].amount = 3_000_000;
		const edited = await saveVia(started.id, { revision: 1, document });
		expect(edited.status).toBe(200);
		const afterEdit = (await edited.json()).scenario;
		expect(afterEdit.revision).toBe(2);
		expect(afterEdit.placeholderPaths).toEqual(all.filter((key) => key !== 'capex.lines[0].amount'));

		// "Keep these values" on the revenue section: only the marks change, so no new revision.
		const kept = afterEdit.placeholderPaths.filter((key: string) => !key.startsWith('revenue.'));
		const keptAnswer = await saveVia(started.id, { revision: 2, placeholderPaths: [...kept, 'capex.lines[0].amount'] });
		expect(keptAnswer.status).toBe(200);
		const afterKeep = (await keptAnswer.json()).scenario;
		expect(afterKeep.revision).toBe(2);
		expect(afterKeep.placeholderPaths).toEqual(kept);
		expect((await listScenarioRevisions(started.id, database.knex)).map((r) => r.revision)).toEqual([2, 1]);

		// A save of another field without a list keeps every mark it leaves alone.
		const renamed = await saveVia(started.id, { revision: 2, notes: 'Checked the tariff.' });
		expect((await renamed.json()).scenario.placeholderPaths).toEqual(kept);
	});

	it('are copied by a duplicate and cleared from the part an upload replaces', async () => {
		const project = await newProject();
		const started = await createVia(project.id, { name: 'Base case' });
		const copyAnswer = await callRoute(duplicateRoute.POST, owner, { method: 'POST', path: `/api/v1/scenarios/${started.id}/duplicate`, params: { scenarioId: started.id } });
		const copy = (await copyAnswer.json()).scenario;
		expect(copy.placeholderPaths).toEqual(started.placeholderPaths);

		const file = readFileSync('static/templates/power-curve.csv');
		const parsed = UPLOAD_KINDS['power-curve'].parse(new Uint8Array(file));
		if (!parsed.ok) throw new Error('the power-curve template should parse');
		const upload = await storeUpload(
			{
				projectId: project.id,
				kind: 'power-curve',
				fileName: 'power-curve.csv',
				contentType: 'text/csv',
				content: new Uint8Array(file),
				parsed: { data: parsed.data, summary: parsed.summary, warnings: parsed.warnings },
				userId: owner.id
			},
			database.knex
		);
		const applied = await callRoute(applyRoute.POST, owner, {
			method: 'POST',
			path: `/api/v1/uploads/${upload.id}/apply?scenarioId=${copy.id}`,
			params: { uploadId: upload.id }
		});
		expect(applied.status, await applied.clone().text()).toBe(200);
		const after = (await applied.json()).scenario.placeholderPaths as string[];
		expect(after.filter((key) => key.startsWith('device.'))).toEqual([]);
		expect(after).toEqual(copy.placeholderPaths.filter((key: string) => !key.startsWith('device.')));
	});
});

describe("a project's new currency", () => {
	async function furnished() {
		const project = await newProject('EUR');
		const base = await createScenario({ projectId: project.id, name: 'Base', document: tidalDocument, userId: owner.id }, database.knex);
		const shelved = await createScenario({ projectId: project.id, name: 'Shelved', document: tidalDocument, userId: owner.id }, database.knex);
		await archiveScenario(shelved.id, owner.id, database.knex);
		const pounds = await createScenario({ projectId: project.id, name: 'In pounds', document: { ...tidalDocument, currency: 'GBP' }, userId: owner.id }, database.knex);
		return { project, base, shelved, pounds };
	}

	it('is refused without a word on the amounts, naming the field, and nothing changes', async () => {
		const { project, base } = await furnished();
		const response = await patchProject(project.id, { currency: 'USD' });
		expect(response.status).toBe(422);
		const body = await response.json();
		expect(body.error.issues.map((i: { path: string }) => i.path)).toEqual(['amounts']);
		expect(body.error.message).toMatch(/2 scenarios with money in EUR/);
		const after = await getScenarioById(base.id, database.knex);
		expect(after).toMatchObject({ revision: 1, document: { currency: 'EUR' } });
		expect((await (await callRoute(projectRoute.GET, owner, { path: `/api/v1/projects/${project.id}`, params: { projectId: project.id } })).json()).project.currency).toBe('EUR');
	});

	it('refuses both answers at once, an answer without a currency, and a rate written with a comma', async () => {
		const { project } = await furnished();
		const both = await patchProject(project.id, { currency: 'USD', amounts: 'keep', conversionRate: 1.1 });
		expect(both.status).toBe(422);
		expect((await both.json()).error.issues[0].path).toBe('conversionRate');
		const alone = await patchProject(project.id, { amounts: 'keep' });
		expect(alone.status).toBe(422);
		expect((await alone.json()).error.issues[0].path).toBe('currency');
		const comma = await patchProject(project.id, { currency: 'USD', conversionRate: '1,08' });
		expect(comma.status).toBe(422);
		expect((await comma.json()).error.issues[0].path).toBe('conversionRate');
	});

	it('keeps the amounts when told to: the figures stay, read in the new currency, each as a new revision', async () => {
		const { project, base, shelved, pounds } = await furnished();
		const response = await patchProject(project.id, { currency: 'USD', amounts: 'keep' });
		expect(response.status, await response.clone().text()).toBe(200);
		expect((await response.json()).project.currency).toBe('USD');
		for (const scenario of [base, shelved]) {
			const after = (await getScenarioById(scenario.id, database.knex))!;
			expect(after.revision).toBe(2);
			expect(after.document).toEqual({ ...scenario.document, currency: 'USD' });
			const [latest] = await listScenarioRevisions(scenario.id, database.knex);
			expect(latest.summary).toBe('Currency changed from EUR to USD: money amounts kept as they were, not converted');
		}
		// A scenario in a currency of its own is left as it is.
		expect(await getScenarioById(pounds.id, database.knex)).toMatchObject({ revision: 1, document: { currency: 'GBP' } });
		const event = await database.knex('audit_events').where({ event: 'project-currency-changed' }).whereRaw(`detail->>'projectId' = ?`, [project.id]).first();
		expect(event.detail).toMatchObject({ from: 'EUR', to: 'USD', amounts: 'kept', scenarios: 2 });
	});

	it('converts every money amount at the rate given, archived scenarios too, and nothing else', async () => {
		const { project, base, shelved } = await furnished();
		const response = await patchProject(project.id, { currency: 'NOK', conversionRate: '11.62' });
		expect(response.status, await response.clone().text()).toBe(200);
		for (const scenario of [base, shelved]) {
			const after = (await getScenarioById(scenario.id, database.knex))!;
			expect(after.revision).toBe(2);
			const before = scenario.document;
			// The reference: decimal.js on each amount as stored.
			const times = (x: number) => new DecimalJs(String(x)).times('11.62').toNumber();
			expect(after.document.capex.lines.map((l) => l.amount)).toEqual(before.capex.lines.map((l) => times(l.amount)));
			expect(after.document.revenue.tariffPerMWh).toBe(times(before.revenue.tariffPerMWh));
			expect(after.document.timeline).toEqual(before.timeline);
			expect(after.document.finance).toEqual(before.finance);
			expect(after.document.currency).toBe('NOK');
			const [latest] = await listScenarioRevisions(scenario.id, database.knex);
			expect(latest.summary).toBe('Currency changed from EUR to NOK: every money amount converted at 11.62 NOK per EUR');
		}
		const event = await database.knex('audit_events').where({ event: 'project-currency-changed' }).whereRaw(`detail->>'projectId' = ?`, [project.id]).first();
		expect(event.detail).toMatchObject({ from: 'EUR', to: 'NOK', amounts: 'converted', rate: '11.62', scenarios: 2 });
	});

	it('goes straight through on a project whose scenarios hold no money in its currency', async () => {
		const project = await newProject('EUR');
		const response = await patchProject(project.id, { currency: 'DKK' });
		expect(response.status).toBe(200);
		expect((await response.json()).project.currency).toBe('DKK');
	});
});
