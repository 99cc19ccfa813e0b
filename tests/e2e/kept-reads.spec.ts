/**
 * Kept reads (src/lib/server/db/cached-reads.ts): the app listens on the
 * database's change feed, a page seen before shows a change made by another
 * process once it is committed, and the analyst's own change shows at once,
 * on the page the form returns to and after a reload.
 */
import { expect, test } from '@playwright/test';
import { signInPage, workspaceIdOf } from './helpers/session';
import { DEMO_WORKSPACE, newProject, uniqueName } from './helpers/workbench';
import { queryTestDatabase } from './helpers/test-database';

test('the app listens on the change feed', async () => {
	const listening = await queryTestDatabase(`select 1 from pg_stat_activity where application_name = 'tidewright-change-feed' and query = 'LISTEN tidewright_changes'`);
	expect(listening.length).toBeGreaterThanOrEqual(1);
});

test("a project page seen before shows another process's rename, and the analyst's own rename at once", async ({ page }) => {
	await signInPage(page, 'analyst');
	const workspaceId = await workspaceIdOf(page.request, DEMO_WORKSPACE);
	const project = await newProject(page.request, workspaceId, { name: uniqueName('Kept page') });
	const path = `/app/w/${workspaceId}/projects/${project.id}`;
	await page.goto(path);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(project.name);
	await page.reload();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(project.name);

	const renamedElsewhere = `${project.name} (renamed by a script)`;
	await queryTestDatabase('update projects set name = $1 where id = $2', [renamedElsewhere, project.id]);
	await expect
		.poll(
			async () => {
				await page.reload();
				return page.getByRole('heading', { level: 1 }).textContent();
			},
			{ timeout: 5_000 }
		)
		.toBe(renamedElsewhere);

	const renamedHere = `${project.name} (renamed here)`;
	await page.getByRole('button', { name: `Rename ${renamedElsewhere}` }).click();
	await page.getByLabel('Project name').fill(renamedHere);
	await page.getByRole('button', { name: 'Save the name' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(renamedHere);
	await page.reload();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(renamedHere);
});
