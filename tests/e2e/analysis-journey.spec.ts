/**
 * The analyst's analysis journey on the demo data: compare a project's base
 * case with its downside, run a tornado for LCOE on the base case, and open a
 * method note from a metric. Screenshots go to tests/.artifacts/.
 */
import { expect, test, type Page } from '@playwright/test';
import { DOWNSIDE_AVAILABILITY_DROP, DOWNSIDE_CAPEX_FACTOR } from '../../seeds/03_demo_scenarios';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { openPage } from './helpers/page';
import { signInPage } from './helpers/session';

const artifacts = 'tests/.artifacts';
const tidalProject = demoProjects[0].name;

interface DemoPlace {
	workspaceId: string;
	projectId: string;
	baseId: string;
	downsideId: string;
}

/** The demo project's ids, read through the JSON API with the page's own session. */
async function demoPlace(page: Page): Promise<DemoPlace> {
	const workspaceId = /\/app\/w\/([0-9a-f-]{36})/.exec(page.url())?.[1];
	if (!workspaceId) throw new Error(`not in a workspace: ${page.url()}`);
	const projects = (await (await page.request.get(`/api/v1/workspaces/${workspaceId}/projects`)).json()).projects as { id: string; name: string }[];
	const project = projects.find((p) => p.name === tidalProject);
	if (!project) throw new Error(`${tidalProject} is not in the demo workspace`);
	const scenarios = (await (await page.request.get(`/api/v1/projects/${project.id}/scenarios`)).json()).scenarios as {
		id: string;
		name: string;
		isBaseCase: boolean;
	}[];
	const base = scenarios.find((s) => s.isBaseCase);
	const downside = scenarios.find((s) => s.name === 'Downside');
	if (!base || !downside) throw new Error('the demo seed should create a base case and a downside');
	return { workspaceId, projectId: project.id, baseId: base.id, downsideId: downside.id };
}

