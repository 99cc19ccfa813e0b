/**
 * The compute pool and its limits against a real database: each user's
 * expensive requests are counted and refused past the limit with 429 and
 * Retry-After; and the health route answers promptly while the pool runs a
 * long calculation.
 */
import { readFileSync } from 'node:fs';
import { json } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { parseScenario } from '../../src/lib/schemas/scenario';
import { DRIVER_IDS } from '../../src/lib/server/engine/sensitivity';
import { COMPUTE_LIMITS, takeComputeAllowance } from '../../src/lib/server/compute/limits';
import { computePool, spiderOnPool } from '../../src/lib/server/compute/pool';
import { ApiProblem, apiRoute } from '../../src/lib/server/workbench/api-route';
import { tornado } from '../../src/lib/server/engine/sensitivity';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { createProject } from '../../src/lib/server/db/projects';
import { createScenario } from '../../src/lib/server/db/scenarios';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { callRoute, newSessionUser } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import * as healthRoute from '../../src/routes/api/v1/health/+server';
import * as evaluateRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/evaluate/+server';
import * as tornadoRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/tornado/+server';

let database: TestDatabase;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(async () => {
	await (await computePool()).close();
	await database.drop();
});

async function useUp(userId: string, action: keyof typeof COMPUTE_LIMITS, times: number) {
	for (let i = 0; i < times; i += 1) await takeComputeAllowance(userId, action);
}

