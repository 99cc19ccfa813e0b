/**
 * Never lose edits, with two people on one scenario: the analyst saves a
 * change while the owner is still editing; the owner's save is refused, and
 * instead of a choice between their edits and the analyst's the owner sees
 * what the analyst changed, in words, chooses the clashing field's value,
 * puts the other edit on top and saves. The saved revision holds both. The
 * scenario sits in a probe project of its own, so the demo data stay as
 * they were.
 */
import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { openPage } from './helpers/page';
import { newSignedInPage } from './helpers/session';
import { demoWorkspaceId, disposeAll, newProject, newScenario, signInEveryone, uniqueName, type Clients, type ScenarioJson } from './helpers/workbench';

/** Where to keep a picture of the conflict panel, to look at it; none is taken without it. */
const SHOT = process.env.SAVE_CONFLICT_SHOT;

let clients: Clients;
let workspaceId: string;

test.beforeAll(async ({ playwright }) => {
	clients = await signInEveryone(playwright, baseURL);
	workspaceId = await demoWorkspaceId(clients);
});
test.afterAll(() => disposeAll(clients));

test('a save that meets another save shows their changes, keeps the edits and puts them on top', async ({ browser }) => {
	test.setTimeout(90_000);
	const project = await newProject(clients.owner, workspaceId, { name: uniqueName('Conflict probe') });
	// The fixture's availability is 95 % and its contingency 10 % (tests/fixtures/scenario-documents.ts).
	const scenario = await newScenario(clients.owner, project.id, { name: 'Shared case' });
	const scenarioPath = `/app/w/${workspaceId}/projects/${project.id}/scenarios/${scenario.id}`;

	const analyst = await newSignedInPage(browser, 'analyst');
	const owner = await newSignedInPage(browser, 'owner');
	try {
		await openPage(analyst, scenarioPath);
		await openPage(owner, scenarioPath);

		// The analyst saves first: availability down to 90 %.
		await analyst.getByLabel('Availability', { exact: true }).fill('90');
		await analyst.getByRole('button', { name: 'Save', exact: true }).click();
		await expect(analyst.getByRole('status').filter({ hasText: 'Saved as revision 2.' })).toBeVisible();

		// The owner, still on revision 1, changes contingency and availability, and saves.
		await owner.getByLabel('Contingency', { exact: true }).fill('15');
		await owner.getByLabel('Availability', { exact: true }).fill('93');
		await owner.getByRole('button', { name: 'Save', exact: true }).click();

		const panel = owner.getByRole('region', { name: 'Someone else saved this scenario while you were editing' });
		await expect(panel).toBeVisible();
		await expect(panel).toContainText('Tomas Vell saved revision 2');
		const theirChange = panel.getByRole('row', { name: /^Availability/ });
		await expect(theirChange).toContainText('95 %');
		await expect(theirChange).toContainText('90 %');
		// Until the owner chooses, the draft stays as typed.
		await expect(owner.getByLabel('Availability', { exact: true })).toHaveValue('93');
		await expect(owner.getByLabel('Contingency', { exact: true })).toHaveValue('15');
		await expect(owner.getByRole('button', { name: 'Save', exact: true })).toBeDisabled();

		const clash = panel.getByRole('group', { name: /^Availability/ });
		await expect(clash.getByRole('radio', { name: 'Keep yours: 93 %' })).toBeChecked();
		const mine = panel.getByRole('list').filter({ has: owner.getByRole('listitem') });
		await expect(panel.getByRole('heading', { name: 'Your other edit goes on top as typed' })).toBeVisible();
		await expect(mine.getByRole('listitem').filter({ hasText: /^Contingency/ })).toContainText('10 % → 15 %');
		if (SHOT) {
			await panel.screenshot({ path: SHOT });
			await owner.setViewportSize({ width: 390, height: 900 });
			await panel.screenshot({ path: SHOT.replace(/\.png$/, '-narrow.png') });
			await owner.setViewportSize({ width: 1280, height: 720 });
		}

		await clash.getByRole('radio', { name: 'Take theirs: 90 %' }).check();
		await panel.getByRole('button', { name: 'Apply my edits on top of revision 2' }).click();
		await expect(panel).toBeHidden();
		await expect(owner.getByRole('status').filter({ hasText: 'Your edits now sit on top of revision 2' })).toBeVisible();
		await expect(owner.getByLabel('Availability', { exact: true })).toHaveValue('90');
		await expect(owner.getByLabel('Contingency', { exact: true })).toHaveValue('15');
		await expect(owner.getByText(/^Revision 2 · saved/)).toBeVisible();

		await owner.getByRole('button', { name: 'Save', exact: true }).click();
		await expect(owner.getByRole('status').filter({ hasText: 'Saved as revision 3.' })).toBeVisible();
		const stored = (await (await clients.owner.get(`/api/v1/scenarios/${scenario.id}`)).json()).scenario as ScenarioJson;
		expect(stored.revision).toBe(3);
		expect(stored.document.array.availability).toBe(0.9);
		expect(stored.document.capex.contingency).toBe(0.15);
	} finally {
		await analyst.context().close();
		await owner.context().close();
	}
});