test.describe('analysis journey', () => {
	test('the analyst compares base and downside, runs a tornado for LCOE and reads the method behind a metric', async ({ page }) => {
		await signInPage(page, 'analyst');
		const place = await demoPlace(page);
		const projectPath = `/app/w/${place.workspaceId}/projects/${place.projectId}`;

		// Compare: start from an empty choice and pick the two scenarios.
		await openPage(page, `${projectPath}/compare?ids=`);
		await expect(page.getByRole('heading', { name: 'Compare scenarios' })).toBeVisible();
		await expect(page.getByText('Choose at least one scenario')).toBeVisible();
		await page.getByRole('checkbox', { name: /Base case/ }).check();
		await page.getByRole('checkbox', { name: 'Downside' }).check();
		await expect(page).toHaveURL(new RegExp(`ids=${place.baseId}(%2C|,)${place.downsideId}`));

		const table = page.getByRole('table', { name: 'Metrics of the chosen scenarios' });
		await expect(table.getByRole('columnheader', { name: /Downside/ })).toBeVisible();
		await expect(table.getByRole('columnheader', { name: /Base case/ })).toBeVisible();

		// The downside has capex x1.15 and availability 5 points lower (seeds/03_demo_scenarios.ts). LCOE is
		// discounted cost over discounted energy (docs/methods/lcoe.md), so both changes raise it: worse, with a plus sign.
		expect(DOWNSIDE_CAPEX_FACTOR).toBeGreaterThan(1);
		expect(DOWNSIDE_AVAILABILITY_DROP).toBeGreaterThan(0);
		const lcoeRow = table.getByRole('row', { name: /^LCOE, real/ });
		const lcoeDifference = lcoeRow.locator('[data-verdict]');
		await expect(lcoeDifference).toHaveAttribute('data-verdict', 'worse');
		await expect(lcoeDifference).toContainText(/^\+\d/);
		await expect(lcoeDifference).toContainText('%');
		// Less available time means less energy: the net AEP falls, which is worse for the project.
		await expect(table.getByRole('row', { name: /^Net annual energy, P50/ }).locator('[data-verdict]')).toHaveAttribute('data-verdict', 'worse');
		// Lower returns: the equity IRR difference is in percentage points and worse.
		const irrDifference = table.getByRole('row', { name: /^Equity IRR/ }).locator('[data-verdict]');
		await expect(irrDifference).toHaveAttribute('data-verdict', 'worse');
		await expect(irrDifference).toContainText('pp');

		const lcoeChart = page.getByRole('img', { name: /LCOE of each chosen scenario/ });
		await expect(lcoeChart).toBeVisible();
		expect(await lcoeChart.locator('canvas').evaluate((c: HTMLCanvasElement) => c.width)).toBeGreaterThan(0);
		await expect(page.getByRole('complementary', { name: 'Cautions' })).toContainText('not investment advice');
		await page.screenshot({ path: `${artifacts}/analysis-compare.png`, fullPage: true });

		// Sensitivity of the base case: a tornado for the real LCOE.
		await openPage(page, `${projectPath}/scenarios/${place.baseId}/sensitivity`);
		await expect(page.getByRole('heading', { name: 'Sensitivity of Base case' })).toBeVisible();
		await expect(page.getByRole('table', { name: 'Tornado rows, sorted by swing' })).toBeVisible();
		await page.getByLabel('Output metric').selectOption('lcoeReal');
		const tornadoAnswer = page.waitForResponse((r) => r.url().endsWith(`/api/v1/scenarios/${place.baseId}/tornado`) && r.request().method() === 'POST');
		await page.getByRole('button', { name: 'Run the sensitivity' }).click();
		const answer = await tornadoAnswer;
		expect(answer.status()).toBe(200);
		const sent = answer.request().postDataJSON() as { metric: string; drivers: { driver: string }[] };
		expect(sent.metric).toBe('lcoeReal');
		const rows = ((await answer.json()) as { tornado: { rows: { label: string; lowOutput: string; highOutput: string; swing: string }[] } }).tornado.rows;
		expect(rows.length).toBe(sent.drivers.length);

		const tornadoTable = page.getByRole('table', { name: 'Tornado rows, sorted by swing' });
		await expect(page.getByRole('heading', { name: 'Tornado: LCOE, real' })).toBeVisible();
		const bodyRows = tornadoTable.locator('tbody tr');
		await expect(bodyRows).toHaveCount(rows.length);
		const swings = (await tornadoTable.locator('td[data-swing]').evaluateAll((cells) => cells.map((c) => c.getAttribute('data-swing') ?? ''))).map(Number);
		// Sorted by swing, largest first (the tornado's definition, docs/methods/sensitivity.md).
		expect(swings).toEqual([...swings].sort((a, b) => b - a));
		expect(swings[0]).toBeGreaterThan(0);
		// The swing is |output at high - output at low|, checked here against the outputs the table shows.
		for (const [i, row] of rows.entries()) {
			expect(Math.abs(Number(row.highOutput) - Number(row.lowOutput))).toBeCloseTo(Number(row.swing), 6);
			await expect(bodyRows.nth(i).getByRole('rowheader')).toHaveText(row.label);
		}
		// Capex +-20 % moves the LCOE (its numerator holds the capex), so capex has a swing and its high end is the worse one.
		const capexRow = rows.find((r) => r.label === 'Capex');
		if (!capexRow) throw new Error('the usual drivers include capex');
		expect(Number(capexRow.highOutput)).toBeGreaterThan(Number(capexRow.lowOutput));
		await expect(page.getByRole('img', { name: /Tornado chart of LCOE, real/ })).toBeVisible();
		await expect(page.getByRole('img', { name: /Spider chart of LCOE, real/ })).toBeVisible();
		await expect(page.getByRole('complementary', { name: 'Cautions' })).toBeVisible();
		await page.screenshot({ path: `${artifacts}/analysis-sensitivity.png`, fullPage: true });

		// From a metric on the compare page to its method note.
		await openPage(page, `${projectPath}/compare?ids=${place.baseId},${place.downsideId}`);
		await page.getByRole('table', { name: 'Metrics of the chosen scenarios' }).getByRole('link', { name: 'LCOE, real' }).click();
		await expect(page).toHaveURL(/\/app\/methods\/lcoe$/);
		await expect(page.getByRole('heading', { level: 1 })).toContainText('Levelised cost of energy');
		await expect(page.locator('.method-note pre code').first()).toContainText('LCOE');
		await expect(page.getByRole('heading', { name: /^Sources?$/ })).toBeVisible();
		await page.screenshot({ path: `${artifacts}/analysis-method-note.png`, fullPage: true });
	});
});
