/**
 * The consultant's portfolio in Chromium, on the demo seed's Corvane Advisory
 * (seeds/04_consultant_portfolio.ts: five client projects, one archived, one
 * in USD, every base case with stored results): the owner opens the
 * workspace's portfolio, sorts by LCOE both ways, filters by technology, sees
 * the chart drawn and downloads the CSV of exactly the rows shown; the
 * consultant sees both her workspaces side by side; the owner of Corvane sees
 * nothing of Halvard's. Screenshots go to tests/.artifacts/.
 */
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import Papa from 'papaparse';
import { consultantProjects } from '../../seeds/04_consultant_portfolio';
import { demoWorkspace } from '../../seeds/01_demo_workspace';
import { otherWorkspace } from '../../seeds/02_demo_users';
import { signInPage } from './helpers/session';

const artifacts = 'tests/.artifacts';
const lcoeHeading = (page: Page) => page.locator('th:has(a[data-sort="lcoeReal"])');

/** Each body row's project name, technology, currency and LCOE (the cell's exact value, for comparing). */
async function shownRows(page: Page) {
	const rows = page.getByRole('table', { name: 'Portfolio' }).locator('tbody tr');
	return rows.evaluateAll((trs) =>
		trs.map((tr) => {
			const lcoe = tr.querySelector('td[data-figure="lcoeReal"]');
			return {
				name: tr.getAttribute('data-project') ?? '',
				technology: tr.querySelectorAll('td')[0]?.textContent?.trim() ?? '',
				currency: lcoe?.querySelector('span')?.textContent?.trim() ?? null,
				lcoe: lcoe?.getAttribute('data-value') ? Number(lcoe.getAttribute('data-value')) : null
			};
		})
	);
}

/** Within each currency the LCOE runs the given way; each currency's rows stand together. */
function expectOrderedWithinCurrency(rows: { currency: string | null; lcoe: number | null }[], dir: 'asc' | 'desc') {
	const currencies = rows.map((r) => r.currency);
	const runs = currencies.filter((c, i) => i === 0 || c !== currencies[i - 1]);
	expect(new Set(runs).size, 'each currency in one run').toBe(runs.length);
	for (let i = 1; i < rows.length; i++) {
		if (rows[i].currency !== rows[i - 1].currency) continue;
		const [a, b] = [rows[i - 1].lcoe!, rows[i].lcoe!];
		expect(dir === 'asc' ? a <= b : a >= b, `${a} then ${b} (${dir})`).toBe(true);
	}
}