describe('takeComputeAllowance', () => {
	it("lets a user make the limit's number of requests, then refuses with 429 and when to retry", async () => {
		const userId = randomUUID();
		const { points } = COMPUTE_LIMITS.tornado;
		await useUp(userId, 'tornado', points);
		const refusal = await takeComputeAllowance(userId, 'tornado').catch((e: unknown) => e);
		expect(refusal).toBeInstanceOf(ApiProblem);
		const problem = refusal as ApiProblem;
		expect(problem.status).toBe(429);
		expect(problem.message).toMatch(new RegExp(`^Too many tornado runs: each user may make ${points} in a minute\\. Try again in \\d+ seconds?\\.$`));
		const retryAfter = Number(problem.headers['retry-after']);
		expect(retryAfter).toBeGreaterThanOrEqual(1);
		expect(retryAfter).toBeLessThanOrEqual(60);
		expect(problem.details).toEqual({ retryAfterSeconds: retryAfter });
	});

	it('counts each user and each kind of work apart', async () => {
		const busy = randomUUID();
		await useUp(busy, 'spider', COMPUTE_LIMITS.spider.points);
		await expect(takeComputeAllowance(busy, 'spider')).rejects.toBeInstanceOf(ApiProblem);
		await expect(takeComputeAllowance(busy, 'tornado')).resolves.toBeUndefined();
		await expect(takeComputeAllowance(randomUUID(), 'spider')).resolves.toBeUndefined();
	});

	it('answers through the API frame as the usual JSON error with a Retry-After header', async () => {
		const userId = randomUUID();
		await useUp(userId, 'upload', COMPUTE_LIMITS.upload.points);
		const route = apiRoute(async () => {
			await takeComputeAllowance(userId, 'upload');
			return json({ stored: true });
		});
		const response = await route({} as never);
		expect(response.status).toBe(429);
		expect(Number(response.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		const body = await response.json();
		expect(body.error.message).toMatch(/^Too many uploads: each user may make 60 in a minute\. Try again in \d+ seconds?\.$/);
		expect(body.error.issues).toEqual([]);
	});
});

describe('the expensive routes', () => {
	async function tidalScenario() {
		const owner = await newSessionUser(database.knex, 'analyst');
		const workspace = await createWorkspaceWithOwner(`Kestle Analysis ${randomUUID()}`, owner.id, database.knex);
		const project = await createProject({ workspaceId: workspace.id, name: 'Kestle Narrows', technology: 'tidal-stream' }, database.knex);
		const scenario = await createScenario({ projectId: project.id, name: 'Base', document: tidalDocument, userId: owner.id }, database.knex);
		return { owner, scenarioId: scenario.id };
	}

	it("answer the engine's figures computed on the pool: a draft evaluation and a tornado", async () => {
		const { owner, scenarioId } = await tidalScenario();
		const draft = { ...tidalDocument, array: { ...tidalDocument.array, availability: 0.9 } };
		const evaluated = await callRoute(evaluateRoute.POST, owner, { method: 'POST', path: `/api/v1/scenarios/${scenarioId}/evaluate`, params: { scenarioId }, body: { document: draft } });
		expect(evaluated.status).toBe(200);
		expect((await evaluated.json()).result).toEqual(JSON.parse(JSON.stringify(evaluateScenario(draft))));

		const drivers = [{ driver: 'capex' as const, low: 0.8, high: 1.2 }];
		const tornadoAnswer = await callRoute(tornadoRoute.POST, owner, { method: 'POST', path: `/api/v1/scenarios/${scenarioId}/tornado`, params: { scenarioId }, body: { metric: 'lcoeReal', drivers } });
		expect(tornadoAnswer.status).toBe(200);
		expect((await tornadoAnswer.json()).tornado).toEqual(tornado(tidalDocument, drivers, 'lcoeReal'));
	});

	it("refuse a user's tornado past the limit with 429, Retry-After and the usual error shape", async () => {
		const { owner, scenarioId } = await tidalScenario();
		await useUp(owner.id, 'tornado', COMPUTE_LIMITS.tornado.points);
		const call = { method: 'POST', path: `/api/v1/scenarios/${scenarioId}/tornado`, params: { scenarioId }, body: { drivers: [{ driver: 'capex', low: 0.8, high: 1.2 }] } };
		const refused = await callRoute(tornadoRoute.POST, owner, call);
		expect(refused.status).toBe(429);
		expect(Number(refused.headers.get('retry-after'))).toBeGreaterThanOrEqual(1);
		const body = await refused.json();
		expect(body.error.message).toMatch(/^Too many tornado runs: each user may make 30 in a minute\. Try again in \d+ seconds?\.$/);
		expect(body.error.retryAfterSeconds).toBe(Number(refused.headers.get('retry-after')));
		// A body the route refuses anyway costs nothing: it still answers 422, not 429.
		const bad = await callRoute(tornadoRoute.POST, owner, { ...call, body: { metric: 'no-such-metric' } });
		expect(bad.status).toBe(422);
	});
});

describe('the health route under compute load', () => {
	it('answers within 100 ms each of 10 times while the pool runs a calculation of over a second', async () => {
		const parsed = parseScenario(JSON.parse(readFileSync('examples/tidal-stream-kestle-narrows.json', 'utf8')));
		if (!parsed.ok) throw new Error('the tidal example should parse');
		const document = parsed.scenario;
		// The thread up and its code loaded, and the database connection made, before measuring.
		await spiderOnPool(document, ['capex'], 'lcoeReal', [0, 0.1]);
		await healthRoute.GET({} as never);

		let finishedAt = Infinity;
		const heavy = spiderOnPool(document, [...DRIVER_IDS], 'equityIrr', Array.from({ length: 21 }, (_, i) => Number((-0.5 + i * 0.05).toFixed(2)))).then(() => {
			finishedAt = performance.now();
		});
		await new Promise((resolve) => setTimeout(resolve, 100));
		const timings: number[] = [];
		for (let i = 0; i < 10; i += 1) {
			const started = performance.now();
			const response = await healthRoute.GET({} as never);
			timings.push(performance.now() - started);
			expect(response.status).toBe(200);
		}
		const lastAnswerAt = performance.now();
		await heavy;
		// Every answer came while the calculation was still running.
		expect(finishedAt).toBeGreaterThan(lastAnswerAt);
		expect(Math.max(...timings)).toBeLessThan(100);
	});
});
