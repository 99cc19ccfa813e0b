/**
 * Comparing the demo tidal array's base case and downside as its owner: the
 * metrics with the catalogue's labels and precision and words for a missing
 * value, the inputs that differ, and the two tornadoes side by side on one
 * axis. Screenshots at 1400 and 390 px go to tests/.artifacts/.
 */
import { expect, test, type Page } from '@playwright/test';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { DOWNSIDE_AVAILABILITY_DROP, DOWNSIDE_CAPEX_FACTOR } from '../../seeds/03_demo_scenarios';
import { METRIC_KEYS, METRIC_LIST, type MetricKey } from '../../src/lib/metrics/catalogue';
import { formatMetric, NO_VALUE } from '../../src/lib/metrics/format';
import { tidalInput } from '../fixtures/scenario-documents';
import { openPage } from './helpers/page';
import { signedInRequest, signInPage } from './helpers/session';
import { DEMO_WORKSPACE, newProject, newScenario } from './helpers/workbench';

const artifacts = 'tests/.artifacts';
const tidalProject = demoProjects[0].name;

interface Place {
	path: string;
	projectId: string;
	baseId: string;
	downsideId: string;
}

async function demoPlace(page: Page): Promise<Place> {
	const workspaceId = /\/app\/w\/([0-9a-f-]{36})/.exec(page.url())?.[1];
	if (!workspaceId) throw new Error(`not in a workspace: ${page.url()}`);
	const projects = (await (await page.request.get(`/api/v1/workspaces/${workspaceId}/projects`)).json()).projects as { id: string; name: string }[];
	const project = projects.find((p) => p.name === tidalProject);
	if (!project) throw new Error(`${tidalProject} is not in the demo workspace`);
	const scenarios = (await (await page.request.get(`/api/v1/projects/${project.id}/scenarios`)).json()).scenarios as { id: string; name: string; isBaseCase: boolean }[];
	const base = scenarios.find((s) => s.isBaseCase);
	const downside = scenarios.find((s) => s.name === 'Downside');
	if (!base || !downside) throw new Error('the demo seed should create a base case and a downside');
	return { path: `/app/w/${workspaceId}/projects/${project.id}`, projectId: project.id, baseId: base.id, downsideId: downside.id };
}

type TornadoRequest = { metric: string; drivers: { driver: string; low: number; high: number }[] };

