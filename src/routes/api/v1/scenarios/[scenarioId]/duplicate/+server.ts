import { json } from '@sveltejs/kit';
import { duplicateScenario } from '$lib/server/db/scenarios';
import { duplicateScenarioBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { scenarioJson } from '$lib/server/workbench/serialize';
import { storeResultOfSave } from '$lib/server/workbench/stored-results';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';

/** A copy of the saved scenario at revision 1 (body optional: `{ name, notes }`). */
export const POST: RequestHandler = apiRoute(async (event) => {
	const { user, scenarioId, project } = await authorize(event, event.params, 'analyst');
	requireLiveProject(project);
	const body = validateBody(duplicateScenarioBody, await readJsonBody(event.request, { optional: true }));
	const copy = await duplicateScenario(scenarioId, { ...body, userId: user.id });
	if (!copy) throw new ApiProblem(404, 'No such scenario, or it is not yours.');
	await storeResultOfSave(copy, project);
	return json({ scenario: scenarioJson(copy) }, { status: 201 });
});
