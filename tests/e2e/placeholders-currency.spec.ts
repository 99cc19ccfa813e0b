/**
 * Honest figures from the first visit: a new account starts from the tidal
 * example, whose site and project figures are marked "example value" until
 * edited (the count at the top drops as they are, and stays so after a
 * save and a reload); a new project currency then asks what becomes of the
 * money before anything changes, and converts it at the rate typed.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';
import { graveAxeFindings } from './helpers/axe';
import { signUpFreshAccount } from './helpers/session';

/** Pictures to look at, only when asked for: H4_SHOTS=/tmp writes /tmp/h4-*.png. */
async function picture(target: Page | Locator, name: string) {
	const folder = process.env.H4_SHOTS;
	if (folder) await target.screenshot({ path: `${folder}/h4-${name}.png` });
}

async function placeholderCount(page: Page): Promise<number> {
	const line = page.locator('#placeholders-title');
	await expect(line).toContainText("still the example's placeholders");
	return Number(/^(\d+) values/.exec((await line.innerText()).trim())?.[1]);
}

test('example values are marked until edited, and a new currency asks before it touches money', async ({ page }) => {
	test.setTimeout(120_000);
	await signUpFreshAccount(page, { name: 'Maren Ostby', workspace: 'Ostby Tidal Surveys' });
	await page.locator('body[data-hydrated="true"]').waitFor();
	await page.getByRole('region', { name: 'Start from an example' }).getByRole('button', { name: /Tidal stream/ }).click();
	await expect(page).toHaveURL(/\/projects\/[0-9a-f-]{36}$/);
	const projectUrl = page.url();
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await expect(page.getByLabel('Scenario name')).toHaveValue('Base case');

	// The line at the top counts the marks; each marked field says "example value" and names it in its description.
	const before = await placeholderCount(page);
	expect(before).toBeGreaterThan(30);
	const turbines = page.locator('#field-capex-lines-0-amount');
	const foundations = page.locator('#field-capex-lines-1-amount');
	await expect(page.locator('#field-capex-lines-0-amount-example')).toHaveText('example value');
	await expect(turbines).toHaveAttribute('aria-describedby', /field-capex-lines-0-amount-example/);
	await expect(page.locator('#field-resource-bins-example')).toHaveText('example values');
	await picture(page, 'editor-top');
	await picture(page.locator('#financing'), 'financing-marked');
	expect(await graveAxeFindings(page)).toEqual([]);
	await picture(page.locator('#capex'), 'capex-marked');

	// "Go to the first" moves to the speed bins, the first marked value on the page.
	await page.getByRole('link', { name: 'Go to the first' }).click();
	await expect(page.locator('#field-resource-bins')).toBeFocused();

	// Editing the turbines' cost takes its mark away, and only its.
	await turbines.fill('3,000,000');
	await turbines.blur();
	await expect(page.locator('#field-capex-lines-0-amount-example')).toHaveCount(0);
	await expect(page.locator('#field-capex-lines-1-amount-example')).toHaveText('example value');
	expect(await placeholderCount(page)).toBe(before - 1);

	// Keeping the revenue section's values clears its marks without changing a figure.
	const tariff = page.locator('#field-revenue-tariffPerMWh');
	const tariffShown = await tariff.inputValue();
	const revenue = page.locator('#revenue');
	const revenueMarks = await revenue.locator('[id$="-example"]').count();
	expect(revenueMarks).toBeGreaterThan(0);
	await revenue.getByRole('button', { name: 'Keep these values in Revenue' }).click();
	await expect(revenue.locator('[id$="-example"]')).toHaveCount(0);
	await expect(tariff).toHaveValue(tariffShown);
	const afterKeep = before - 1 - revenueMarks;
	expect(await placeholderCount(page)).toBe(afterKeep);

	await page.getByRole('button', { name: 'Save', exact: true }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Saved as revision 2.' })).toBeVisible();
	await page.reload();
	await page.locator('body[data-hydrated="true"]').waitFor();
	expect(await placeholderCount(page)).toBe(afterKeep);
	await expect(page.locator('#field-capex-lines-0-amount-example')).toHaveCount(0);
	await expect(page.locator('#field-capex-lines-1-amount-example')).toHaveText('example value');
	await expect(page.locator('#field-revenue-tariffPerMWh-example')).toHaveCount(0);

	// A new currency: the project page asks first, saying the amounts are not converted by the change itself.
	await page.goto(projectUrl);
	await page.locator('body[data-hydrated="true"]').waitFor();
	await page.getByRole('button', { name: /^Change currency/ }).click();
	await page.getByLabel("Currency of the project's money").fill('USD');
	await picture(page.locator('header', { has: page.getByLabel("Currency of the project's money") }), 'currency-field');
	await page.getByRole('button', { name: 'Change the currency' }).click();
	const question = page.getByRole('alertdialog', { name: 'Change the currency from EUR to USD?' });
	await expect(question).toBeVisible();
	await expect(question).toContainText('does not convert any amount by itself');
	await expect(question).toContainText('Base case:');
	await picture(question, 'currency-confirm');
	expect(await graveAxeFindings(page)).toEqual([]);

	// Confirming without a choice changes nothing: the question stays and says what is missing.
	await question.getByRole('button', { name: 'Change the currency to USD' }).click();
	await expect(question).toBeVisible();
	await question.getByRole('radio', { name: /Convert every amount/ }).check();
	await question.getByLabel('1 EUR =').fill('1.1');
	await question.getByRole('button', { name: 'Change the currency to USD' }).click();
	await expect(page.getByRole('status').filter({ hasText: "The project's currency is now USD." })).toContainText('converted at 1.1 USD per EUR');
	await expect(page.getByText('Tidal stream · USD')).toBeVisible();

	// The scenario reads in dollars, each amount times 1.1, its example marks kept (still the example's figures).
	await page.getByRole('link', { name: 'Base case', exact: true }).click();
	await expect(page.getByLabel('Scenario name')).toHaveValue('Base case');
	await expect(foundations).toHaveValue('1,100,000');
	await expect(turbines).toHaveValue('3,300,000');
	await expect(page.locator('#field-capex-lines-1-amount-unit')).toHaveText('USD/device');
	await expect(page.locator('#field-capex-lines-1-amount-example')).toHaveText('example value');
	await picture(page.locator('#capex'), 'capex-converted');
});
