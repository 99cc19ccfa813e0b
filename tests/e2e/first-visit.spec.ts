/**
 * A first visit that leads somewhere: a new account's empty workspace offers
 * an example project per technology, and one click gives a project with a
 * worked base case and its figures.
 */
import { expect, test } from '@playwright/test';
import { signUpFreshAccount } from './helpers/session';

test('an empty workspace starts from an example of each technology', async ({ page }) => {
	test.setTimeout(90_000);
	await signUpFreshAccount(page, { name: 'Ilse Varro', workspace: 'Varro Marine Studies' });
	await page.locator('body[data-hydrated="true"]').waitFor();
	const offer = page.getByRole('region', { name: 'Start from an example' });
	await expect(offer).toBeVisible();
	await expect(offer.getByRole('button')).toHaveCount(3);
	await offer.getByRole('button', { name: /Tidal stream/ }).click();

	// The project page of the new project, with the example's base case in it.
	await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1 })).toContainText('(example)');
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await expect(page.getByLabel('Scenario name')).toHaveValue('Base case');
	await expect(page.locator('[data-metric="lcoeReal"] dd').first()).toHaveText(/^\d[\d,]*\.\d\d$/, { timeout: 20_000 });
});
