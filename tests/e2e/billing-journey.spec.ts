/**
 * The owner's billing journey in Chromium against the local Stripe stand-in:
 * upgrade a free workspace through checkout, invite up to the seats and be
 * refused beyond them, add a seat (priced first), cancel at period end, let
 * the stand-in's clock pass the period end, meet the plan's gate, pay again
 * and find the workspace open again.
 */
import { expect, test, type Page } from '@playwright/test';
import { baseURL, stripeStandinPort } from '../../playwright.config';
import { freeDemoWorkspace } from '../../seeds/05_plans_and_billing';
import { newSignedInPage, signedInRequest, workspaceIdOf } from './helpers/session';
import { openPage } from './helpers/page';

const standin = `http://127.0.0.1:${stripeStandinPort}`;

async function payAtStandinCheckout(page: Page, seatsField: string, seats: number) {
	await page.getByLabel(seatsField).fill(String(seats));
	await page.getByRole('button', { name: 'Continue to checkout' }).first().click();
	await expect(page.getByRole('heading', { name: 'Local Stripe stand-in checkout' })).toBeVisible();
	await page.getByRole('button', { name: 'Pay with the test card' }).click();
	await expect(page).toHaveURL(/\/billing\?checkout=cs_/);
	await expect(page.getByRole('status').filter({ hasText: 'the plan is paid' })).toBeVisible();
}

test('an owner upgrades, meets the seat limit, adds a seat, cancels, lapses, is gated and pays again', async ({ browser, playwright }) => {
	test.setTimeout(120_000);
	const owner = await newSignedInPage(browser, 'owner');
	const api = await signedInRequest(playwright, baseURL, 'owner');
	try {
		const workspaceId = await workspaceIdOf(api, freeDemoWorkspace.name);
		const billing = `/app/w/${workspaceId}/billing`;

		// Free to Team with two seats, through the stand-in's checkout page.
		await openPage(owner, billing);
		await expect(owner.getByTestId('plan-name')).toHaveText('Free');
		await expect(owner.getByTestId('offer-team')).toContainText('€49.00');
		await payAtStandinCheckout(owner, 'Seats (1 to 200)', 2);
		await expect(owner.getByTestId('plan-name')).toHaveText('Team');
		await expect(owner.getByTestId('seats-paid')).toHaveText('2');
		await expect(owner.getByTestId('invoices').locator('tbody tr')).toHaveCount(1);

		// The owner holds one seat; one analyst fits, a second does not (a viewer would).
		await openPage(owner, `/app/w/${workspaceId}/members`);
		await owner.getByLabel('E-mail').fill('first.analyst@penrow.example');
		await owner.getByLabel('Role', { exact: true }).selectOption('analyst');
		await owner.getByRole('button', { name: 'Send invitation' }).click();
		await expect(owner.getByText('Invitation sent to first.analyst@penrow.example')).toBeVisible();
		await owner.getByLabel('E-mail').fill('second.analyst@penrow.example');
		await owner.getByLabel('Role', { exact: true }).selectOption('analyst');
		await owner.getByRole('button', { name: 'Send invitation' }).click();
		const refusal = owner.getByRole('alert').filter({ hasText: 'All 2 seats of this workspace are taken' });
		await expect(refusal).toBeVisible();
		await refusal.getByRole('link', { name: 'Add seats' }).click();

		// Three seats: priced first, then confirmed; the difference is invoiced at once.
		await expect(owner).toHaveURL(new RegExp(`${billing}$`));
		await owner.getByLabel('Seats', { exact: true }).fill('3');
		await owner.getByRole('button', { name: 'Price this change' }).click();
		await expect(owner.getByTestId('seat-preview')).toContainText('From 2 to 3 seats');
		await expect(owner.getByTestId('seat-preview')).toContainText('€147.00 each period');
		await owner.getByRole('button', { name: 'Confirm 3 seats' }).click();
		await expect(owner.getByText('Seats changed to 3.')).toBeVisible();
		await expect(owner.getByTestId('seats-paid')).toHaveText('3');
		await expect(owner.getByTestId('invoices').locator('tbody tr')).toHaveCount(2);

		// Four live projects are fine on Team.
		for (let i = 1; i <= 4; i++) {
			const made = await api.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: `Penrow array ${i}`, technology: 'tidal-stream' } });
			expect(made.status()).toBe(201);
		}

		// Cancel at period end; the stand-in's clock passes the period end; the plan lapses.
		await owner.getByRole('button', { name: 'Cancel at the end of this period' }).click();
		await expect(owner.getByRole('button', { name: 'Resume the plan' })).toBeVisible();
		const advanced = await fetch(`${standin}/_standin/clock/advance`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ seconds: 40 * 24 * 3600 }) });
		expect(advanced.ok).toBe(true);
		await expect
			.poll(async () => {
				await owner.reload();
				return owner.getByTestId('plan-name').textContent();
			})
			.toBe('Free');
		await expect(owner.getByTestId('plan-standing')).toContainText('The Team plan is not paid');

		// The gate: a fifth live project is refused in words, with the way to the billing page; the API says 402.
		await openPage(owner, `/app/w/${workspaceId}`);
		await owner.getByRole('button', { name: 'New project' }).click();
		await owner.getByLabel('Project name').fill('Penrow array 5');
		await owner.getByRole('button', { name: 'Create project' }).click();
		const gate = owner.getByRole('alert').filter({ hasText: "This workspace's Team plan is not paid" });
		await expect(gate).toBeVisible();
		await expect(gate).toContainText('nothing was deleted');
		await expect(gate.getByRole('link', { name: 'Plan and billing' })).toHaveAttribute('href', billing);
		const refused = await api.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: 'Penrow array 5', technology: 'wave' } });
		expect(refused.status()).toBe(402);
		expect((await refused.json()).error).toMatchObject({ billingUrl: billing });

		// Paying again reopens it.
		await openPage(owner, billing);
		await payAtStandinCheckout(owner, 'Seats (1 to 200)', 3);
		await expect(owner.getByTestId('plan-name')).toHaveText('Team');
		const reopened = await api.post(`/api/v1/workspaces/${workspaceId}/projects`, { data: { name: 'Penrow array 5', technology: 'wave' } });
		expect(reopened.status()).toBe(201);
	} finally {
		await api.dispose();
		await owner.close();
	}
});

test('billing is for owners: an analyst of a paid workspace is refused the page', async ({ browser }) => {
	const analyst = await newSignedInPage(browser, 'analyst');
	try {
		const response = await analyst.goto('/app');
		expect(response?.ok()).toBe(true);
		const workspacePath = new URL(analyst.url()).pathname;
		const billing = await analyst.goto(`${workspacePath}/billing`);
		expect(billing?.status()).toBe(403);
		await expect(analyst.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Billing' })).toHaveCount(0);
	} finally {
		await analyst.close();
	}
});
