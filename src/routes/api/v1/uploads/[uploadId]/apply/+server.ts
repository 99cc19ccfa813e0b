import { json } from '@sveltejs/kit';
import { isUuid } from '$lib/server/auth/access';
import { getScenarioPlace, saveScenario } from '$lib/server/db/scenarios';
import { getUploadById } from '$lib/server/db/uploads';
import { applyUploadBody, uploadKindInfo } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute, readJsonBody, validateBody, validateDocument } from '$lib/server/workbench/api-route';
import { applyUploadToDocument } from '$lib/server/workbench/apply-upload';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { scenarioJson } from '$lib/server/workbench/serialize';
import { storeResultOfSave } from '$lib/server/workbench/stored-results';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';
import { actorOf, recordWorkspaceEvent, scenarioDetail } from '$lib/server/workbench/audit-trail';

/**
 * `?scenarioId=`: puts the upload's parsed data into that scenario's document
 * (resource or device) as a new revision. Body optional: `{ revision }` to
 * refuse the change when the scenario moved on since the user looked at it.
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'analyst');
	const { project, user, uploadId } = access;
	requireLiveProject(project);
	const body = validateBody(applyUploadBody, await readJsonBody(event.request, { optional: true }));
	const scenarioId = event.url.searchParams.get('scenarioId') ?? '';
	const place = isUuid(scenarioId) ? await getScenarioPlace(scenarioId) : undefined;
	if (!place || place.projectId !== project.id) {
		throw new ApiProblem(404, 'Choose a scenario of the same project to apply this upload to.', [
			{ path: 'scenarioId', message: scenarioId === '' ? 'required' : 'no such scenario in this project' }
		]);
	}
	const upload = (await getUploadById(uploadId))!;
	const scenario = await loadScenario(scenarioId);
	const applied = applyUploadToDocument(scenario.document, upload.kind, upload.parsed.data);
	if (!applied.ok) throw new ApiProblem(422, applied.message, [{ path: 'scenarioId', message: applied.message }]);
	const document = validateDocument(applied.document, project);
	const saved = await saveScenario({
		scenarioId,
		expectedRevision: body.revision ?? scenario.revision,
		document,
		// The upload's data replaces the section: none of its values is the example's any more.
		replacedPart: applied.section,
		userId: user.id,
		summary: `Applied ${uploadKindInfo[upload.kind].label.toLowerCase()} "${upload.fileName}" to ${applied.section}`
	});
	if (!saved) throw new ApiProblem(404, 'No such scenario, or it is not yours.');
	await storeResultOfSave(saved, project);
	await recordWorkspaceEvent(actorOf(event, access), 'upload-applied', {
		...scenarioDetail(project, saved),
		revision: saved.revision,
		upload: upload.fileName,
		uploadId,
		kind: uploadKindInfo[upload.kind].label,
		section: applied.section
	});
	return json({ scenario: scenarioJson(saved), section: applied.section });
});