test('the owner compares base case and downside: labels, inputs that differ and tornadoes on one axis', async ({ page }) => {
	await page.setViewportSize({ width: 1400, height: 900 });
	await signInPage(page, 'owner');
	const place = await demoPlace(page);

	// The page runs both tornadoes on opening; catch the requests to check what each asked for.
	const tornadoes = new Map<string, TornadoRequest>();
	page.on('request', (request) => {
		const match = /\/api\/v1\/scenarios\/([0-9a-f-]{36})\/tornado$/.exec(request.url());
		if (match && request.method() === 'POST') tornadoes.set(match[1], request.postDataJSON() as TornadoRequest);
	});
	const answer = page.waitForResponse((r) => r.url().includes(`/api/v1/projects/${place.projectId}/compare`));
	await openPage(page, `${place.path}/compare?ids=${place.baseId},${place.downsideId}`);
	const comparison = (await (await answer).json()) as { scenarios: { id: string; metrics: Record<MetricKey, string | null>; missingValues: Partial<Record<MetricKey, string>> }[] };

	// Metrics: the catalogue's labels, each figure at the catalogue's precision, words where a value is missing.
	const table = page.getByRole('table', { name: 'Metrics of the chosen scenarios' });
	for (const metric of METRIC_LIST) await expect(table.getByRole('rowheader', { name: metric.label, exact: true })).toBeVisible();
	for (const [column, scenario] of comparison.scenarios.entries()) {
		for (const key of METRIC_KEYS) {
			const cell = table.getByRole('row').filter({ has: page.getByRole('rowheader', { name: METRIC_LIST.find((m) => m.key === key)!.label, exact: true }) }).locator('td').nth(1 + column);
			const value = scenario.metrics[key];
			if (value === null) await expect(cell.getByTestId('missing-value')).toHaveText(scenario.missingValues[key]!);
			else await expect(cell.locator('span').first()).toHaveText(formatMetric(key, value));
		}
	}
	const mainText = await page.locator('main').innerText();
	for (const key of METRIC_KEYS) expect(mainText, `raw key ${key} on the page`).not.toContain(key);
	await expect(table.locator('td > span:first-child').filter({ hasText: new RegExp(`^${NO_VALUE}$`) })).toHaveCount(0);

	// Inputs that differ: the downside's availability is 5 points lower (seeds/03_demo_scenarios.ts).
	const inputs = page.getByRole('table', { name: 'Inputs that differ between the chosen scenarios' });
	await expect(inputs.getByTestId('input-difference').first()).toBeVisible();
	const availability = inputs.getByRole('row', { name: /^Availability %/ });
	const [baseAvailability, downsideAvailability] = (await availability.locator('td').allInnerTexts()).slice(1).map(Number);
	expect(baseAvailability - downsideAvailability).toBeCloseTo(DOWNSIDE_AVAILABILITY_DROP * 100, 6);
	await expect(inputs.getByRole('rowheader', { name: 'Turbines, Amount' })).toBeVisible();
	await expect(inputs.getByRole('rowheader', { name: /^Capex total/ })).toHaveCount(0);

	// Sensitivity side by side: two tornado charts on one axis.
	const charts = page.getByTestId('side-tornado');
	await expect(charts).toHaveCount(2);
	await expect(page.getByRole('img', { name: /Tornado chart of LCOE, real for Base case/ })).toBeVisible();
	await expect(page.getByRole('img', { name: /Tornado chart of LCOE, real for Downside/ })).toBeVisible();
	const axis = async (i: number) => [await charts.nth(i).getAttribute('data-axis-min'), await charts.nth(i).getAttribute('data-axis-max')];
	const [firstAxis, secondAxis] = [await axis(0), await axis(1)];
	expect(firstAxis.every((v) => v !== null && v !== '' && Number.isFinite(Number(v)))).toBe(true);
	expect(secondAxis).toEqual(firstAxis);
	for (const i of [0, 1]) expect(await charts.nth(i).locator('canvas').evaluate((c: HTMLCanvasElement) => c.width)).toBeGreaterThan(0);

	// The same relative capex range for both; availability over each scenario's own screening range.
	const [sentBase, sentDownside] = [tornadoes.get(place.baseId), tornadoes.get(place.downsideId)];
	if (!sentBase || !sentDownside) throw new Error('both tornadoes should have been requested');
	expect(sentDownside.metric).toBe(sentBase.metric);
	const range = (sent: TornadoRequest, driver: string) => sent.drivers.find((d) => d.driver === driver);
	expect(range(sentDownside, 'capex')).toEqual(range(sentBase, 'capex'));
	expect(range(sentBase, 'availability')!.high - range(sentDownside, 'availability')!.high).toBeCloseTo(DOWNSIDE_AVAILABILITY_DROP, 9);

	// LCOE holds capex in its numerator (docs/methods/lcoe.md); the downside has more capex over less energy, so capex moves it more.
	expect(DOWNSIDE_CAPEX_FACTOR).toBeGreaterThan(1);
	const swings = page.getByRole('table', { name: 'Swing of each driver by scenario' });
	const capexRow = swings.getByRole('row').filter({ has: page.getByRole('rowheader', { name: /^Capex/ }) });
	const [baseSwing, downsideSwing] = (await capexRow.locator('td[data-swing]').evaluateAll((cells) => cells.map((c) => c.getAttribute('data-swing') ?? ''))).map(Number);
	expect(downsideSwing).toBeGreaterThan(baseSwing);
	await expect(capexRow.locator('td').nth(1)).toContainText('most exposed');
	await page.screenshot({ path: `${artifacts}/compare-1400.png`, fullPage: true });

	// On a phone: everything stacks, nothing scrolls sideways.
	await page.setViewportSize({ width: 390, height: 844 });
	await openPage(page, `${place.path}/compare?ids=${place.baseId},${place.downsideId}`);
	await expect(page.getByTestId('side-tornado')).toHaveCount(2);
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
	expect(overflow).toBeLessThanOrEqual(0);
	await page.screenshot({ path: `${artifacts}/compare-390.png`, fullPage: true });
});

test('a scenario without debt reads its missing cover ratios in words, and its debt as an input that differs', async ({ page, playwright, baseURL }) => {
	const owner = await signedInRequest(playwright, baseURL!, 'owner');
	const workspaceId = (await (await owner.get('/api/v1/workspaces')).json()).workspaces.find((w: { name: string }) => w.name === DEMO_WORKSPACE).id as string;
	const project = await newProject(owner, workspaceId);
	const geared = await newScenario(owner, project.id, { name: 'Geared' });
	const equity = await newScenario(owner, project.id, { name: 'All equity', document: { ...tidalInput, finance: { ...tidalInput.finance, debt: { sizing: 'none' } } } });
	await owner.dispose();

	await signInPage(page, 'owner');
	await openPage(page, `/app/w/${workspaceId}/projects/${project.id}/compare?ids=${geared.id},${equity.id}`);
	const table = page.getByRole('table', { name: 'Metrics of the chosen scenarios' });
	// No debt service, no DSCR: the engine's own reason, not a dash (src/lib/server/engine/evaluate.ts).
	const minDscr = table.getByRole('row').filter({ has: page.getByRole('rowheader', { name: 'Minimum DSCR', exact: true }) });
	await expect(minDscr.getByTestId('missing-value')).toHaveText('no minimum DSCR: there is no debt service');
	await expect(table.locator('td > span:first-child').filter({ hasText: new RegExp(`^${NO_VALUE}$`) })).toHaveCount(0);
	const inputs = page.getByRole('table', { name: 'Inputs that differ between the chosen scenarios' });
	await expect(inputs.getByRole('row', { name: /^Senior debt/ })).toContainText('None: the project is funded by equity');
	// The all-equity case has no gearing: said in words.
	await expect(inputs.getByRole('row', { name: /^Gearing %/ })).toContainText('not set');
});
