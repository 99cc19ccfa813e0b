import { SCHEMA_VERSION } from '../../src/lib/schemas/scenario-upgrades';
import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { tidalInput, waveInput } from '../fixtures/scenario-documents';
import {
	demoWorkspaceId,
	disposeAll,
	expectError,
	issuePaths,
	newProject,
	newScenario,
	signInEveryone,
	type Clients,
	type ProjectJson
} from './helpers/workbench';

let clients: Clients;
let workspaceId: string;
let project: ProjectJson;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
});
test.afterAll(() => disposeAll(clients));
test.beforeEach(async () => {
	project = await newProject(clients.analyst, workspaceId);
});

function withCapex(amount: number) {
	return { ...tidalInput, capex: { ...tidalInput.capex, lines: [{ ...tidalInput.capex.lines[0], amount }, ...tidalInput.capex.lines.slice(1)] } };
}

test.describe('scenarios API', () => {
	test('creates a scenario (the first is the base case), lists it, reads it with its document', async () => {
		const created = await newScenario(clients.analyst, project.id, { name: 'P50 case', notes: 'from survey' });
		expect(created).toMatchObject({ name: 'P50 case', notes: 'from survey', revision: 1, isBaseCase: true, projectId: project.id });
		expect(created.document).toMatchObject({ name: 'P50 case', technology: 'tidal-stream', hoursPerYear: 8760 });

		const list = await (await clients.viewer.get(`/api/v1/projects/${project.id}/scenarios`)).json();
		expect(list.scenarios.map((s: { id: string }) => s.id)).toEqual([created.id]);
		expect(list.scenarios[0]).not.toHaveProperty('document');

		const read = await clients.viewer.get(`/api/v1/scenarios/${created.id}`);
		expect(read.status()).toBe(200);
		const body = await read.json();
		expect(body).toMatchObject({ role: 'viewer', project: { id: project.id }, scenario: { id: created.id, revision: 1 } });
		expect(body.scenario.document.capex.lines).toHaveLength(2);
	});

	test('starts from the example document of the technology when none is sent', async () => {
		const created = await newScenario(clients.analyst, project.id, { name: 'From the example', document: undefined });
		expect(created.document).toMatchObject({ name: 'From the example', technology: 'tidal-stream', currency: project.currency });
	});

	test('saves with the revision being edited, and refuses a stale save with 409, writing nothing', async () => {
		const created = await newScenario(clients.analyst, project.id);
		const url = `/api/v1/scenarios/${created.id}`;

		const first = await clients.analyst.put(url, { data: { revision: 1, document: withCapex(4600) } });
		expect(first.status()).toBe(200);
		expect((await first.json()).scenario).toMatchObject({ revision: 2, updatedBy: { name: 'Tomas Vell' } });

		// The owner opened revision 1 too and saves after the analyst.
		const stale = await expectError(await clients.owner.put(url, { data: { revision: 1, document: withCapex(9999), notes: 'mine' } }), 409);
		expect(stale.error.message).toMatch(/you were editing revision 1, but revision 2 was saved by Tomas Vell/);
		expect(stale.error.message).toMatch(/Nothing was saved/);
		expect(stale.error.currentRevision).toBe(2);
		expect(issuePaths(stale)).toEqual(['revision']);

		const after = (await (await clients.viewer.get(url)).json()).scenario;
		expect(after).toMatchObject({ revision: 2, notes: '' });
		expect(after.document.capex.lines[0].amount).toBe(4600);
		const history = (await (await clients.viewer.get(`${url}/revisions`)).json()).revisions;
		expect(history.map((r: { revision: number }) => r.revision)).toEqual([2, 1]);

		const retried = await clients.owner.put(url, { data: { revision: 2, notes: 'mine' } });
		expect((await retried.json()).scenario).toMatchObject({ revision: 3, notes: 'mine' });
	});

	test('keeps a revision history: who changed which sections, and each revision document', async () => {
		const created = await newScenario(clients.analyst, project.id);
		const url = `/api/v1/scenarios/${created.id}`;
		await clients.analyst.put(url, { data: { revision: 1, document: { ...withCapex(4100), revenue: { ...tidalInput.revenue, tariffPerMWh: 260 } } } });
		await clients.owner.put(url, { data: { revision: 2, name: 'Renamed case' } });

		const history = (await (await clients.viewer.get(`${url}/revisions`)).json()).revisions;
		expect(history).toMatchObject([
			{ revision: 3, changedSections: ['name'], changedBy: { name: 'Isla Penrow' }, name: 'Renamed case' },
			{ revision: 2, changedSections: ['capex', 'revenue'], summary: 'Edited capex and revenue', changedBy: { name: 'Tomas Vell' } },
			{ revision: 1, summary: 'Created', changedBy: { name: 'Tomas Vell' } }
		]);
		const second = await (await clients.viewer.get(`${url}/revisions/2`)).json();
		expect(second.document.capex.lines[0].amount).toBe(4100);
		expect(second.document.name).toBe(created.name);
		await expectError(await clients.viewer.get(`${url}/revisions/9`), 404);
	});

	test('duplicates a scenario as a downside case, moves the base case, archives, restores and deletes', async () => {
		const base = await newScenario(clients.analyst, project.id, { name: 'Base' });
		const duplicated = await clients.analyst.post(`/api/v1/scenarios/${base.id}/duplicate`, { data: { name: 'Downside' } });
		expect(duplicated.status()).toBe(201);
		const downside = (await duplicated.json()).scenario;
		expect(downside).toMatchObject({ name: 'Downside', revision: 1, isBaseCase: false });
		expect(downside.document.capex).toEqual(base.document.capex);

		const copy = (await (await clients.analyst.post(`/api/v1/scenarios/${base.id}/duplicate`)).json()).scenario;
		expect(copy.name).toBe('Base (copy)');

		const marked = await clients.analyst.post(`/api/v1/scenarios/${downside.id}/base-case`);
		expect((await marked.json()).scenario.isBaseCase).toBe(true);
		const list = (await (await clients.viewer.get(`/api/v1/projects/${project.id}/scenarios`)).json()).scenarios;
		expect(list.filter((s: { isBaseCase: boolean }) => s.isBaseCase).map((s: { id: string }) => s.id)).toEqual([downside.id]);

		const archived = (await (await clients.analyst.post(`/api/v1/scenarios/${downside.id}/archive`)).json()).scenario;
		expect(archived).toMatchObject({ isBaseCase: false });
		expect(archived.archivedAt).not.toBeNull();
		const shelf = (await (await clients.viewer.get(`/api/v1/projects/${project.id}/scenarios?archived=1`)).json()).scenarios;
		expect(shelf.map((s: { id: string }) => s.id)).toEqual([downside.id]);

		const editArchived = await expectError(await clients.analyst.put(`/api/v1/scenarios/${downside.id}`, { data: { revision: 1, notes: 'x' } }), 409);
		expect(editArchived.error.message).toMatch(/archived: restore it/);
		await expectError(await clients.analyst.post(`/api/v1/scenarios/${downside.id}/base-case`), 409);

		const restored = (await (await clients.analyst.post(`/api/v1/scenarios/${downside.id}/restore`)).json()).scenario;
		expect(restored.archivedAt).toBeNull();

		const notArchived = await expectError(await clients.owner.delete(`/api/v1/scenarios/${copy.id}`), 409);
		expect(notArchived.error.message).toMatch(/Archive the scenario before deleting/);
		await clients.analyst.post(`/api/v1/scenarios/${copy.id}/archive`);
		await expectError(await clients.analyst.delete(`/api/v1/scenarios/${copy.id}`), 403);
		expect((await clients.owner.delete(`/api/v1/scenarios/${copy.id}`)).status()).toBe(204);
		await expectError(await clients.owner.get(`/api/v1/scenarios/${copy.id}`), 404);
	});

	test('refuses bad bodies with field paths inside the document', async () => {
		const url = `/api/v1/projects/${project.id}/scenarios`;
		const badDocument = {
			...tidalInput,
			device: { ...tidalInput.device, powerCoefficient: 0.7 },
			capex: { ...tidalInput.capex, lines: [{ name: 'Turbines', basis: 'per-kW', amount: -5 }] },
			timeline: { constructionYears: 2, operatingYears: 'twenty' }
		};
		const created = await expectError(await clients.analyst.post(url, { data: { name: 'Bad', document: badDocument } }), 422);
		expect(issuePaths(created)).toEqual(
			expect.arrayContaining(['document.device.powerCoefficient', 'document.capex.lines[0].amount', 'document.timeline.operatingYears'])
		);
		expect(created.error.issues.find((i) => i.path === 'document.device.powerCoefficient')!.message).toMatch(/Betz limit/);

		const wrongTechnology = await expectError(await clients.analyst.post(url, { data: { name: 'Wave here', document: waveInput } }), 422);
		expect(issuePaths(wrongTechnology)).toEqual(['document.technology']);

		const noName = await expectError(await clients.analyst.post(url, { data: { document: tidalInput, extra: 1 } }), 422);
		expect(issuePaths(noName).sort()).toEqual(['extra', 'name']);

		const scenario = await newScenario(clients.analyst, project.id);
		const put = `/api/v1/scenarios/${scenario.id}`;
		expect(issuePaths(await expectError(await clients.analyst.put(put, { data: { notes: 'x' } }), 422))).toEqual(['revision']);
		expect(issuePaths(await expectError(await clients.analyst.put(put, { data: { revision: 1 } }), 422))).toEqual(['(body)']);
		const badSave = await expectError(
			await clients.analyst.put(put, { data: { revision: 1, document: { ...tidalInput, array: { ...tidalInput.array, availability: 1.5 } } } }),
			422
		);
		expect(issuePaths(badSave)).toEqual(['document.array.availability']);
		expect((await (await clients.viewer.get(put)).json()).scenario.revision).toBe(1);
		await expectError(await clients.analyst.put(put, { headers: { 'content-type': 'application/json' }, data: Buffer.from('not json') }), 400);
	});

	test('refuses a misspelt key with its path and the key probably meant, on create, save and evaluate', async () => {
		const misspelt = { ...tidalInput, array: { ...tidalInput.array, availabilty: 0.5 } };
		const expected = [{ path: 'document.array.availabilty', message: '"availabilty" is not a field here; did you mean "availability"?' }];
		const created = await expectError(await clients.analyst.post(`/api/v1/projects/${project.id}/scenarios`, { data: { name: 'Typo', document: misspelt } }), 422);
		expect(created.error.issues).toEqual(expected);
		const scenario = await newScenario(clients.analyst, project.id);
		const saved = await expectError(await clients.analyst.put(`/api/v1/scenarios/${scenario.id}`, { data: { revision: 1, document: misspelt } }), 422);
		expect(saved.error.issues).toEqual(expected);
		const evaluated = await expectError(await clients.analyst.post(`/api/v1/scenarios/${scenario.id}/evaluate`, { data: { document: misspelt } }), 422);
		expect(evaluated.error.issues).toEqual(expected);
	});

	test('takes a version 1 document, saving it in the current version with the same meaning', async () => {
		const version1 = { ...tidalInput, schemaVersion: 1, decommissioning: { basis: 'percent-of-capex', amount: 0.05 } };
		const created = await newScenario(clients.analyst, project.id, { name: 'From version 1', document: version1 });
		expect(created.document.schemaVersion).toBe(SCHEMA_VERSION);
		expect(created.document.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		const newer = await expectError(
			await clients.analyst.post(`/api/v1/projects/${project.id}/scenarios`, { data: { name: 'From the future', document: { ...tidalInput, schemaVersion: SCHEMA_VERSION + 1 } } }),
			422
		);
		expect(issuePaths(newer)).toEqual(['document.schemaVersion']);
	});

	test('viewers cannot write, outsiders see nothing, anonymous callers must sign in', async () => {
		const scenario = await newScenario(clients.analyst, project.id);
		const writes = [
			(c: Clients[keyof Clients]) => c.post(`/api/v1/projects/${project.id}/scenarios`, { data: { name: 'X', document: tidalInput } }),
			(c: Clients[keyof Clients]) => c.put(`/api/v1/scenarios/${scenario.id}`, { data: { revision: 1, notes: 'x' } }),
			(c: Clients[keyof Clients]) => c.post(`/api/v1/scenarios/${scenario.id}/duplicate`),
			(c: Clients[keyof Clients]) => c.post(`/api/v1/scenarios/${scenario.id}/base-case`),
			(c: Clients[keyof Clients]) => c.post(`/api/v1/scenarios/${scenario.id}/archive`),
			(c: Clients[keyof Clients]) => c.post(`/api/v1/scenarios/${scenario.id}/restore`),
			(c: Clients[keyof Clients]) => c.delete(`/api/v1/scenarios/${scenario.id}`)
		];
		for (const write of writes) {
			await expectError(await write(clients.viewer), 403);
			await expectError(await write(clients.outsider), 404);
			await expectError(await write(clients.anonymous), 401);
		}
		for (const path of [`/api/v1/projects/${project.id}/scenarios`, `/api/v1/scenarios/${scenario.id}`, `/api/v1/scenarios/${scenario.id}/revisions`]) {
			await expectError(await clients.outsider.get(path), 404);
			await expectError(await clients.anonymous.get(path), 401);
		}
		const untouched = (await (await clients.viewer.get(`/api/v1/scenarios/${scenario.id}`)).json()).scenario;
		expect(untouched).toMatchObject({ revision: 1, notes: '', archivedAt: null });
	});
});
