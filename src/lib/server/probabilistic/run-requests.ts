/**
 * What the routes ask of probabilistic runs, with the checks every caller
 * needs: the plan (a paid plan starts runs; a lapsed one still reads them),
 * the role, the per-user start limit, a cap on runs waiting at once in a
 * workspace, and that the run asked for belongs to the scenario in the path.
 */
import type { ScenarioAccess } from '../auth/access';
import { requireFeature } from '../billing/gates';
import { takeComputeAllowance } from '../compute/limits';
import { getRun, listRunsOfScenario, listRunsOfWorkspace, type ProbabilisticRun, type RunListItem } from '../db/probabilistic-runs';
import { ApiProblem } from '../workbench/api-route';
import { documentToEvaluate } from '../workbench/evaluation';
import type { RunInput } from '../../schemas/probabilistic';
import { cancelRun, runProgress, startRun, type RunProgress } from './runs';
import { energyComponentsOf } from './energy-components';
import { createSampler } from './sampling';

/** Runs queued or running at once in one workspace; one more waits for one of them to end. */
export const LIVE_RUNS_PER_WORKSPACE = 4;

export type RunView = Omit<ProbabilisticRun, 'createdAt' | 'startedAt' | 'finishedAt'> & {
	createdAt: string;
	startedAt: string | null;
	finishedAt: string | null;
	progress: RunProgress;
};

export type RunListView = Omit<RunListItem, 'createdAt' | 'startedAt' | 'finishedAt'> & {
	createdAt: string;
	startedAt: string | null;
	finishedAt: string | null;
	progress: RunProgress;
};

const iso = (d: Date | null) => (d === null ? null : d.toISOString());

export function runView(run: ProbabilisticRun, now = new Date()): RunView {
	return { ...run, createdAt: run.createdAt.toISOString(), startedAt: iso(run.startedAt), finishedAt: iso(run.finishedAt), progress: runProgress(run, now) };
}

export function runListView(run: RunListItem, now = new Date()): RunListView {
	return { ...run, createdAt: run.createdAt.toISOString(), startedAt: iso(run.startedAt), finishedAt: iso(run.finishedAt), progress: runProgress(run, now) };
}

/** The run, if it is one of this scenario's: a run id from another scenario or workspace is a 404 like an unknown one. */
export async function runOfScenario(access: ScenarioAccess, runId: string): Promise<ProbabilisticRun> {
	const run = /^[0-9a-f-]{36}$/i.test(runId) ? await getRun(runId) : undefined;
	if (!run || run.scenarioId !== access.scenarioId) throw new ApiProblem(404, 'No such probabilistic run on this scenario.');
	requireFeature(access.membership, 'probabilisticRuns', 'read');
	return run;
}

export async function scenarioRuns(access: ScenarioAccess): Promise<RunListItem[]> {
	requireFeature(access.membership, 'probabilisticRuns', 'read');
	return listRunsOfScenario(access.scenarioId);
}

/** Starts a run of the saved scenario (analysts and owners, paid plans), with an input already checked against runInputSchema. */
export async function startScenarioRun(access: ScenarioAccess, input: RunInput): Promise<ProbabilisticRun> {
	requireFeature(access.membership, 'probabilisticRuns', 'change');
	const { document, scenario } = await documentToEvaluate(access, undefined);
	try {
		createSampler(input, energyComponentsOf(document), document.timeline.operatingYears);
	} catch (e) {
		if (e instanceof RangeError) throw new ApiProblem(422, `This run cannot be drawn: ${e.message}`);
		throw e;
	}
	const live = await listRunsOfWorkspace(access.membership.workspaceId, { liveOnly: true, limit: LIVE_RUNS_PER_WORKSPACE });
	if (live.length >= LIVE_RUNS_PER_WORKSPACE) {
		throw new ApiProblem(
			429,
			`${access.membership.workspaceName} already has ${LIVE_RUNS_PER_WORKSPACE} probabilistic runs waiting or running. Wait for one to finish, or cancel one, and start this one again.`
		);
	}
	await takeComputeAllowance(access.user.id, 'probabilistic-run');
	return startRun({
		workspaceId: access.membership.workspaceId,
		projectId: access.project.id,
		scenarioId: scenario.id,
		revision: scenario.revision,
		document,
		input,
		userId: access.user.id
	});
}

/** Cancels a run of this scenario; a run that has already ended is a 409 that says how it ended. */
export async function cancelScenarioRun(access: ScenarioAccess, runId: string): Promise<ProbabilisticRun> {
	const run = await runOfScenario(access, runId);
	if (!(await cancelRun(run.id))) throw new ApiProblem(409, `This run has already ended (${run.state}); there is nothing to cancel.`);
	return (await getRun(run.id))!;
}
