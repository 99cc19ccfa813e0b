import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { runInputSchema } from '$lib/schemas/probabilistic';
import { runListView, runView, scenarioRuns, startScenarioRun } from '$lib/server/probabilistic/run-requests';
import type { RequestHandler } from './$types';

/** The scenario's probabilistic runs, newest first, with their progress. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const runs = await scenarioRuns(access);
	return json({ scenarioId: access.scenarioId, runs: runs.map((r) => runListView(r)) });
});

/**
 * Starts a probabilistic run of the saved scenario: `{ drivers, energyUncertainty, correlations, seed, draws, hurdleRate }`.
 * Answers 202 with the queued run; workers draw it (GET the run for its progress).
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'analyst');
	const run = await startScenarioRun(access, validateBody(runInputSchema, await readJsonBody(event.request)));
	return json({ run: runView(run) }, { status: 202 });
});
