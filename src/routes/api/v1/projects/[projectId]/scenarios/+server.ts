import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { createScenario, listScenariosPage } from '$lib/server/db/scenarios';
import { createScenarioBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { exactTimestampPattern } from '$lib/server/db/keyset';
import { ApiProblem, apiRoute, readJsonBody, validateBody, validateDocument, withName } from '$lib/server/workbench/api-route';
import { projectJson, scenarioJson, scenarioSummaryJson } from '$lib/server/workbench/serialize';
import { starterDocument } from '$lib/server/workbench/starter-documents';
import { acceptedPlaceholderPaths, placeholderPathsOf } from '$lib/workbench/placeholders';
import { nextCursor, readPageRequest } from '$lib/server/workbench/paging';
import { storeResultOfSave, storedKeyFigures } from '$lib/server/workbench/stored-results';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';

const scenarioKey = z.tuple([z.boolean(), z.string(), z.string().regex(exactTimestampPattern), z.uuid()]);

/**
 * The project's scenarios without their documents, with their stored key
 * figures, the base case first, a page at a time (`?limit=`, `?cursor=`);
 * `?archived=1` lists the archived ones.
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { project } = await authorize(event, event.params, 'viewer');
	const archived = event.url.searchParams.get('archived') === '1';
	const page = await listScenariosPage(project.id, { archived, ...readPageRequest(event.url, 'scenarios', scenarioKey) });
	const figures = await storedKeyFigures(page.items);
	return json({
		project: projectJson(project),
		scenarios: page.items.map((s) => ({ ...scenarioSummaryJson(s), keyFigures: figures[s.id] })),
		nextCursor: nextCursor('scenarios', page.nextKey)
	});
});

/**
 * A new scenario from the document sent, or from the starter document of the
 * project's technology, whose figures are then marked as the example's
 * placeholders (a sent document's marks are the `placeholderPaths` sent).
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const { project, user } = await authorize(event, event.params, 'analyst');
	requireLiveProject(project);
	const body = validateBody(createScenarioBody, await readJsonBody(event.request));
	const candidate = body.document !== undefined ? body.document : starterDocument(project.technology, { name: body.name, currency: project.currency, siteName: project.site_name });
	if (candidate === undefined) {
		throw new ApiProblem(422, 'Send a scenario document: there is no starter document for this technology.', [
			{ path: 'document', message: 'required' }
		]);
	}
	const document = validateDocument(withName(candidate, body.name), project);
	const placeholderPaths = acceptedPlaceholderPaths(document, body.document === undefined ? placeholderPathsOf(candidate) : (body.placeholderPaths ?? []));
	const scenario = await createScenario({ projectId: project.id, name: body.name, notes: body.notes, document, placeholderPaths, userId: user.id });
	await storeResultOfSave(scenario, project);
	return json({ scenario: scenarioJson(scenario) }, { status: 201 });
});
