/**
 * Probabilistic runs as their users walk them in Chromium: the analyst of a
 * paying workspace opens the runs page from the scenario editor, starts a run,
 * watches it draw, reads its results and charts, downloads its draws, then
 * starts and cancels a second; a viewer reads the results without the form; a
 * workspace on the Free plan is told what it needs instead. Screenshots of the
 * page drawing and done, wide and narrow, go to tests/.artifacts/.
 */
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { openPage } from './helpers/page';
import { newSignedInPage, signInPage, signUpFreshAccount } from './helpers/session';

const artifacts = 'tests/.artifacts';
const tidalProject = demoProjects[0].name;
const WIDE = { width: 1400, height: 900 };
const NARROW = { width: 390, height: 844 };

/** The outputs in the order the draws CSV lists them (RUN_OUTPUTS in src/lib/server/probabilistic/draw-evaluation.ts). */
const CSV_OUTPUTS = ['lcoeReal', 'projectIrrPostTax', 'equityIrr', 'npv', 'minDscr'];

/** Wide and narrow screenshots; at each width nothing may stick out sideways (charts redraw at their new width first). */
async function shots(page: Page, name: string) {
	for (const [size, viewport] of [['wide', WIDE], ['narrow', NARROW]] as const) {
		await page.setViewportSize(viewport);
		await expect
			.poll(() => page.evaluate(() => document.documentElement.scrollWidth), { message: `the page fits ${viewport.width} px across` })
			.toBeLessThanOrEqual(viewport.width);
		await page.screenshot({ path: `${artifacts}/probabilistic-${name}-${size}.png`, fullPage: true });
	}
	await page.setViewportSize(WIDE);
}

/** The demo tidal project's base case, read through the JSON API with the page's own session. */
async function demoBaseCase(page: Page): Promise<{ workspaceId: string; projectId: string; scenarioId: string }> {
	const workspaceId = /\/app\/w\/([0-9a-f-]{36})/.exec(page.url())?.[1];
	if (!workspaceId) throw new Error(`not in a workspace: ${page.url()}`);
	const projects = (await (await page.request.get(`/api/v1/workspaces/${workspaceId}/projects`)).json()).projects as { id: string; name: string }[];
	const project = projects.find((p) => p.name === tidalProject);
	if (!project) throw new Error(`${tidalProject} is not in the demo workspace`);
	const scenarios = (await (await page.request.get(`/api/v1/projects/${project.id}/scenarios`)).json()).scenarios as { id: string; isBaseCase: boolean }[];
	const base = scenarios.find((s) => s.isBaseCase);
	if (!base) throw new Error('the demo seed should make a base case');
	return { workspaceId, projectId: project.id, scenarioId: base.id };
}

/** A figure as the page prints it ("9.84", "−1.20", "1,234") as a number; NaN for a dash. */
function figureOf(text: string | null): number {
	return Number((text ?? '').trim().replace('\u2212', '-').replace(/,/g, ''));
}

/**
 * The p-quantile of sorted values, Hyndman and Fan's definition 7 (R's default,
 * numpy.percentile's linear): h = (n - 1) p, Q = x[floor h] + (h - floor h)(x[floor h + 1] - x[floor h]).
 * Source: R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The American Statistician 50 (1996).
 */
