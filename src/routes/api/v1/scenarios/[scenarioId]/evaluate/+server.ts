import { json } from '@sveltejs/kit';
import { evaluateBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { documentToEvaluate, evaluateDocument } from '$lib/server/workbench/evaluation';
import type { RequestHandler } from './$types';

/**
 * The engine's result for the saved scenario (empty body: a read, open to
 * viewers) or for an unsaved draft `{ document }` (analysts and owners).
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const body = validateBody(evaluateBody, await readJsonBody(event.request, { optional: true }));
	const { document, source, scenario } = await documentToEvaluate(access, body.document);
	const result = evaluateDocument(document);
	return json({ scenarioId: scenario.id, revision: scenario.revision, source, result });
});
