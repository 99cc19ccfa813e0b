/**
 * Headroom: long calculations run on the compute pool's worker threads
 * (src/lib/server/compute/pool.ts), so the request thread stays free for
 * everyone else. While four tornado runs on the tidal example are in flight,
 * the health route answers within 100 ms, ten times over.
 */
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { baseURL } from '../../playwright.config';
import { signedInRequest, workspaceIdOf } from './helpers/session';
import { DEMO_WORKSPACE, newProject, newScenario, uniqueName } from './helpers/workbench';

const tidalExample = JSON.parse(readFileSync('examples/tidal-stream-kestle-narrows.json', 'utf8'));

test('the health route answers within 100 ms each of 10 times while 4 tornado runs are in flight', async ({ playwright }) => {
	const analyst = await signedInRequest(playwright, baseURL, 'analyst');
	const anonymous = await playwright.request.newContext({ baseURL });
	try {
		const project = await newProject(analyst, await workspaceIdOf(analyst, DEMO_WORKSPACE), { name: uniqueName('Headroom'), technology: 'tidal-stream' });
		const scenario = await newScenario(analyst, project.id, { name: 'Kestle Narrows example', document: tidalExample });
		const tornadoPath = `/api/v1/scenarios/${scenario.id}/tornado`;
		// The pool's thread up and the health route's database connection made before measuring.
		expect((await analyst.post(tornadoPath, { data: { drivers: [{ driver: 'capex', low: 0.9, high: 1.1 }] } })).status()).toBe(200);
		expect((await anonymous.get('/api/v1/health')).status()).toBe(200);

		let settled = 0;
		const tornados = Array.from({ length: 4 }, () =>
			analyst.post(tornadoPath, { data: { metric: 'equityIrr' } }).then((response) => {
				settled += 1;
				return response;
			})
		);
		await new Promise((resolve) => setTimeout(resolve, 50));
		const timings: number[] = [];
		for (let i = 0; i < 10; i += 1) {
			const started = performance.now();
			const health = await anonymous.get('/api/v1/health');
			timings.push(performance.now() - started);
			expect(health.status()).toBe(200);
		}
		const inFlight = 4 - settled;
		for (const answer of await Promise.all(tornados)) expect(answer.status(), await answer.text()).toBe(200);
		expect(inFlight, 'tornado runs still in flight when the last health answer came').toBeGreaterThan(0);
		expect(Math.max(...timings), `health answered in ${timings.map((t) => t.toFixed(0)).join(', ')} ms`).toBeLessThan(100);
	} finally {
		await Promise.all([analyst.dispose(), anonymous.dispose()]);
	}
});
