import { json } from '@sveltejs/kit';
import { listScenarioRevisions } from '$lib/server/db/scenarios';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import type { RequestHandler } from './$types';

/** The history, newest first: who changed which sections when (documents at .../revisions/N). */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { scenarioId } = await authorize(event, event.params, 'viewer');
	return json({ revisions: await listScenarioRevisions(scenarioId) });
});
