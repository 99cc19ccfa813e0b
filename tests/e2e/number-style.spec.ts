/**
 * Figures in the reader's style: an owner sets the workspace's number and
 * date style, and the editor writes and reads figures that way; without a
 * setting a German browser gets German marks. A fresh account, so no other
 * spec's workspace changes style.
 */
import { expect, test } from '@playwright/test';
import { openPage } from './helpers/page';
import { signUpFreshAccount } from './helpers/session';

test('an owner chooses a decimal-comma style; the editor writes and reads figures in it, and the log says so', async ({ page }) => {
	test.setTimeout(90_000);
	const workspaceId = await signUpFreshAccount(page, { name: 'Maren Tolvik', workspace: 'Tolvik Tide Works' });
	await page.locator('body[data-hydrated="true"]').waitFor();
	await page.getByRole('region', { name: 'Start from an example' }).getByRole('button', { name: /Tidal stream/ }).click();
	await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
	const projectUrl = page.url();

	await page.getByRole('link', { name: 'Settings' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Settings of Tolvik Tide Works');
	await page.getByRole('radio', { name: /^German \(Germany\)/ }).check();
	await page.getByRole('button', { name: 'Save the style' }).click();
	await expect(page.getByRole('status')).toContainText('The number and date style is saved');

	await openPage(page, projectUrl);
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await page.locator('body[data-hydrated="true"]').waitFor();
	const availability = page.getByRole('spinbutton', { name: /^Availability/ });
	await expect(availability).toHaveValue(/^\d+,\d+$|^\d+$/);
	await availability.fill('87,5');
	await availability.blur();
	await expect(availability).toHaveValue('87,5');
	// Key results in the same marks: a decimal comma, never a decimal point.
	await expect(page.locator('[data-metric="lcoeReal"] dd').first()).toHaveText(/^\d{1,3}(\.\d{3})*,\d\d$/, { timeout: 45_000 });

	await openPage(page, `/app/w/${workspaceId}/audit`);
	await expect(page.getByRole('row', { name: /Changed a workspace setting/ })).toContainText("from each reader's own to German (Germany)");
});

test.describe('a German browser in a workspace without a style of its own', () => {
	test.use({ locale: 'de-DE' });

	test('reads figures with German marks', async ({ page }) => {
		test.setTimeout(90_000);
		await signUpFreshAccount(page, { name: 'Jorun Heddal', workspace: 'Heddal Wave Studies' });
		await page.locator('body[data-hydrated="true"]').waitFor();
		await page.getByRole('region', { name: 'Start from an example' }).getByRole('button', { name: /Wave/ }).click();
		await page.getByRole('link', { name: 'Base case', exact: true }).click();
		await expect(page.locator('[data-metric="lcoeReal"] dd').first()).toHaveText(/^\d{1,3}(\.\d{3})*,\d\d$/, { timeout: 45_000 });
	});
});
