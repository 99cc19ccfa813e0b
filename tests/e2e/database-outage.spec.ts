import { e2eClusterDir, e2ePgPort } from '../../playwright.config';
import { signInPage } from './helpers/session';
import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';

// Stops and restarts the browser tests' own cluster (see playwright.config.ts).
function cluster(command: 'start' | 'stop') {
	execFileSync('npx', ['tsx', 'docker-local/postgres.ts', command], {
		env: { ...process.env, PGPORT_LOCAL: String(e2ePgPort), PG_DATA_DIR: e2eClusterDir },
		stdio: 'pipe'
	});
}

test('a database outage turns health to 503 and the pages to a clear error, then recovers', async ({ page, request }) => {
	await signInPage(page, 'viewer');
	const workspaceId = new URL(page.url()).pathname.split('/')[3];
	cluster('stop');
	try {
		const down = await request.get('/api/v1/health');
		expect(down.status()).toBe(503);
		expect(await down.json()).toMatchObject({ db: 'down' });

		// The API keeps its one error shape, with a status that says "try again", not a crash.
		// (Who is asking may still come from the few-second session cache; the projects must come from the database.)
		const projects = await page.request.get(`/api/v1/workspaces/${workspaceId}/projects`);
		expect(projects.status()).toBe(503);
		expect(await projects.json()).toMatchObject({ error: { message: expect.stringContaining('database is not answering'), issues: [] } });

		await page.reload();
		await expect(page.getByRole('alert')).toContainText('not answering');
		await expect(page.getByRole('alert')).toContainText('database is not answering');
	} finally {
		cluster('start');
	}

	await expect.poll(async () => (await request.get('/api/v1/health')).status(), { timeout: 15_000 }).toBe(200);
	await page.reload();
	await expect(page.getByRole('heading', { name: 'Kestle Narrows Tidal Array' })).toBeVisible();
});
