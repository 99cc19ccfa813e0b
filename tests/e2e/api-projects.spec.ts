import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { demoWorkspaceId, disposeAll, expectError, issuePaths, newProject, signInEveryone, uniqueName, type Clients } from './helpers/workbench';

let clients: Clients;
let workspaceId: string;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
});
test.afterAll(() => disposeAll(clients));

test.describe('projects API', () => {
	test('lists the demo projects to every member', async () => {
		for (const persona of ['owner', 'analyst', 'viewer'] as const) {
			const response = await clients[persona].get(`/api/v1/workspaces/${workspaceId}/projects`);
			expect(response.status()).toBe(200);
			const body = await response.json();
			expect(body.workspace).toMatchObject({ id: workspaceId, name: 'Halvard Marine Energy', role: persona });
			const names = body.projects.map((p: { name: string }) => p.name);
			for (const demo of demoProjects) expect(names).toContain(demo.name);
		}
	});

	test('an analyst creates, reads and edits a project; the technology stays fixed', async () => {
		const name = uniqueName('Skerry Sound');
		const created = await newProject(clients.analyst, workspaceId, {
			name,
			technology: 'wave',
			siteName: 'Skerry Sound',
			siteDescription: 'Exposed shelf, 50 m deep',
			currency: 'GBP'
		});
		expect(created).toMatchObject({ name, technology: 'wave', currency: 'GBP', archivedAt: null });

		const read = await clients.viewer.get(`/api/v1/projects/${created.id}`);
		expect(read.status()).toBe(200);
		expect((await read.json()).project).toMatchObject({ id: created.id, siteDescription: 'Exposed shelf, 50 m deep' });

		const patched = await clients.analyst.patch(`/api/v1/projects/${created.id}`, { data: { name: `${name} II`, currency: 'EUR' } });
		expect(patched.status()).toBe(200);
		expect((await patched.json()).project).toMatchObject({ name: `${name} II`, currency: 'EUR', technology: 'wave' });

		const technology = await expectError(await clients.analyst.patch(`/api/v1/projects/${created.id}`, { data: { technology: 'tidal-stream' } }), 422);
		expect(issuePaths(technology)).toEqual(['technology']);
	});

	test('an owner archives a project and restores it', async () => {
		const project = await newProject(clients.analyst, workspaceId);
		const archived = await clients.owner.delete(`/api/v1/projects/${project.id}`);
		expect(archived.status()).toBe(200);
		expect((await archived.json()).project.archivedAt).not.toBeNull();

		const live = await (await clients.viewer.get(`/api/v1/workspaces/${workspaceId}/projects`)).json();
		expect(live.projects.map((p: { id: string }) => p.id)).not.toContain(project.id);
		const shelved = await (await clients.viewer.get(`/api/v1/workspaces/${workspaceId}/projects?archived=1`)).json();
		expect(shelved.projects.map((p: { id: string }) => p.id)).toContain(project.id);

		const restored = await clients.owner.post(`/api/v1/projects/${project.id}/restore`);
		expect((await restored.json()).project.archivedAt).toBeNull();
	});

	test('refuses bad bodies with the field paths', async () => {
		const url = `/api/v1/workspaces/${workspaceId}/projects`;
		const missing = await expectError(await clients.analyst.post(url, { data: { siteName: 'x' } }), 422);
		expect(issuePaths(missing).sort()).toEqual(['name', 'technology']);

		const wrong = await expectError(
			await clients.analyst.post(url, { data: { name: 'Dam', technology: 'hydro', currency: 'euro', colour: 'blue' } }),
			422
		);
		expect(issuePaths(wrong).sort()).toEqual(['colour', 'currency', 'technology']);
		expect(wrong.error.issues.find((i) => i.path === 'currency')!.message).toMatch(/three-letter code/);

		const notJson = await expectError(
			await clients.analyst.post(url, { headers: { 'content-type': 'application/json' }, data: Buffer.from('{"name": ') }),
			400
		);
		expect(notJson.error.message).toMatch(/not valid JSON/);

		const empty = await expectError(await clients.analyst.patch(`/api/v1/projects/${(await newProject(clients.analyst, workspaceId)).id}`, { data: {} }), 422);
		expect(empty.error.issues[0].message).toMatch(/nothing to change/);
	});

	test('viewers cannot write, outsiders see nothing, anonymous callers must sign in', async () => {
		const project = await newProject(clients.analyst, workspaceId);
		const create = { data: { name: 'X', technology: 'wave' } };

		expect((await expectError(await clients.viewer.post(`/api/v1/workspaces/${workspaceId}/projects`, create), 403)).error.message).toMatch(/analyst role/);
		await expectError(await clients.viewer.patch(`/api/v1/projects/${project.id}`, { data: { name: 'Y' } }), 403);
		await expectError(await clients.analyst.delete(`/api/v1/projects/${project.id}`), 403);

		await expectError(await clients.outsider.get(`/api/v1/workspaces/${workspaceId}/projects`), 404);
		await expectError(await clients.outsider.get(`/api/v1/projects/${project.id}`), 404);
		await expectError(await clients.outsider.patch(`/api/v1/projects/${project.id}`, { data: { name: 'Y' } }), 404);
		await expectError(await clients.outsider.delete(`/api/v1/projects/${project.id}`), 404);

		await expectError(await clients.anonymous.get(`/api/v1/projects/${project.id}`), 401);
		await expectError(await clients.anonymous.post(`/api/v1/workspaces/${workspaceId}/projects`, create), 401);

		// A project that does not exist and one that is someone else's answer alike.
		const none = await expectError(await clients.analyst.get('/api/v1/projects/00000000-0000-4000-8000-000000000000'), 404);
		const theirs = await expectError(await clients.outsider.get(`/api/v1/projects/${project.id}`), 404);
		expect(none.error.message).toBe(theirs.error.message);
		await expectError(await clients.analyst.get('/api/v1/projects/not-a-uuid'), 404);
	});
});
