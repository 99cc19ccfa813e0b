/**
 * A day's housekeeping in the browser, as the demo owner: compare two
 * revisions of a scenario input by input and restore one as a new revision
 * (after a question), rename a probe project, delete an archived scenario
 * (after a question naming it), ask to remove a member and think better of
 * it, and read the audit log filtered to what was done. The probe scenario
 * carries the document of a demo scenario, in a probe project of its own, so
 * the demo data stay as they were.
 */
import { expect, test, type Page } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { openPage } from './helpers/page';
import { newSignedInPage } from './helpers/session';
import { demoWorkspaceId, disposeAll, newProject, signInEveryone, uniqueName, type Clients, type ScenarioJson } from './helpers/workbench';

/** A folder for full-page pictures at 1400 and 390 px, to look at the layouts; none are taken without it. */
const SHOTS = process.env.HISTORY_SHOTS;

let clients: Clients;
let workspaceId: string;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
});
test.afterAll(() => disposeAll(clients));

/** The base case of the demo's tidal project, read as the API gives it. */
async function demoTidalBaseCase(): Promise<ScenarioJson> {
	const projects = (await (await clients.owner.get(`/api/v1/workspaces/${workspaceId}/projects`)).json()).projects as { id: string; technology: string }[];
	const tidal = projects.find((p) => p.technology === 'tidal-stream');
	if (!tidal) throw new Error('the demo workspace has a tidal project');
	const scenarios = (await (await clients.owner.get(`/api/v1/projects/${tidal.id}/scenarios`)).json()).scenarios as { id: string; isBaseCase: boolean }[];
	const base = scenarios.find((s) => s.isBaseCase) ?? scenarios[0];
	return (await (await clients.owner.get(`/api/v1/scenarios/${base.id}`)).json()).scenario;
}

async function save(scenarioId: string, revision: number, document: ScenarioJson['document']): Promise<number> {
	const response = await clients.owner.put(`/api/v1/scenarios/${scenarioId}`, { data: { revision, document } });
	expect(response.status(), await response.text()).toBe(200);
	return (await response.json()).scenario.revision;
}

async function screenshots(page: Page, name: string) {
	if (!SHOTS) return;
	for (const width of [1400, 390]) {
		await page.setViewportSize({ width, height: 900 });
		await page.screenshot({ path: `${SHOTS}/${name}-${width}.png`, fullPage: true });
	}
	await page.setViewportSize({ width: 1280, height: 720 });
}

