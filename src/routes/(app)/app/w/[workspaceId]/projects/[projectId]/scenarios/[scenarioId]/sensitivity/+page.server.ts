import { error } from '@sveltejs/kit';
import { parseScenario } from '$lib/schemas/scenario';
import { authorize } from '$lib/server/auth/access';
import { getScenarioById } from '$lib/server/db/scenarios';
import { getStoredResult } from '$lib/server/db/scenario-results';
import { ENGINE_VERSION } from '$lib/server/engine/version';
import { sensitivityChoices } from '$lib/server/analysis/sensitivity-choices';
import type { PageServerLoad } from './$types';

/** The scenario and the drivers to offer, with the engine's usual ranges; the runs themselves go through the API from the page. */
export const load: PageServerLoad = async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	const scenario = await getScenarioById(event.params.scenarioId);
	if (!scenario) error(404, 'No such scenario, or it is not yours.');
	const parsed = parseScenario(scenario.document);
	// The base run's cover shortfalls, beside the minimum DSCR: read from the stored result of this revision (a load never computes).
	const stored = await getStoredResult(scenario.id, scenario.revision, ENGINE_VERSION);
	return {
		project: { id: project.id, name: project.name, currency: project.currency },
		scenario: { id: scenario.id, name: scenario.name, revision: scenario.revision, isBaseCase: scenario.isBaseCase, archived: scenario.archivedAt !== null },
		role: membership.role,
		drivers: parsed.ok ? sensitivityChoices(parsed.scenario) : [],
		baseCoverShortfalls: stored?.result.coverShortfalls ?? null,
		documentProblem: parsed.ok ? null : 'The saved scenario document does not pass the schema check, so it cannot be varied. Open it in the editor to fix it.'
	};
};
