/**
 * The workbench as its users walk it in Chromium: an analyst builds a case
 * from a new project and a measured time series, edits it and copies it as a
 * downside; a viewer reads a scenario and can change nothing.
 */
import { expect, test, type Page } from '@playwright/test';
import { openPage } from './helpers/page';
import { signInPage } from './helpers/session';

const artifacts = 'tests/.artifacts';
const shot = (page: Page, name: string, fullPage = false) => page.screenshot({ path: `${artifacts}/workbench-${name}.png`, fullPage });
const shotOf = (page: Page, selector: string, name: string) => page.locator(selector).first().screenshot({ path: `${artifacts}/workbench-${name}.png` });

const metric = (page: Page, key: string) => page.locator(`[data-metric="${key}"] dd`).first();

async function waitForResults(page: Page) {
	await expect(page.getByTestId('results')).toBeVisible();
	await expect(page.getByText('Updating…')).toHaveCount(0);
}

test('an analyst creates a project, uploads a time series into a new scenario, edits capex and copies it as a downside case', async ({ page }) => {
	test.setTimeout(120_000);
	await signInPage(page, 'analyst');
	await page.locator('body[data-hydrated="true"]').waitFor();

	// A new project in the workspace.
	const projectName = `Brannock Sound array ${Date.now().toString(36)}`;
	await page.getByRole('button', { name: 'New project' }).click();
	await page.getByLabel('Project name').fill(projectName);
	await page.getByLabel('Technology').selectOption('tidal-stream');
	await page.getByLabel('Site name').fill('Brannock Sound');
	await page.getByLabel('Site description').fill('A narrow sound between two invented headlands, 30 m deep.');
	await page.getByRole('button', { name: 'Create project' }).click();
	await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1, name: projectName })).toBeVisible();
	const projectUrl = page.url();

	// A first scenario from the project's technology example.
	await page.getByRole('button', { name: 'New scenario' }).click();
	await page.getByLabel('Scenario name').fill('Base case');
	await page.getByRole('button', { name: 'Create scenario' }).click();
	await expect(page).toHaveURL(/\/scenarios\/[0-9a-f-]{36}$/);
	const baseCaseId = page.url().split('/').at(-1)!;
	await waitForResults(page);
	await openPage(page, projectUrl);

	// A file with bad rows is refused whole, each problem named by row and column.
	await page.getByLabel('Kind of file').selectOption('current-speed-time-series');
	await page.getByLabel('CSV file').setInputFiles({
		name: 'bad-series.csv',
		mimeType: 'text/csv',
		buffer: Buffer.from('timestamp,speed_m_s\n2025-03-01T00:00:00Z,1.05\n2025-03-01T00:10:00Z,abc\n2025-03-01T00:20:00Z,1.20\n')
	});
	await page.getByRole('button', { name: 'Upload and check' }).click();
	const problems = page.getByRole('table', { name: 'Problems in the file' });
	await expect(problems.getByRole('row').filter({ hasText: 'speed_m_s' })).toContainText(/3\s*speed_m_s\s*"abc" is not a number/);
	await expect(page.getByText('Earlier uploads')).toBeVisible();
	await expect(page.getByText('None yet.')).toBeVisible();
	await shot(page, '1-upload-refused');

	// The template time series: binned on upload, previewed as a table and a chart.
	await page.getByLabel('CSV file').setInputFiles('static/templates/current-speed-time-series.csv');
	await page.getByRole('button', { name: 'Upload and check' }).click();
	await expect(page.getByRole('heading', { name: /Current-speed time series: current-speed-time-series\.csv/ })).toBeVisible();
	await expect(page.getByText('Record length')).toBeVisible();
	await expect(page.getByText('Mean speed')).toBeVisible();
	await expect(page.getByRole('table', { name: 'The parsed rows' }).locator('tbody tr').first()).toBeVisible();
	await expect(page.getByRole('img', { name: /Current-speed time series of/ })).toBeVisible();
	await expect(page.getByRole('table', { name: /Files uploaded/ })).toContainText('Tomas Vell');
	await shot(page, '2-upload-preview', true);

	await page.getByLabel('Put it into scenario').selectOption(baseCaseId);
	await page.getByRole('button', { name: 'Apply to the resource' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Put into the resource' })).toContainText('Put into the resource of "Base case", now at revision 2');
	await page.getByRole('link', { name: 'Open the scenario' }).click();

	// The editor shows the binned histogram and recomputes as capex changes.
	await expect(page.getByLabel('Resource given as')).toHaveValue('speed-histogram');
	await expect(page.getByRole('table', { name: /Speed bins/ })).toBeVisible();
	await waitForResults(page);
	await shot(page, '3-editor');
	await shotOf(page, '[data-testid="results"]', '3-results');
	await shotOf(page, 'section[aria-labelledby="cash-flow-title"]', '3-cash-flow');
	const lcoeBefore = (await metric(page, 'lcoeReal').textContent())?.trim();
	expect(lcoeBefore).toMatch(/^\d[\d,]*\.\d\d$/);

	const amount = page.getByRole('spinbutton', { name: 'Amount of capex line 1', exact: true });
	// Money reads grouped (12,000,000) and is typed either way.
	const firstAmount = Number((await amount.inputValue()).replace(/,/g, ''));
	expect(firstAmount).toBeGreaterThan(0);
	await amount.fill(String(firstAmount * 1.5));
	await expect(page.getByText('Unsaved changes', { exact: true })).toBeVisible();
	await expect(metric(page, 'lcoeReal')).not.toHaveText(lcoeBefore!);
	await waitForResults(page);
	const lcoeAfter = Number((await metric(page, 'lcoeReal').textContent())!.replace(/,/g, ''));
	// More capex for the same energy can only raise the levelised cost.
	expect(lcoeAfter).toBeGreaterThan(Number(lcoeBefore!.replace(/,/g, '')));

	// A field the schema refuses is named beside its input; the last good results stay. Shares are typed in per cent.
	const availability = page.getByLabel('Availability', { exact: true });
	await availability.fill('140');
	await expect(page.locator('#field-array-availability-error')).toBeVisible();
	// The summary names the field in words, as the form does, and links to it.
	const summary = page.getByRole('alert').filter({ hasText: 'attention' });
	await expect(summary.getByRole('link', { name: 'Availability' })).toHaveAttribute('href', '#field-array-availability');
	await expect(summary).not.toContainText('array.availability');
	await expect(page.getByTestId('results')).toBeVisible();
	await shot(page, '4-field-error');
	await availability.fill('93');
	await expect(page.locator('#field-array-availability-error')).toHaveCount(0);
	// An arrow key moves a share by a tenth of a point, not to 100 %.
	await availability.press('ArrowUp');
	await expect(availability).toHaveValue('93.1');
	await availability.press('ArrowDown');
	await expect(availability).toHaveValue('93');
	await waitForResults(page);

	await page.getByRole('button', { name: 'Save', exact: true }).click();
	await expect(page.getByText('Saved as revision 3.')).toBeVisible();
	await expect(page.getByRole('region', { name: 'Revision history' })).toContainText('r3');

	// Duplicate as the lenders' downside case.
	await page.getByRole('button', { name: 'Duplicate…' }).click();
	await page.getByLabel('Name of the copy').fill('Downside case');
	await page.getByRole('button', { name: 'Duplicate', exact: true }).click();
	await expect(page.getByLabel('Scenario name')).toHaveValue('Downside case');
	await expect(page.getByRole('spinbutton', { name: 'Amount of capex line 1', exact: true })).toHaveValue((firstAmount * 1.5).toLocaleString('en-GB', { maximumFractionDigits: 10 }));
	await waitForResults(page);
	const downsideUrl = page.url();

	// Someone else saves first: the save is refused, nothing is overwritten, the latest can be loaded.
	await page.getByLabel('Availability', { exact: true }).fill('85');
	const scenarioId = downsideUrl.split('/').at(-1)!;
	const current = await (await page.request.get(`/api/v1/scenarios/${scenarioId}`)).json();
	const theirs = await page.request.put(`/api/v1/scenarios/${scenarioId}`, {
		data: { revision: current.scenario.revision, notes: 'Saved from another window' }
	});
	expect(theirs.status()).toBe(200);
	await page.getByRole('button', { name: 'Save', exact: true }).click();
	await expect(page.getByRole('region', { name: 'Someone else saved this scenario while you were editing' })).toContainText('Saved from another window');
	await shot(page, '5-stale-save');
	page.once('dialog', (dialog) => void dialog.accept());
	await page.getByRole('button', { name: 'Discard my edits and load revision 2' }).click();
	await expect(page.getByRole('textbox', { name: 'Notes', exact: true })).toHaveValue('Saved from another window');
	await expect(page.getByLabel('Availability', { exact: true })).toHaveValue('93');

	await openPage(page, projectUrl);
	const list = page.getByRole('list', { name: 'Scenarios' });
	await expect(list.getByRole('link', { name: 'Downside case' })).toBeVisible();
	await expect(list.getByRole('link', { name: 'Base case' })).toBeVisible();
	await shot(page, '6-project', true);

	// Archive the copy, find it among the archived, bring it back.
	await page.getByRole('button', { name: 'Archive Downside case' }).click();
	await expect(page.getByRole('status').filter({ hasText: '"Downside case" is archived.' })).toBeVisible();
	await expect(list.getByRole('link', { name: 'Downside case' })).toHaveCount(0);
	await page.getByRole('button', { name: 'Show archived scenarios' }).click();
	const archivedList = page.getByRole('list', { name: 'Archived scenarios' });
	await expect(archivedList.getByRole('link', { name: 'Downside case' })).toBeVisible();
	await archivedList.getByRole('button', { name: 'Restore' }).click();
	await expect(list.getByRole('link', { name: 'Downside case' })).toBeVisible();
	await expect(page.getByText('No archived scenarios.')).toBeVisible();
});

