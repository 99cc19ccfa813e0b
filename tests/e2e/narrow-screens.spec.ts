/**
 * At 390 px wide: the editor keeps its key results in view, and the editor,
 * project, compare and sensitivity pages never scroll sideways (wide tables
 * scroll inside themselves, and those scroll boxes can be reached by
 * keyboard: no serious axe finding on the compare and sensitivity pages at
 * this width). Screenshots go to tests/.artifacts for a look.
 */
import { mkdirSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { graveAxeFindings } from './helpers/axe';
import { signInPage } from './helpers/session';

test.use({ viewport: { width: 390, height: 844 } });

async function noSidewaysScroll(page: Page, name: string) {
	await page.locator('body[data-hydrated="true"]').waitFor();
	// Tables and charts that arrive after hydration (the tornado, the compared metrics) are measured too.
	await page.waitForLoadState('networkidle');
	mkdirSync('tests/.artifacts', { recursive: true });
	await page.screenshot({ path: `tests/.artifacts/narrow-${name}.png`, fullPage: false });
	const widths = await page.evaluate(() => ({ page: document.scrollingElement!.scrollWidth, window: window.innerWidth }));
	expect(widths.page, `${name} is ${widths.page} px wide in a ${widths.window} px window`).toBeLessThanOrEqual(widths.window);
}

test('the editor keeps its key results in view, and no page scrolls sideways', async ({ page }) => {
	test.setTimeout(90_000);
	await signInPage(page, 'analyst');
	await page.getByRole('link', { name: 'Kestle Narrows Tidal Array' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Kestle Narrows Tidal Array' })).toBeVisible();
	const projectUrl = page.url();
	await noSidewaysScroll(page, 'project');

	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	const bar = page.getByRole('region', { name: 'Key results' });
	await expect(bar).toBeVisible();
	await expect(bar).toContainText(/LCOE, real\s*\d[\d,]*\.\d\d/);
	// Still in view after scrolling deep into the fields.
	await page.mouse.wheel(0, 4000);
	await expect(bar).toBeInViewport();
	await noSidewaysScroll(page, 'editor');
	const editorUrl = page.url();

	await page.goto(`${editorUrl}/sensitivity`);
	await expect(page.getByRole('heading', { level: 1 })).toContainText('Sensitivity');
	await noSidewaysScroll(page, 'sensitivity');
	expect(await graveAxeFindings(page), 'serious or critical axe findings on the sensitivity page at 390 px').toEqual([]);

	await page.goto(`${projectUrl}/compare`);
	await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
	await noSidewaysScroll(page, 'compare');
	expect(await graveAxeFindings(page), 'serious or critical axe findings on the compare page at 390 px').toEqual([]);
});
