import { error } from '@sveltejs/kit';
import { parseScenario } from '$lib/schemas/scenario';
import { planAllows } from '$lib/billing/plans';
import { authorize } from '$lib/server/auth/access';
import { roleAtLeast } from '$lib/server/auth/roles';
import { getRun, listRunsOfScenario } from '$lib/server/db/probabilistic-runs';
import { getScenarioById } from '$lib/server/db/scenarios';
import { sensitivityChoices } from '$lib/server/analysis/sensitivity-choices';
import { defaultRunInput } from '$lib/server/probabilistic/defaults';
import { runListView, runView } from '$lib/server/probabilistic/run-requests';
import type { PageServerLoad } from './$types';

/**
 * The scenario's probabilistic runs: the form to start one (analysts, paid
 * plans), the chosen run (`?run=`, else the newest) with its progress or
 * results, and the list. Runs start, report progress and cancel through the API.
 */
export const load: PageServerLoad = async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	const scenario = await getScenarioById(event.params.scenarioId);
	if (!scenario) error(404, 'No such scenario, or it is not yours.');
	const parsed = parseScenario(scenario.document);
	const plan = planAllows(membership, 'probabilisticRuns', 'change');
	const readable = planAllows(membership, 'probabilisticRuns', 'read').allowed;
	const runs = readable ? await listRunsOfScenario(scenario.id) : [];
	const asked = event.url.searchParams.get('run');
	const chosenId = asked && runs.some((r) => r.id === asked) ? asked : runs[0]?.id;
	const chosen = chosenId ? await getRun(chosenId) : undefined;
	const document = parsed.ok ? parsed.scenario : null;
	return {
		workspaceId: membership.workspaceId,
		project: { id: project.id, name: project.name, currency: project.currency },
		scenario: { id: scenario.id, name: scenario.name, revision: scenario.revision, archived: scenario.archivedAt !== null },
		role: membership.role,
		canStart: roleAtLeast(membership.role, 'analyst') && plan.allowed && scenario.archivedAt === null && document !== null,
		planMessage: plan.allowed ? null : plan.message,
		billingUrl: membership.role === 'owner' ? `/app/w/${membership.workspaceId}/billing` : null,
		choices: document ? sensitivityChoices(document) : [],
		defaultInput: document ? defaultRunInput(document) : null,
		lockUpDscr: document?.finance.covenants?.lockUpDscr ?? null,
		runs: runs.map((r) => runListView(r)),
		chosen: chosen ? runView(chosen) : null,
		documentProblem: document ? null : 'The saved scenario document does not pass the schema check, so it cannot be drawn. Open it in the editor to fix it.'
	};
};
