import { json } from '@sveltejs/kit';
import { markBaseCase } from '$lib/server/db/scenarios';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { scenarioJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';

/** Makes this scenario its project's base case (the previous one loses the mark). */
export const POST: RequestHandler = apiRoute(async (event) => {
	const { user, scenarioId, project } = await authorize(event, event.params, 'analyst');
	requireLiveProject(project);
	const scenario = await markBaseCase(scenarioId, user.id);
	if (!scenario) throw new ApiProblem(404, 'No such scenario, or it is not yours.');
	return json({ scenario: scenarioJson(scenario) });
});
