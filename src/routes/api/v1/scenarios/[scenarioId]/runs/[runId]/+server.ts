import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { runOfScenario, runView } from '$lib/server/probabilistic/run-requests';
import type { RequestHandler } from './$types';

/** One run: its input, state, progress (draws done, time left) and, once done, its summary. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const run = await runOfScenario(access, event.params.runId);
	return json({ run: runView(run) }, { headers: { 'cache-control': 'no-store' } });
});
