import { roleAtLeast } from '$lib/server/auth/roles';
import { authorize, scenarioReadInView } from '$lib/server/auth/access';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { validateDocument } from '$lib/server/workbench/api-route';
import { assumptionSections } from '$lib/server/pdf/assumptions';
import { projectJson, scenarioJson } from '$lib/server/workbench/serialize';
import type { PageServerLoad } from './$types';

/**
 * The saved scenario to edit; its results come from the evaluate route, fetched by the page.
 * A viewer also gets the assumptions in words (from the stored result), read instead of a wall of disabled fields.
 */
export const load: PageServerLoad = async (event) => {
	const { project, membership, scenarioId } = await authorize(event, event.params, 'viewer');
	// Read with its project during the access check: one query for the page.
	const scenario = scenarioReadInView(event, scenarioId) ?? (await loadScenario(scenarioId));
	const canEdit = roleAtLeast(membership.role, 'analyst');
	return {
		project: projectJson(project),
		scenario: scenarioJson(scenario),
		role: membership.role,
		canEdit,
		assumptions: canEdit ? null : await viewerAssumptions(scenario, project)
	};
};

/** The assumptions in words of the saved revision; null when the document or its result cannot be had (the fields show instead). */
async function viewerAssumptions(scenario: Parameters<typeof resultOfSavedScenario>[0], project: { technology: string }) {
	try {
		const document = validateDocument(scenario.document, project);
		const { result } = await resultOfSavedScenario(scenario, project);
		return assumptionSections(document, result);
	} catch {
		return null;
	}
};
