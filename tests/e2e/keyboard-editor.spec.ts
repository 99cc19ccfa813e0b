/**
 * A keyboard-only pass through the scenario editor: the section jump list is
 * a few Tab presses from the top, a jump lands in its section, the arrow keys
 * step a percentage by a tenth of a per cent, Ctrl+S saves, and the results
 * are one jump away. A fresh account, so no other spec's scenario changes.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import { signUpFreshAccount } from './helpers/session';

/** Presses Tab until `target` has focus; fails after `most` presses. Returns how many it took. */
async function tabTo(page: Page, target: Locator, most: number): Promise<number> {
	for (let presses = 1; presses <= most; presses++) {
		await page.keyboard.press('Tab');
		if (await target.evaluate((el) => el === document.activeElement)) return presses;
	}
	throw new Error(`not reached in ${most} Tab presses`);
}

test('from the top of the editor to a saved change and the results, by keyboard alone', async ({ page }) => {
	test.setTimeout(90_000);
	await signUpFreshAccount(page, { name: 'Odile Farrant', workspace: 'Farrant Current Studies' });
	await page.locator('body[data-hydrated="true"]').waitFor();
	await page.getByRole('region', { name: 'Start from an example' }).getByRole('button', { name: /Tidal stream/ }).click();
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await expect(page.getByLabel('Scenario name')).toHaveValue('Base case');
	await page.locator('body[data-hydrated="true"]').waitFor();

	const sections = page.getByRole('navigation', { name: 'Scenario sections' });
	await page.locator('body').focus();
	await tabTo(page, sections.getByRole('link', { name: 'Losses' }), 30);
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/#losses$/);

	const availability = page.getByRole('spinbutton', { name: /^Availability/ });
	await tabTo(page, availability, 10);
	const before = Number(await availability.getAttribute('aria-valuenow'));
	await page.keyboard.press('ArrowUp');
	// One press is a tenth of a per cent (common practice for spin buttons: a step that fits the field).
	await expect(availability).toHaveAttribute('aria-valuenow', String(Math.round((before + 0.1) * 10) / 10));
	await page.keyboard.press('Control+s');
	await expect(page.getByRole('status').filter({ hasText: 'Saved as revision 2' })).toBeVisible();

	// From the top of the page again (a reload, as F5 would), the results are a jump away too.
	await page.reload();
	await page.locator('body[data-hydrated="true"]').waitFor();
	await tabTo(page, sections.getByRole('link', { name: 'Results' }), 40);
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/#results-panel$/);
	await expect(page.getByRole('region', { name: 'Results' })).toBeInViewport();
});
