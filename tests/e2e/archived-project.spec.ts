/**
 * An archived project in the browser: shown read only (no new scenario, no
 * upload, no scenario actions, the editor read only), with a restore button
 * for owners only; restoring makes it editable again.
 */
import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { openPage } from './helpers/page';
import { newSignedInPage } from './helpers/session';
import { demoWorkspaceId, disposeAll, expectError, newProject, newScenario, signInEveryone, type Clients } from './helpers/workbench';

let clients: Clients;
let workspaceId: string;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
});
test.afterAll(() => disposeAll(clients));

test('an archived project is read only until an owner restores it from its page', async ({ browser }) => {
	const project = await newProject(clients.analyst, workspaceId);
	const scenario = await newScenario(clients.analyst, project.id);
	expect((await clients.owner.delete(`/api/v1/projects/${project.id}`)).status()).toBe(200);
	const refused = await expectError(await clients.analyst.patch(`/api/v1/projects/${project.id}`, { data: { name: 'Renamed' } }), 409);
	expect(refused.error.message).toBe('This project is archived: restore it first.');

	const projectPath = `/app/w/${workspaceId}/projects/${project.id}`;
	const analyst = await newSignedInPage(browser, 'analyst');
	try {
		await openPage(analyst, projectPath);
		const note = analyst.getByRole('note', { name: 'Archived project' });
		await expect(note).toContainText('read only');
		await expect(note).toContainText('An owner of the workspace can restore it.');
		await expect(analyst.getByRole('button', { name: 'Restore project' })).toHaveCount(0);
		await expect(analyst.getByRole('button', { name: 'New scenario' })).toHaveCount(0);
		await expect(analyst.getByRole('button', { name: `Archive ${scenario.name}` })).toHaveCount(0);

		await openPage(analyst, `${projectPath}/scenarios/${scenario.id}`);
		await expect(analyst.getByText('This project is archived, so its scenarios are shown read only.')).toBeVisible();
		await expect(analyst.getByRole('button', { name: 'Save' })).toHaveCount(0);
		await expect(analyst.getByRole('button', { name: 'Duplicate…' })).toHaveCount(0);
	} finally {
		await analyst.context().close();
	}

	const owner = await newSignedInPage(browser, 'owner');
	try {
		await openPage(owner, projectPath);
		await owner.getByRole('button', { name: 'Restore project' }).click();
		await expect(owner.getByRole('status').filter({ hasText: 'is restored and can be edited again' })).toBeVisible();
		await expect(owner.getByRole('note', { name: 'Archived project' })).toHaveCount(0);
		await expect(owner.getByRole('button', { name: 'New scenario' })).toBeVisible();
	} finally {
		await owner.context().close();
	}
	expect((await clients.analyst.patch(`/api/v1/projects/${project.id}`, { data: { name: `${project.name} II` } })).status()).toBe(200);
});