test.describe('portfolio', () => {
	test('the consultancy owner sorts by LCOE, filters by technology, sees the chart and downloads the CSV of the rows shown', async ({ page }) => {
		await signInPage(page, 'outsider');
		await page.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Portfolio' }).click();
		await expect(page).toHaveURL(/\/app\/w\/[0-9a-f-]{36}\/portfolio$/);
		await page.locator('body[data-hydrated="true"]').waitFor();
		await expect(page.getByRole('heading', { level: 1, name: 'Portfolio' })).toBeVisible();
		await expect(page.getByTestId('portfolio-counts')).toContainText(`${consultantProjects.length} projects, ${consultantProjects.length} with results`);
		await expect(page.getByRole('complementary', { name: 'Cautions' })).toBeVisible();
		// One workspace: no workspace column.
		await expect(page.getByRole('columnheader', { name: /^Workspace/ })).toHaveCount(0);
		const archived = consultantProjects.find((p) => p.archived)!;
		await expect(page.locator(`tr[data-project="${archived.name}"]`)).toContainText('Archived');

		// Sort by LCOE: a link, so the order lives in the address.
		await page.locator('a[data-sort="lcoeReal"]').click();
		await expect(page).toHaveURL(/sort=lcoeReal&dir=asc/);
		await expect(lcoeHeading(page)).toHaveAttribute('aria-sort', 'ascending');
		const ascending = await shownRows(page);
		expect(ascending).toHaveLength(consultantProjects.length);
		expectOrderedWithinCurrency(ascending, 'asc');
		await page.locator('a[data-sort="lcoeReal"]').click();
		await expect(page).toHaveURL(/sort=lcoeReal&dir=desc/);
		await expect(lcoeHeading(page)).toHaveAttribute('aria-sort', 'descending');
		expectOrderedWithinCurrency(await shownRows(page), 'desc');

		// Filter by technology with the GET form; the order stays.
		const waves = consultantProjects.filter((p) => p.technology === 'wave');
		await page.getByLabel('Technology', { exact: true }).selectOption('wave');
		await page.getByRole('button', { name: 'Show', exact: true }).click();
		await expect(page).toHaveURL(/technology=wave/);
		await expect(page).toHaveURL(/sort=lcoeReal/);
		await expect(page.getByTestId('portfolio-counts')).toContainText(`${waves.length} projects, ${waves.length} with results`);
		const filtered = await shownRows(page);
		expect(filtered.map((r) => r.name).sort()).toEqual(waves.map((p) => p.name).sort());
		expect(filtered.every((r) => r.technology === 'Wave')).toBe(true);

		// The chart is drawn, named, and said in words.
		const chart = page.getByRole('img', { name: /^Bubble chart of .+ against installed capacity/ }).first();
		await expect(chart).toBeVisible();
		await expect.poll(() => chart.locator('canvas').evaluate((c: HTMLCanvasElement) => c.width)).toBeGreaterThan(0);
		await expect(page.getByTestId('portfolio-chart').first().locator('figcaption')).toContainText(`${waves.length} projects in EUR`);
		await page.screenshot({ path: `${artifacts}/portfolio-1-waves-by-lcoe.png`, fullPage: true });

		// The CSV holds exactly the rows shown, in the same order, with units in the headers and the cautions.
		const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()]);
		expect(download.suggestedFilename()).toBe('portfolio.csv');
		const text = readFileSync((await download.path())!, 'utf8').replace(/^\uFEFF/, '');
		const [table, cautions] = text.split('\r\n\r\n');
		const [header, ...rows] = Papa.parse<string[]>(table, { skipEmptyLines: true }).data;
		expect(header.slice(0, 5)).toEqual(['Project', 'Technology', 'Status', 'Base case', 'Currency']);
		expect(header).toContain('Installed capacity (MW; devices × rated power)');
		expect(header.some((h) => /^Capex \(EUR; /.test(h))).toBe(true);
		expect(header.at(-1)).toBe('Why no figures');
		expect(rows).toHaveLength(waves.length);
		expect(rows.map((r) => r[0])).toEqual(filtered.map((r) => r.name));
		expect(cautions).toContain('Caution: ');
	});

	test('the consultant reads both her workspaces side by side; the owner of Corvane sees nothing of Halvard', async ({ browser }) => {
		const context = await browser.newContext();
		const page = await context.newPage();
		try {
			await signInPage(page, 'consultant');
			await page.getByRole('link', { name: /Portfolio across your 2 workspaces/ }).click();
			await expect(page).toHaveURL(/\/app\/portfolio$/);
			await page.locator('body[data-hydrated="true"]').waitFor();
			const table = page.getByRole('table', { name: 'Portfolio' });
			await expect(page.getByRole('columnheader', { name: /^Workspace/ })).toBeVisible();
			await expect(table.getByRole('cell', { name: otherWorkspace.name }).first()).toBeVisible();
			await expect(table.getByRole('cell', { name: demoWorkspace.name }).first()).toBeVisible();
			await page.getByLabel('From workspace').selectOption({ label: otherWorkspace.name });
			await page.getByRole('button', { name: 'Show', exact: true }).click();
			await expect(page).toHaveURL(/workspaceId=[0-9a-f-]{36}/);
			await expect(page.getByTestId('portfolio-counts')).toContainText(`${consultantProjects.length} projects`);
			await page.screenshot({ path: `${artifacts}/portfolio-2-consultant.png`, fullPage: true });
		} finally {
			await context.close();
		}

		const owner = await browser.newContext();
		const ownerPage = await owner.newPage();
		try {
			await signInPage(ownerPage, 'outsider');
			await ownerPage.goto('/app/portfolio');
			await expect(ownerPage.getByRole('table', { name: 'Portfolio' })).toBeVisible();
			await expect(ownerPage.getByRole('table', { name: 'Portfolio' })).not.toContainText(demoWorkspace.name);
		} finally {
			await owner.close();
		}
	});
});