test('a viewer reads a scenario and cannot change it', async ({ page }) => {
	await signInPage(page, 'viewer');
	await page.locator('body[data-hydrated="true"]').waitFor();
	await expect(page.getByRole('button', { name: 'New project' })).toHaveCount(0);
	await page.getByRole('link', { name: 'Kestle Narrows Tidal Array' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Kestle Narrows Tidal Array' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'New scenario' })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Upload and check' })).toHaveCount(0);
	await page.getByRole('link', { name: 'Base case', exact: true }).click();

	await expect(page.getByRole('heading', { level: 1, name: 'Base case' })).toBeVisible();
	await waitForResults(page);
	await expect(page.getByText(/^Of the saved revision \d+$/)).toBeVisible();
	// A viewer reads the assumptions in words first; every field, disabled, is a click away.
	const summary = page.getByRole('region', { name: 'Assumptions' });
	await expect(summary).toContainText('Availability');
	await expect(page.getByLabel('Seawater density')).toHaveCount(0);
	await page.getByRole('button', { name: 'Show every field' }).click();
	await expect(page.getByLabel('Seawater density')).toBeDisabled();
	await expect(page.getByRole('spinbutton', { name: 'Amount of capex line 1', exact: true })).toBeDisabled();
	await expect(page.getByRole('button', { name: 'Save', exact: true })).toHaveCount(0);
	await expect(page.getByRole('button', { name: 'Add capex line' })).toHaveCount(0);
	await expect(metric(page, 'lcoeReal')).toHaveText(/^\d[\d,]*\.\d\d$/);
	await shot(page, '7-viewer');

	const scenarioId = page.url().split('/').at(-1)!;
	const current = await (await page.request.get(`/api/v1/scenarios/${scenarioId}`)).json();
	const refused = await page.request.put(`/api/v1/scenarios/${scenarioId}`, { data: { revision: current.scenario.revision, notes: 'a viewer tries' } });
	expect(refused.status()).toBe(403);
	const draft = await page.request.post(`/api/v1/scenarios/${scenarioId}/evaluate`, { data: { document: current.scenario.document } });
	expect(draft.status()).toBe(403);
});