test('compare and restore revisions, rename a project, delete an archived scenario, and find it all in the audit log', async ({ browser }) => {
	test.setTimeout(120_000);
	const demo = await demoTidalBaseCase();
	const project = await newProject(clients.owner, workspaceId, { name: uniqueName('History probe'), technology: 'tidal-stream' });
	const created = await clients.owner.post(`/api/v1/projects/${project.id}/scenarios`, { data: { name: 'Lender case', document: demo.document } });
	expect(created.status(), await created.text()).toBe(201);
	const scenario: ScenarioJson = (await created.json()).scenario;
	const availability = demo.document.array.availability as number;
	const contingency = demo.document.capex.contingency as number;
	// r2: lower availability; r3: more contingency on capex.
	const r2 = await save(scenario.id, 1, { ...demo.document, array: { ...demo.document.array, availability: availability - 0.02 } });
	await save(scenario.id, r2, { ...demo.document, array: { ...demo.document.array, availability: availability - 0.02 }, capex: { ...demo.document.capex, contingency: contingency + 0.05 } });

	const owner = await newSignedInPage(browser, 'owner');
	const projectPath = `/app/w/${workspaceId}/projects/${project.id}`;
	const historyPath = `${projectPath}/scenarios/${scenario.id}/history`;
	try {
		// The history: by default the current revision against the one before it.
		await openPage(owner, `${projectPath}/scenarios/${scenario.id}`);
		await owner.getByRole('link', { name: 'History', exact: true }).click();
		await expect(owner).toHaveURL(new RegExp(`${historyPath}$`));
		await expect(owner.getByRole('heading', { name: 'What changed from revision 2 to revision 3 (current)' })).toBeVisible();
		await expect(owner.getByRole('table', { name: /^Capital costs: revision 2 against revision 3$/ })).toContainText('Contingency');

		// Any two: the first against the current, chosen with the radio buttons.
		await owner.getByRole('radio', { name: 'Compare from revision 1' }).check();
		await owner.getByRole('radio', { name: 'Compare to revision 3' }).check();
		await owner.getByRole('button', { name: 'Show what changed' }).click();
		await expect(owner).toHaveURL(/[?&]from=1(&|$)/);
		expect(new URL(owner.url()).searchParams.get('to')).toBe('3');
		const losses = owner.getByRole('table', { name: 'Array, losses and uncertainty: revision 1 against revision 3' });
		const percent = (share: number) => String(Math.round(share * 1000) / 10);
		const availabilityRow = losses.getByRole('row', { name: /Availability/ });
		await expect(availabilityRow).toContainText(percent(availability));
		await expect(availabilityRow).toContainText(percent(availability - 0.02));
		await expect(owner.getByRole('table', { name: /^Capital costs: revision 1 against revision 3$/ })).toBeVisible();
		await screenshots(owner, 'history');

		// Restore revision 1: asked first, with the focus on the way out.
		await owner.getByRole('button', { name: 'Restore revision 1', exact: true }).first().click();
		const question = owner.getByRole('alertdialog', { name: 'Restore revision 1 of Lender case?' });
		await expect(question).toContainText('will be saved again as revision 4');
		await expect(question.getByRole('link', { name: 'Cancel' })).toBeFocused();
		await screenshots(owner, 'restore-question');
		await question.getByRole('button', { name: 'Restore revision 1 as a new revision' }).click();
		await expect(owner.getByRole('status').filter({ hasText: 'Revision 1 is restored as revision 4' })).toBeVisible();
		await expect(owner.getByRole('heading', { name: 'What changed from revision 3 to revision 4 (current)' })).toBeVisible();
		const restored = (await (await clients.owner.get(`/api/v1/scenarios/${scenario.id}`)).json()).scenario as ScenarioJson;
		expect(restored.revision).toBe(4);
		expect(restored.document.array.availability).toBe(availability);
		expect(restored.document.capex.contingency).toBe(contingency);

		// Rename the probe project from its page.
		const newName = uniqueName('History probe renamed');
		await openPage(owner, projectPath);
		await owner.getByRole('button', { name: `Rename ${project.name}` }).click();
		await owner.getByLabel('Project name').fill(newName);
		await owner.getByRole('button', { name: 'Save the name' }).click();
		await expect(owner.getByRole('heading', { level: 1, name: newName })).toBeVisible();
		await expect(owner.getByRole('status').filter({ hasText: `now called ${newName}` })).toBeVisible();

		// Delete an archived scenario: the page names it and asks first.
		const doomed = await clients.owner.post(`/api/v1/projects/${project.id}/scenarios`, { data: { name: 'Doomed case' } });
		expect(doomed.status()).toBe(201);
		const doomedId = (await doomed.json()).scenario.id as string;
		expect((await clients.owner.post(`/api/v1/scenarios/${doomedId}/archive`)).status()).toBe(200);
		await openPage(owner, projectPath);
		await owner.getByRole('button', { name: 'Show archived scenarios' }).click();
		const archived = owner.getByRole('list', { name: 'Archived scenarios' });
		await archived.getByRole('button', { name: 'Delete Doomed case', exact: true }).click();
		const deletion = owner.getByRole('alertdialog', { name: 'Delete Doomed case for good?' });
		await expect(deletion).toContainText('cannot be undone');
		await screenshots(owner, 'delete-question');
		await deletion.getByRole('button', { name: 'Delete Doomed case for good' }).click();
		await expect(owner.getByRole('status').filter({ hasText: 'Doomed case is deleted for good' })).toBeVisible();
		await expect(owner.getByRole('list', { name: 'Archived scenarios' }).or(owner.getByText('No archived scenarios.'))).not.toContainText('Doomed case');
		expect((await clients.owner.get(`/api/v1/scenarios/${doomedId}`)).status()).toBe(404);

		// Removing a member asks first; Escape leaves everything as it was.
		await openPage(owner, `/app/w/${workspaceId}/members`);
		await owner.getByRole('button', { name: 'Remove Ada Quill', exact: true }).click();
		const removal = owner.getByRole('alertdialog', { name: 'Remove Ada Quill?' });
		await expect(removal).toContainText('ada.quill@halvard-marine.example');
		await expect(removal.getByRole('link', { name: 'Cancel' })).toBeFocused();
		await owner.keyboard.press('Escape');
		await expect(removal).toHaveCount(0);
		await expect(owner.getByRole('cell', { name: 'ada.quill@halvard-marine.example', exact: true })).toBeVisible();

		// The audit log, filtered to the owner's work on projects and scenarios from today.
		await openPage(owner, `/app/w/${workspaceId}/audit`);
		await owner.getByLabel('Kind of event').selectOption({ label: 'Projects and scenarios' });
		await owner.getByLabel('Done by').selectOption({ label: 'Isla Penrow' });
		await owner.getByLabel('From (day, UTC)').fill(new Date().toISOString().slice(0, 10));
		await owner.getByRole('button', { name: 'Filter' }).click();
		await expect(owner).toHaveURL(/group=work&person=[0-9a-f-]{36}&from=\d{4}-\d{2}-\d{2}/);
		const log = owner.getByRole('table', { name: 'Security events' });
		await expect(log.getByRole('row').filter({ hasText: 'Restored an earlier revision' }).first()).toContainText('revision 1 saved again as revision 4');
		await expect(log.getByRole('row').filter({ hasText: 'Renamed a project' }).first()).toContainText(newName);
		await expect(log.getByRole('row').filter({ hasText: 'Deleted a scenario for good' }).first()).toContainText('"Doomed case"');
		await expect(log.getByRole('row').filter({ hasText: 'Saved a scenario' }).first()).toContainText('Isla Penrow');
		await expect(log).not.toContainText('Signed in');
		await screenshots(owner, 'audit');
	} finally {
		await owner.context().close();
		// Archived, the probe leaves the demo workspace's project list as it was.
		await clients.owner.delete(`/api/v1/projects/${project.id}`);
	}
});
