import { json } from '@sveltejs/kit';
import { evaluateBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { documentToEvaluate, evaluateDocument, loadScenario } from '$lib/server/workbench/evaluation';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { ENGINE_VERSION } from '$lib/server/engine/version';
import type { RequestHandler } from './$types';

/**
 * The engine's result for the saved scenario (empty body: a read, open to
 * viewers; the stored result of its revision) or for an unsaved draft
 * `{ document }` (analysts and owners; evaluated live on the compute pool,
 * never stored, within the user's limit of draft evaluations).
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const body = validateBody(evaluateBody, await readJsonBody(event.request, { optional: true }));
	if (body.document === undefined) {
		// The saved revision: its stored result, validated and computed only when none is stored yet.
		const scenario = await loadScenario(access.scenarioId);
		const saved = await resultOfSavedScenario(scenario, access.project);
		return json({ scenarioId: scenario.id, revision: scenario.revision, source: 'saved', engineVersion: saved.engineVersion, computedAt: saved.computedAt, result: saved.result });
	}
	const { document, source, scenario } = await documentToEvaluate(access, body.document);
	await takeComputeAllowance(access.user.id, 'evaluate-draft');
	return json({ scenarioId: scenario.id, revision: scenario.revision, source, engineVersion: ENGINE_VERSION, result: await evaluateDocument(document) });
});
