import { roleAtLeast } from '$lib/server/auth/roles';
import { authorize, scenarioReadInView } from '$lib/server/auth/access';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { projectJson, scenarioJson } from '$lib/server/workbench/serialize';
import { asJson, type ProjectJson, type ScenarioJson } from '$lib/workbench/api-types';
import type { PageServerLoad } from './$types';

/** The saved scenario to edit; its results come from the evaluate route, fetched by the page. */
export const load: PageServerLoad = async (event) => {
	const { project, membership, scenarioId } = await authorize(event, event.params, 'viewer');
	// Read with its project during the access check: one query for the page.
	const scenario = scenarioReadInView(event, scenarioId) ?? (await loadScenario(scenarioId));
	return {
		project: asJson<ProjectJson>(projectJson(project)),
		scenario: asJson<ScenarioJson>(scenarioJson(scenario)),
		role: membership.role,
		canEdit: roleAtLeast(membership.role, 'analyst')
	};
};
