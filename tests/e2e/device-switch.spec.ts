/**
 * A change of device explains itself: switching the Kestle Narrows base case
 * from its rotor to a power curve keeps the rated power, says what the
 * installed capacity was and is, draws the new curve, and Undo puts the rotor
 * back exactly (the editor then has no unsaved changes).
 */
import { expect, test } from '@playwright/test';
import { signInPage } from './helpers/session';

// Tall enough for the notice and the chart in one screenshot.
test.use({ viewport: { width: 1280, height: 1100 } });

test('switching rotor to power curve says what changed, draws the curve, and can be undone', async ({ page }) => {
	await signInPage(page, 'analyst');
	await page.getByRole('link', { name: 'Kestle Narrows Tidal Array' }).click();
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await page.locator('body[data-hydrated="true"]').waitFor();

	const section = page.locator('#device-and-array');
	const kind = section.getByLabel('Device given as');
	const rotorFields = ['Rotor diameter', 'Power coefficient', 'Drive-train efficiency', 'Rated power', 'Cut-in speed', 'Cut-out speed'];
	const before = await Promise.all(rotorFields.map((label) => section.getByLabel(label, { exact: true }).inputValue()));
	expect(before[0]).toBe('20');

	await kind.selectOption({ label: 'Measured power curve' });
	const notice = section.getByRole('region', { name: 'Device switched' });
	// The example's 10 devices of 1,500 kW: the rated power carries over, so the capacity stays.
	await expect(notice).toContainText('Installed capacity 15 MW (10 × 1.5 MW) → 15 MW (10 × 1.5 MW), unchanged.');
	await expect(notice).toContainText('Carried over: rated power 1.5 MW per device.');
	await expect(notice).toContainText('18 points from 0.7 to 4.5 m/s');
	await expect(section.getByRole('img', { name: /^Power curve of one device/ })).toBeVisible();
	await expect(section.getByText('Power curve points (18)')).toBeVisible();
	await expect(page.getByText('Unsaved changes', { exact: true })).toBeVisible();
	await section.evaluate((element) => element.scrollIntoView({ block: 'start' }));
	await page.screenshot({ path: '/tmp/device-switch.png' });

	await notice.getByRole('button', { name: 'Undo' }).click();
	await expect(kind).toHaveValue('rotor');
	await expect(notice).toBeHidden();
	const after = await Promise.all(rotorFields.map((label) => section.getByLabel(label, { exact: true }).inputValue()));
	expect(after).toEqual(before);
	// The document is the saved one again.
	await expect(page.getByText('All changes saved', { exact: true })).toBeVisible();
});
