import { json } from '@sveltejs/kit';
import { saveScenario } from '$lib/server/db/scenarios';
import { updateScenarioBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute, readJsonBody, validateBody, validateDocument, withName } from '$lib/server/workbench/api-route';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { projectJson, scenarioJson } from '$lib/server/workbench/serialize';
import { storeResultOfSave } from '$lib/server/workbench/stored-results';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';
import { actorOf, recordWorkspaceEvent, scenarioDetail } from '$lib/server/workbench/audit-trail';
import { deleteArchivedScenarioAs } from '$lib/server/workbench/project-lifecycle';

export const GET: RequestHandler = apiRoute(async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	const scenario = await loadScenario(event.params.scenarioId);
	return json({ scenario: scenarioJson(scenario), project: projectJson(project), role: membership.role });
});

/**
 * Saves name, notes and/or document as a new revision. `revision` is the one
 * the user was editing; when someone saved since, the answer is 409 and
 * nothing is written.
 */
export const PUT: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'analyst');
	const { project, user, scenarioId } = access;
	requireLiveProject(project);
	const body = validateBody(updateScenarioBody, await readJsonBody(event.request));
	const current = await loadScenario(scenarioId);
	const name = body.name ?? current.name;
	const document = body.document === undefined ? undefined : validateDocument(withName(body.document, name), project);
	const saved = await saveScenario({
		scenarioId,
		expectedRevision: body.revision,
		name: body.name,
		notes: body.notes,
		document,
		placeholderPaths: body.placeholderPaths,
		userId: user.id
	});
	if (!saved) throw new ApiProblem(404, 'No such scenario, or it is not yours.');
	await storeResultOfSave(saved, project);
	// A save that changed nothing wrote no revision, and is no event.
	if (saved.revision !== body.revision) await recordWorkspaceEvent(actorOf(event, access), 'scenario-saved', { ...scenarioDetail(project, saved), revision: saved.revision });
	return json({ scenario: scenarioJson(saved) });
});

/** Deletes for good, with its history: owners only, and only a scenario archived first. */
export const DELETE: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'owner');
	requireLiveProject(access.project);
	const outcome = await deleteArchivedScenarioAs(actorOf(event, access), access.project, access.scenarioId);
	if (outcome === 'not-archived') throw new ApiProblem(409, 'Archive the scenario before deleting it for good.');
	if (outcome === 'missing') throw new ApiProblem(404, 'No such scenario, or it is not yours.');
	return new Response(null, { status: 204 });
});