function quantile7(sorted: number[], p: number): number {
	const h = (sorted.length - 1) * p;
	const lo = Math.floor(h);
	const hi = Math.min(lo + 1, sorted.length - 1);
	return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

const progressBar = (page: Page) => page.getByRole('progressbar', { name: 'Draws done' });
const drawsDone = async (page: Page) => Number(await progressBar(page).getAttribute('value'));
const runState = (page: Page) => page.locator('[data-run-state]');
const results = (page: Page) => page.locator('section[aria-labelledby="run-results-heading"]');

test.describe('probabilistic runs', () => {
	test('the analyst starts a run from the editor, watches it, reads and downloads its results, and cancels a second; a viewer reads the results without the form', async ({
		page,
		browser
	}) => {
		test.setTimeout(180_000);
		await page.setViewportSize(WIDE);
		await signInPage(page, 'analyst');
		const place = await demoBaseCase(page);
		const editorPath = `/app/w/${place.workspaceId}/projects/${place.projectId}/scenarios/${place.scenarioId}`;

		// From the editor to the runs page.
		await openPage(page, editorPath);
		await page.getByRole('link', { name: 'Probabilistic runs', exact: true }).click();
		await expect(page).toHaveURL(new RegExp(`${editorPath}/runs$`));
		await expect(page.getByRole('heading', { level: 1, name: /^Probabilistic runs of / })).toBeVisible();
		const runsPath = new URL(page.url()).pathname;

		// 2,000 draws: a few seconds of one worker.
		await expect(page.getByRole('heading', { name: 'What to draw' })).toBeVisible();
		await page.getByLabel('Draws', { exact: true }).fill('2000');
		await page.getByRole('button', { name: 'Start the run' }).click();
		await expect(page).toHaveURL(/\?run=[0-9a-f-]{36}$/);
		const firstRunId = new URL(page.url()).searchParams.get('run')!;

		// The bar appears at once and fills as the worker draws; the state ends "Done".
		await expect(progressBar(page)).toHaveAttribute('max', '2000');
		const seen: number[] = [await drawsDone(page)];
		await expect
			.poll(
				async () => {
					seen.push(await drawsDone(page));
					return runState(page).getAttribute('data-run-state');
				},
				{ timeout: 60_000, intervals: [100] }
			)
			.toBe('done');
		expect(seen[0], 'the bar starts short of the end').toBeLessThan(2000);
		expect(seen.every((v, i) => i === 0 || v >= seen[i - 1]), `the bar only moves forward: ${seen.join(', ')}`).toBe(true);
		await expect(runState(page)).toHaveText('Done');
		expect(await drawsDone(page)).toBe(2000);
		await expect(page.getByText('2,000 of 2,000 draws')).toBeVisible();

		// The results: the P90 equity IRR as a number, two charts drawn.
		await expect(page.getByRole('heading', { name: 'Results of 2,000 draws' })).toBeVisible();
		const p90Cell = page.locator('td[data-output="equityIrr"][data-p="90"]');
		const p90EquityIrr = figureOf(await p90Cell.textContent());
		expect(Number.isFinite(p90EquityIrr), `P90 equity IRR "${await p90Cell.textContent()}"`).toBe(true);
		// Draws without an equity IRR are named in a note under the table ("Equity IRR: 58 of 2,000 draws have none …"), if any.
		const missingNote = results(page).locator('p').filter({ hasText: /^Equity IRR: / });
		const missingEquityIrr = (await missingNote.count()) === 0 ? 0 : figureOf(/^Equity IRR: ([\d,]+) of 2,000 draws have none/.exec((await missingNote.textContent()) ?? '')?.[1] ?? 'none');
		expect(Number.isInteger(missingEquityIrr), 'the count of draws without an equity IRR').toBe(true);
		const canvases = results(page).locator('canvas');
		await expect(canvases).toHaveCount(2);
		for (const canvas of await canvases.all()) {
			const box = await canvas.boundingBox();
			expect(box && box.width > 100 && box.height > 100, 'a chart has room on the page').toBe(true);
		}
		await expect(results(page).getByRole('img', { name: 'Histogram of Equity IRR over the draws' })).toBeVisible();
		await shots(page, '2-done');

		// Another output for the charts: both follow it, and so does the ranking of what moves it.
		await results(page).getByLabel('Charts of').selectOption('lcoeReal');
		await expect(results(page).getByRole('img', { name: 'Histogram of LCOE, real over the draws' })).toBeVisible();
		await expect(results(page).getByRole('img', { name: 'Cumulative curve of LCOE, real' })).toBeVisible();
		await expect(results(page).getByRole('heading', { name: 'What moves LCOE, real most' })).toBeVisible();
		await expect(canvases).toHaveCount(2);

		// The draws as CSV: one row a draw, the run's drivers then the energy factor and the outputs.
		const run = (await (await page.request.get(`/api/v1/scenarios/${place.scenarioId}/runs/${firstRunId}`)).json()).run as {
			input: { drivers: { driver: string }[] };
		};
		const downloading = page.waitForEvent('download');
		await page.getByRole('link', { name: 'Download the draws (CSV)' }).click();
		const download = await downloading;
		expect(download.suggestedFilename()).toMatch(/-seed-1\.csv$/);
		const lines = readFileSync((await download.path())!, 'utf8').trimEnd().split('\r\n');
		const header = lines[0].split(',');
		expect(header).toEqual(['draw', ...run.input.drivers.map((d) => d.driver), 'energyFactor', ...CSV_OUTPUTS]);
		expect(lines).toHaveLength(2001);
		const rows = lines.slice(1).map((line) => line.split(','));
		expect(rows.every((cells) => cells.length === header.length)).toBe(true);
		expect(rows.map((cells) => Number(cells[0])).sort((a, b) => a - b)).toEqual(Array.from({ length: 2000 }, (_, i) => i));

		// The page's P90 equity IRR is the 10th percentile (type 7) of the file's equity IRRs, in per cent at two places;
		// draws without a value are left out and counted apart.
		const column = header.indexOf('equityIrr');
		const cells = rows.map((r) => r[column]);
		const irrs = cells.filter((c) => c !== '').map(Number).sort((a, b) => a - b);
		expect(cells.length - irrs.length).toBe(missingEquityIrr);
		expect(Math.abs(quantile7(irrs, 0.1) * 100 - p90EquityIrr)).toBeLessThanOrEqual(0.005 + 1e-9);

		// A second, long run: the bar moves while it draws, then it is cancelled.
		await page.getByLabel('Draws', { exact: true }).fill('50000');
		await page.getByRole('button', { name: 'Start the run' }).click();
		await expect(page).not.toHaveURL(new RegExp(`run=${firstRunId}`));
		await expect(page).toHaveURL(/\?run=[0-9a-f-]{36}$/);
		await expect(runState(page)).toHaveText('Drawing', { timeout: 30_000 });
		await expect.poll(() => drawsDone(page), { timeout: 30_000 }).toBeGreaterThan(0);
		const early = await drawsDone(page);
		await expect.poll(() => drawsDone(page), { timeout: 30_000 }).toBeGreaterThan(early);
		await expect(page.getByRole('button', { name: 'Start the run' })).toBeDisabled();
		await expect(page.getByText(/time left: /)).toBeVisible();
		// The list below follows the run the bar follows.
		const list = page.getByRole('table').filter({ has: page.getByRole('columnheader', { name: 'Revision' }) });
		await expect(list.locator('tbody tr').first()).toContainText('Drawing');
		await shots(page, '1-drawing');

		await page.getByRole('button', { name: 'Cancel the run' }).click();
		await expect(runState(page)).toHaveText('Cancelled');
		await expect(runState(page)).toHaveAttribute('data-run-state', 'cancelled');
		expect(await drawsDone(page)).toBeLessThan(50000);
		await expect(page.getByRole('button', { name: 'Cancel the run' })).toHaveCount(0);
		await expect(page.getByRole('link', { name: 'Download the draws (CSV)' })).toHaveCount(0);
		await expect(page.getByRole('button', { name: 'Start the run' })).toBeEnabled();
		// The list of the scenario's runs, newest first: the cancelled one, then the finished one.
		await expect(list.locator('tbody tr').first()).toContainText('Cancelled');
		await expect(list.locator('tbody tr').first()).toHaveAttribute('aria-current', 'true');
		await expect(list.locator('tbody tr').filter({ has: page.locator(`a[href="?run=${firstRunId}"]`) })).toContainText('Done');
		await shots(page, '3-cancelled');

		// The workspace's list of runs has both, with their project and scenario.
		await openPage(page, `/app/w/${place.workspaceId}/runs`);
		const everyRun = page.getByRole('row').filter({ hasText: `${tidalProject} · Base case` });
		await expect(everyRun.filter({ hasText: 'Cancelled' })).not.toHaveCount(0);
		await expect(everyRun.filter({ has: page.locator(`a[href$="runs?run=${firstRunId}"]`) })).toContainText('Done');
		await shots(page, '5-workspace-list');

		// A viewer of the workspace reads the finished run; there is nothing for them to start or cancel.
		const viewer = await newSignedInPage(browser, 'viewer');
		try {
			await openPage(viewer, `${runsPath}?run=${firstRunId}`);
			await expect(runState(viewer)).toHaveText('Done');
			expect(Number.isFinite(figureOf(await viewer.locator('td[data-output="equityIrr"][data-p="90"]').textContent()))).toBe(true);
			await expect(results(viewer).locator('canvas')).toHaveCount(2);
			await expect(viewer.getByRole('link', { name: 'Download the draws (CSV)' })).toBeVisible();
			await expect(viewer.getByRole('heading', { name: 'What to draw' })).toHaveCount(0);
			await expect(viewer.getByRole('button', { name: 'Start the run' })).toHaveCount(0);
			await expect(viewer.getByRole('button', { name: 'Cancel the run' })).toHaveCount(0);
		} finally {
			await viewer.context().close();
		}
	});

	/**
	 * A workspace on the Free plan: a new account's own. (The demo's free workspace,
	 * Penrow Tidal Ventures, is upgraded by the billing journey, which runs before this spec.)
	 */
	test('on the Free plan the runs page names the plan it needs and shows no form; the API says 402', async ({ page }) => {
		test.setTimeout(90_000);
		const workspaceId = await signUpFreshAccount(page, { name: 'Maren Holt', workspace: 'Holt Wave Studies' });
		const project = await page.request.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: 'Holt test array', technology: 'wave', siteName: 'Holt Reach' } });
		expect(project.status(), await project.text()).toBe(201);
		const projectId = (await project.json()).project.id as string;
		const scenario = await page.request.post(`/api/v1/projects/${projectId}/scenarios`, { data: { name: 'Base case' } });
		expect(scenario.status(), await scenario.text()).toBe(201);
		const scenarioId = (await scenario.json()).scenario.id as string;

		await openPage(page, `/app/w/${workspaceId}/projects/${projectId}/scenarios/${scenarioId}`);
		await page.getByRole('link', { name: 'Probabilistic runs', exact: true }).click();
		const note = page.getByRole('note').filter({ hasText: 'Probabilistic runs need' });
		await expect(note).toBeVisible();
		await expect(note.getByRole('link', { name: 'Plan and billing' })).toHaveAttribute('href', `/app/w/${workspaceId}/billing`);
		await expect(page.getByRole('heading', { name: 'What to draw' })).toHaveCount(0);
		await expect(page.getByRole('button', { name: 'Start the run' })).toHaveCount(0);
		await expect(page.getByRole('progressbar')).toHaveCount(0);
		await page.setViewportSize(WIDE);
		await page.screenshot({ path: `${artifacts}/probabilistic-4-free-plan-wide.png`, fullPage: true });

		// The workspace's list says the same; the API refuses a start with 402 and where to change the plan.
		await openPage(page, `/app/w/${workspaceId}/runs`);
		await expect(page.getByRole('note').filter({ hasText: 'Probabilistic runs need' })).toBeVisible();
		const refused = await page.request.post(`/api/v1/scenarios/${scenarioId}/runs`, {
			data: { drivers: [{ driver: 'capex', distribution: { shape: 'uniform', min: 0.9, max: 1.1 } }], energyUncertainty: false, draws: 100, hurdleRate: 0.08 }
		});
		expect(refused.status()).toBe(402);
		expect((await refused.json()).error).toMatchObject({ billingUrl: `/app/w/${workspaceId}/billing` });
	});
});
