/**
 * A member makes a personal API token in the browser, the worked example in
 * docs/ (curl + jq) lists projects and evaluates a scenario with it, a
 * read-only token is refused writes, a revoked token gets 401, and the owner
 * sees the token's calls in the security log.
 */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { expect, test, type Page } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { newSignedInPage } from './helpers/session';
import { openPage } from './helpers/page';

const run = promisify(execFile);

async function createToken(page: Page, name: string, access: 'Read only' | 'Read and write'): Promise<string> {
	await openPage(page, '/app/account');
	await page.getByLabel('Token name').fill(name);
	await page.getByLabel('Access').selectOption({ label: access });
	await page.getByRole('button', { name: 'Create the token' }).click();
	const shown = page.getByTestId('new-token');
	await expect(shown).toBeVisible();
	const token = (await shown.textContent())?.trim() ?? '';
	expect(token).toMatch(/^tw_[a-z2-7]{32}$/);
	await expect(page.getByRole('table', { name: 'Your API tokens' }).getByRole('row', { name: new RegExp(name) })).toContainText(token.slice(0, 7));
	return token;
}

async function api(token: string, path: string, init: RequestInit = {}) {
	return fetch(`${baseURL}${path}`, { ...init, headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json', ...init.headers } });
}

test('a token made in the browser drives the worked example script, and stops when revoked', async ({ browser }) => {
	const page = await newSignedInPage(browser, 'analyst');
	const token = await createToken(page, 'Example script', 'Read only');

	const { stdout } = await run('bash', ['docs/api-example.sh'], { env: { ...process.env, TIDEWRIGHT_TOKEN: token, TIDEWRIGHT_URL: baseURL } });
	expect(stdout).toContain('Projects in Halvard Marine Energy:');
	expect(stdout).toMatch(/^  .+, revision \d+ \(engine \d+\):$/m);
	expect(stdout).toMatch(/Equity IRR\s+\d+(\.\d+)? %/);
	expect(stdout).toMatch(/LCOE, real\s+\d+(\.\d+)? EUR\/MWh/);
	expect(stdout).not.toContain('Corvane');

	// A read-only token reads, never writes.
	const workspaces = await (await api(token, '/api/v1/workspaces')).json();
	expect(workspaces.workspaces).toHaveLength(1);
	const refused = await api(token, `/api/v1/workspaces/${workspaces.workspaces[0].id}/projects`, {
		method: 'POST',
		body: JSON.stringify({ name: 'Should not exist', technology: 'wave' })
	});
	expect(refused.status).toBe(403);
	expect((await refused.json()).error.message).toMatch(/read-only/);

	// Revoked in the browser: the script's next call gets 401.
	await openPage(page, '/app/account');
	await page.getByRole('button', { name: 'Revoke token Example script' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'revoked' })).toBeVisible();
	const afterRevoke = await api(token, '/api/v1/workspaces');
	expect(afterRevoke.status).toBe(401);
	expect(afterRevoke.headers.get('www-authenticate')).toContain('Bearer');
	await expect(run('bash', ['docs/api-example.sh'], { env: { ...process.env, TIDEWRIGHT_TOKEN: token, TIDEWRIGHT_URL: baseURL } })).rejects.toThrow();

	const owner = await newSignedInPage(browser, 'owner');
	await openPage(owner, '/app');
	const workspacePath = new URL(owner.url()).pathname;
	await openPage(owner, `${workspacePath}/audit?group=tokens`);
	const log = owner.getByRole('table', { name: 'Security events' });
	await expect(log).toContainText('Called the API with a token');
	await expect(log).toContainText(/GET \/api\/v1\/workspaces → 200 with token "Example script"/);
	await expect(log).toContainText('Created an API token');
	await expect(log).toContainText('Revoked an API token');
	// The revoked token's later call is refused and logged too.
	await expect(log).toContainText(/refused: token "Example script" is revoked/);
	await expect(log).not.toContainText('Signed in');
	await page.context().close();
	await owner.context().close();
});

test('a viewer can only make a read-only token, and a read-write token of an analyst writes', async ({ browser }) => {
	const viewer = await newSignedInPage(browser, 'viewer');
	await openPage(viewer, '/app/account');
	await viewer.getByLabel('Token name').fill('Viewer wants to write');
	await viewer.getByLabel('Access').selectOption({ label: 'Read and write' });
	await viewer.getByRole('button', { name: 'Create the token' }).click();
	await expect(viewer.getByText(/a token there can only read/)).toBeVisible();
	await expect(viewer.getByTestId('new-token')).toHaveCount(0);

	const analyst = await newSignedInPage(browser, 'analyst');
	const token = await createToken(analyst, 'Writer', 'Read and write');
	const [workspace] = (await (await api(token, '/api/v1/workspaces')).json()).workspaces;
	const created = await api(token, `/api/v1/workspaces/${workspace.id}/projects`, {
		method: 'POST',
		body: JSON.stringify({ name: `Token-made array ${Date.now().toString(36)}`, technology: 'wave' })
	});
	expect(created.status).toBe(201);
	const { project } = await created.json();
	// The analyst's token is not an owner's: deleting a project needs the owner role.
	expect((await api(token, `/api/v1/projects/${project.id}`, { method: 'DELETE' })).status).toBe(403);
	await viewer.context().close();
	await analyst.context().close();
});
