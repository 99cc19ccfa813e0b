/**
 * An archived project is read only until restored: every write route to the
 * project, its scenarios or its uploads answers 409 in the same words and
 * writes nothing; after a restore the same calls go through.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { callRoute, newSessionUser, type RouteCall } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { archiveProject, createProject } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario } from '../../src/lib/server/db/scenarios';
import { storeUpload } from '../../src/lib/server/db/uploads';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { UPLOAD_KINDS } from '../../src/lib/server/uploads';
import * as projectRoute from '../../src/routes/api/v1/projects/[projectId]/+server';
import * as projectRestoreRoute from '../../src/routes/api/v1/projects/[projectId]/restore/+server';
import * as projectScenariosRoute from '../../src/routes/api/v1/projects/[projectId]/scenarios/+server';
import * as projectUploadsRoute from '../../src/routes/api/v1/projects/[projectId]/uploads/+server';
import * as scenarioRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/+server';
import * as archiveRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/archive/+server';
import * as baseCaseRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/base-case/+server';
import * as duplicateRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/duplicate/+server';
import * as restoreRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/restore/+server';
import * as applyRoute from '../../src/routes/api/v1/uploads/[uploadId]/apply/+server';

let database: TestDatabase;
let owner: SessionUser;
let workspaceId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	owner = await newSessionUser(database.knex, 'archivist');
	workspaceId = (await createWorkspaceWithOwner('Corrie Tidal Partners', owner.id, database.knex)).id;
});
afterAll(() => database.drop());

const powerCurve = readFileSync('static/templates/power-curve.csv');

function powerCurveForm() {
	const form = new FormData();
	form.set('kind', 'power-curve');
	form.set('file', new File([powerCurve], 'power-curve.csv', { type: 'text/csv' }));
	return form;
}

/** A project with a base case, a second live scenario, two archived ones and an upload. */
async function furnishedProject() {
	const { knex } = database;
	const project = await createProject({ workspaceId, name: `Corrie Narrows ${Math.random()}`, technology: 'tidal-stream' }, knex);
	const base = await createScenario({ projectId: project.id, name: 'Base', document: tidalDocument, userId: owner.id }, knex);
	const second = await createScenario({ projectId: project.id, name: 'Downside', document: tidalDocument, userId: owner.id }, knex);
	const shelved = await createScenario({ projectId: project.id, name: 'Old idea', document: tidalDocument, userId: owner.id }, knex);
	const discarded = await createScenario({ projectId: project.id, name: 'Discarded idea', document: tidalDocument, userId: owner.id }, knex);
	await archiveScenario(shelved.id, owner.id, knex);
	await archiveScenario(discarded.id, owner.id, knex);
	const parsed = UPLOAD_KINDS['power-curve'].parse(new Uint8Array(powerCurve));
	if (!parsed.ok) throw new Error('the power-curve template should parse');
	const upload = await storeUpload(
		{
			projectId: project.id,
			kind: 'power-curve',
			fileName: 'power-curve.csv',
			contentType: 'text/csv',
			content: new Uint8Array(powerCurve),
			parsed: { data: parsed.data, summary: parsed.summary, warnings: parsed.warnings },
			userId: owner.id
		},
		knex
	);
	return { project, base, second, shelved, discarded, upload };
}

type Furnished = Awaited<ReturnType<typeof furnishedProject>>;
type Handler = Parameters<typeof callRoute>[0];

