import { authorize } from '$lib/server/auth/access';
import { apiRoute, validateDocument } from '$lib/server/workbench/api-route';
import { loadScenario, runEngine } from '$lib/server/workbench/evaluation';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { defaultDrivers } from '$lib/server/engine/sensitivity';
import { renderSummaryPdfOnPool, tornadoOnPool } from '$lib/server/compute/pool';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { summaryPdfResponse, teamCopyInput } from '$lib/server/pdf/summary-input';
import { planAllows } from '$lib/billing/plans';
import { latestDoneRunsInFull } from '$lib/server/rooms/publishable-runs';
import { freezeRun } from '$lib/server/rooms/snapshot-run';
import { actorOf, recordWorkspaceEvent, scenarioDetail } from '$lib/server/workbench/audit-trail';
import type { RequestHandler } from './$types';

/**
 * The team's PDF summary of the saved revision: cover, key metrics,
 * assumptions, the cash-flow table, charts (with a tornado of the real LCOE
 * over the usual screening ranges) and the method notes, the cautions on
 * every page. Drawn on the compute pool.
 *
 * The latest finished probabilistic run of the saved revision is printed
 * too, on pages of its own with its method note, whenever there is one and
 * the plan lets the team read runs; `?run=none` leaves it out. A run of an
 * older revision describes another document and is never printed.
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const { project, scenarioId, user, membership } = access;
	const scenario = await loadScenario(scenarioId);
	await takeComputeAllowance(user.id, 'export');
	const { result, engineVersion } = await resultOfSavedScenario(scenario, project);
	const document = validateDocument(scenario.document, project);
	const tornado = await runEngine(() => tornadoOnPool(document, defaultDrivers(document), 'lcoeReal'));
	const withRun = event.url.searchParams.get('run') !== 'none' && planAllows(membership, 'probabilisticRuns', 'read').allowed;
	const run = withRun ? (await latestDoneRunsInFull([scenario])).get(scenario.id) : undefined;
	const pdf = await renderSummaryPdfOnPool(
		teamCopyInput({
			project,
			scenario: { name: scenario.name, revision: scenario.revision, notes: scenario.notes },
			document,
			result,
			engineVersion,
			tornado,
			run: run ? freezeRun(run) : null,
			date: new Date()
		})
	);
	await recordWorkspaceEvent(actorOf(event, access), 'scenario-exported', { ...scenarioDetail(project, scenario), revision: scenario.revision, format: 'pdf', table: 'summary' });
	return summaryPdfResponse(pdf, scenario.name, scenario.revision);
});
