/**
 * Never lose edits: with unsaved changes, reloading or closing the tab gets
 * the browser's own question and a link in the app asks first; staying keeps
 * the edit.
 */
import { expect, test } from '@playwright/test';
import { signInPage } from './helpers/session';

test('leaving an editor with unsaved changes asks first, and staying keeps them', async ({ page }) => {
	await signInPage(page, 'analyst');
	await page.getByRole('link', { name: 'Kestle Narrows Tidal Array' }).click();
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await page.locator('body[data-hydrated="true"]').waitFor();
	const availability = page.getByLabel('Availability', { exact: true });
	const saved = await availability.inputValue();
	// Typed as a user types (the browser asks before unloading only after the user has acted on the page).
	await availability.click();
	await availability.press('ArrowDown');
	const edited = await availability.inputValue();
	expect(edited).not.toBe(saved);
	await expect(page.getByText('Unsaved changes', { exact: true })).toBeVisible();

	// A link in the app: the confirm is answered "stay".
	const asked: string[] = [];
	page.on('dialog', (dialog) => {
		asked.push(dialog.type());
		void dialog.dismiss();
	});
	await page.getByRole('link', { name: 'Kestle Narrows Tidal Array' }).first().click();
	await expect.poll(() => asked).toContain('confirm');
	await expect(availability).toHaveValue(edited);

	// Reloading the tab: the browser's own question, answered "stay".
	await page.reload({ timeout: 3_000 }).catch(() => undefined);
	await expect.poll(() => asked).toContain('beforeunload');
	await expect(availability).toHaveValue(edited);
});
