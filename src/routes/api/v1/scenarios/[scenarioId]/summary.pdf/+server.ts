import { authorize } from '$lib/server/auth/access';
import { apiRoute, validateDocument } from '$lib/server/workbench/api-route';
import { loadScenario, runEngine } from '$lib/server/workbench/evaluation';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { defaultDrivers } from '$lib/server/engine/sensitivity';
import { renderSummaryPdfOnPool, tornadoOnPool } from '$lib/server/compute/pool';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { summaryPdfResponse, teamCopyInput } from '$lib/server/pdf/summary-input';
import type { RequestHandler } from './$types';

/**
 * The team's PDF summary of the saved revision: cover, key metrics,
 * assumptions, the cash-flow table, charts (with a tornado of the real LCOE
 * over the usual screening ranges) and the method notes, the cautions on
 * every page. Drawn on the compute pool.
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { project, scenarioId, user } = await authorize(event, event.params, 'viewer');
	const scenario = await loadScenario(scenarioId);
	await takeComputeAllowance(user.id, 'export');
	const { result, engineVersion } = await resultOfSavedScenario(scenario, project);
	const document = validateDocument(scenario.document, project);
	const tornado = await runEngine(() => tornadoOnPool(document, defaultDrivers(document), 'lcoeReal'));
	const pdf = await renderSummaryPdfOnPool(
		teamCopyInput({
			project,
			scenario: { name: scenario.name, revision: scenario.revision, notes: scenario.notes },
			document,
			result,
			engineVersion,
			tornado,
			date: new Date()
		})
	);
	return summaryPdfResponse(pdf, scenario.name, scenario.revision);
});
