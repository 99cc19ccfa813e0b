import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { cancelScenarioRun, runView } from '$lib/server/probabilistic/run-requests';
import type { RequestHandler } from './$types';

/** Cancels a waiting or running run: draws already made are kept, no more are made. */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'analyst');
	const run = await cancelScenarioRun(access, event.params.runId);
	return json({ run: runView(run) });
});
