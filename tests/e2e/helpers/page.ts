import type { Page } from '@playwright/test';

/** Opens a page and waits until Svelte has hydrated it, so typing is never lost to hydration. */
export async function openPage(page: Page, url: string) {
	await page.goto(url);
	await page.locator('body[data-hydrated="true"]').waitFor();
}
