import { json } from '@sveltejs/kit';
import { getScenarioRevisionDocument } from '$lib/server/db/scenarios';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import type { RequestHandler } from './$types';

/** The document as it was saved at one revision. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { scenarioId } = await authorize(event, event.params, 'viewer');
	const revision = /^\d{1,9}$/.test(event.params.revision) ? Number(event.params.revision) : NaN;
	const document = Number.isInteger(revision) ? await getScenarioRevisionDocument(scenarioId, revision) : undefined;
	if (!document) throw new ApiProblem(404, `This scenario has no revision ${event.params.revision}.`);
	return json({ revision, document });
});