/** Every write to a project and what it holds, in an order that also works once the project is live again. */
function writes(f: Furnished): [string, Handler, RouteCall][] {
	const p = f.project.id;
	return [
		['PATCH project', projectRoute.PATCH, { method: 'PATCH', path: `/api/v1/projects/${p}`, params: { projectId: p }, body: { name: 'Corrie Narrows II' } }],
		['create scenario', projectScenariosRoute.POST, { method: 'POST', path: `/api/v1/projects/${p}/scenarios`, params: { projectId: p }, body: { name: 'Upside' } }],
		['save scenario', scenarioRoute.PUT, { method: 'PUT', path: `/api/v1/scenarios/${f.base.id}`, params: { scenarioId: f.base.id }, body: { revision: 1, notes: 'checked' } }],
		['duplicate scenario', duplicateRoute.POST, { method: 'POST', path: `/api/v1/scenarios/${f.base.id}/duplicate`, params: { scenarioId: f.base.id } }],
		['mark base case', baseCaseRoute.POST, { method: 'POST', path: `/api/v1/scenarios/${f.second.id}/base-case`, params: { scenarioId: f.second.id } }],
		['archive scenario', archiveRoute.POST, { method: 'POST', path: `/api/v1/scenarios/${f.base.id}/archive`, params: { scenarioId: f.base.id } }],
		['restore scenario', restoreRoute.POST, { method: 'POST', path: `/api/v1/scenarios/${f.shelved.id}/restore`, params: { scenarioId: f.shelved.id } }],
		['upload a file', projectUploadsRoute.POST, { method: 'POST', path: `/api/v1/projects/${p}/uploads`, params: { projectId: p }, body: powerCurveForm() }],
		[
			'apply an upload',
			applyRoute.POST,
			{ method: 'POST', path: `/api/v1/uploads/${f.upload.id}/apply?scenarioId=${f.second.id}`, params: { uploadId: f.upload.id } }
		],
		['delete an archived scenario', scenarioRoute.DELETE, { method: 'DELETE', path: `/api/v1/scenarios/${f.discarded.id}`, params: { scenarioId: f.discarded.id } }]
	];
}

/** Everything a write could touch, as stored. */
async function snapshot() {
	const { knex } = database;
	const [projects, scenarios, revisions, uploads, results] = await Promise.all([
		knex('projects').select('*').orderBy('id'),
		knex('scenarios').select('*').orderBy('id'),
		knex('scenario_revisions').select('scenario_id', 'revision').orderBy(['scenario_id', 'revision']),
		knex('uploads').select('id').orderBy('id'),
		knex('scenario_results').select('scenario_id', 'revision').orderBy(['scenario_id', 'revision'])
	]);
	return JSON.stringify({ projects, scenarios, revisions, uploads, results });
}

describe('writes to an archived project', () => {
	it('are each refused with 409 "This project is archived: restore it first" and write nothing', async () => {
		const furnished = await furnishedProject();
		await archiveProject(furnished.project.id, database.knex);
		const before = await snapshot();
		for (const [label, handler, call] of writes(furnished)) {
			const response = await callRoute(handler, owner, call);
			expect(response.status, label).toBe(409);
			const body = await response.json();
			expect(body.error.message, label).toBe('This project is archived: restore it first.');
		}
		expect(await snapshot()).toBe(before);
	});

	it('go through again once an owner restores the project', async () => {
		const furnished = await furnishedProject();
		await archiveProject(furnished.project.id, database.knex);
		const p = furnished.project.id;
		const restored = await callRoute(projectRestoreRoute.POST, owner, { method: 'POST', path: `/api/v1/projects/${p}/restore`, params: { projectId: p } });
		expect(restored.status).toBe(200);
		expect((await restored.json()).project.archivedAt).toBeNull();
		for (const [label, handler, call] of writes(furnished)) {
			const response = await callRoute(handler, owner, call);
			expect(response.status, `${label}: ${await response.clone().text()}`).toBeLessThan(300);
		}
	});

	it('leave reads open', async () => {
		const furnished = await furnishedProject();
		await archiveProject(furnished.project.id, database.knex);
		const p = furnished.project.id;
		const read = await callRoute(projectScenariosRoute.GET, owner, { path: `/api/v1/projects/${p}/scenarios`, params: { projectId: p } });
		expect(read.status).toBe(200);
		expect((await read.json()).scenarios.map((s: { name: string }) => s.name)).toEqual(['Base', 'Downside']);
	});
});
