/**
 * Keyboard basics on every signed-in page: the skip link comes first and
 * moves focus to the content, every focused control shows a focus ring in the
 * palette's copper, and the workspace switcher switches on choice.
 */
import { expect, test } from '@playwright/test';
import { signInPage } from './helpers/session';

test('the skip link, the focus ring and the workspace switcher', async ({ page }) => {
	await signInPage(page, 'consultant');
	await page.locator('body[data-hydrated="true"]').waitFor();

	// The first Tab lands on the skip link, shown while focused; Enter moves focus into the main content.
	await page.keyboard.press('Tab');
	const skip = page.getByRole('link', { name: 'Skip to the content' });
	await expect(skip).toBeFocused();
	await expect(skip).toBeVisible();
	await page.keyboard.press('Enter');
	await expect(page.locator('main#main')).toBeFocused();

	// A focused button draws a 2 px solid outline in copper-600 (#a94e2a).
	await page.getByRole('button', { name: 'Sign out' }).focus();
	await page.keyboard.press('Shift+Tab');
	await page.keyboard.press('Tab');
	// Buttons ease their colours, the outline's too: read the ring once the easing is over.
	const signOut = page.getByRole('button', { name: 'Sign out' });
	const ring = () =>
		signOut.evaluate((el) => {
			const style = getComputedStyle(el);
			return { style: style.outlineStyle, width: style.outlineWidth, colour: style.outlineColor };
		});
	await expect.poll(ring).toEqual({ style: 'solid', width: '2px', colour: 'rgb(169, 78, 42)' });

	// The consultant works in two workspaces: choosing the other one switches at once, no button press.
	const switcher = page.getByRole('combobox', { name: 'Workspace' });
	const before = page.url();
	const other = await switcher.locator('option:not(:checked)').first().getAttribute('value');
	await switcher.selectOption(other!);
	await expect(page).toHaveURL(new RegExp(`/app/w/${other}`));
	expect(page.url()).not.toBe(before);
});
