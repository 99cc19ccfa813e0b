import { signInPage } from './helpers/session';
import { expect, test } from '@playwright/test';

test('the home page says what Tidewright is and leads to the workbench', async ({ page }) => {
	await page.goto('/');
	await expect(page.getByRole('heading', { level: 1 })).toContainText('resource to return');
	await expect(page.getByLabel('Cautions')).toContainText('not investment advice');
	// A first visit leads to an account of one's own.
	await page.getByRole('link', { name: 'Create a free account' }).click();
	await expect(page).toHaveURL(/\/signup$/);
	await page.goBack();
	await page.getByRole('link', { name: /Open the workbench/ }).click();
	await expect(page).toHaveURL(/\/signin/);
});

test('the workbench asks for sign-in, then lists the demo projects fetched from the API', async ({ page }) => {
	await page.goto('/app');
	await expect(page).toHaveURL(/\/signin\?next=%2Fapp/);
	const apiCall = page.waitForResponse((r) => /\/api\/v1\/workspaces\/[^/]+\/projects(\?|$)/.test(r.url()) && r.status() === 200);
	await signInPage(page, 'viewer');
	await apiCall;
	const projects = page.getByRole('list', { name: 'Projects' });
	await expect(projects.getByRole('heading', { name: 'Kestle Narrows Tidal Array' })).toBeVisible();
	await expect(projects.getByRole('heading', { name: 'Orrin Bank Wave Farm' })).toBeVisible();
});

test('health answers JSON with the database state', async ({ request }) => {
	const response = await request.get('/api/v1/health');
	expect(response.status()).toBe(200);
	expect(await response.json()).toEqual({ status: 'ok', db: 'ok' });
});
