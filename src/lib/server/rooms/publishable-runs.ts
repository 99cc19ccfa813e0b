/**
 * The probabilistic run a room version may carry for a scenario: the latest
 * finished one drawn on the very revision being published (a run of an older
 * revision describes another document).
 */
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { getRun, type ProbabilisticRun } from '../db/probabilistic-runs';

export interface PublishableRun {
	id: string;
	scenarioId: string;
	scenarioRevision: number;
	draws: number;
	finishedAt: Date;
}

/** Per scenario id, its latest finished run of the revision given (latest by finishing time); scenarios without one are absent. */
export async function latestDoneRuns(scenarios: readonly { id: string; revision: number }[], knex: Knex = db()): Promise<Map<string, PublishableRun>> {
	if (scenarios.length === 0) return new Map();
	const rows: { id: string; scenario_id: string; scenario_revision: number; draws: number; finished_at: Date }[] = await knex('probabilistic_runs')
		.distinctOn('scenario_id')
		.select('id', 'scenario_id', 'scenario_revision', 'draws', 'finished_at')
		.where('state', 'done')
		.whereIn(
			['scenario_id', 'scenario_revision'],
			scenarios.map((s) => [s.id, s.revision])
		)
		.orderBy([{ column: 'scenario_id' }, { column: 'finished_at', order: 'desc' }, { column: 'id', order: 'desc' }]);
	return new Map(rows.map((r) => [r.scenario_id, { id: r.id, scenarioId: r.scenario_id, scenarioRevision: r.scenario_revision, draws: r.draws, finishedAt: r.finished_at }]));
}

/** The full run (input and summary) of each scenario that has one, for freezing. */
export async function latestDoneRunsInFull(scenarios: readonly { id: string; revision: number }[], knex: Knex = db()): Promise<Map<string, ProbabilisticRun>> {
	const latest = await latestDoneRuns(scenarios, knex);
	const full = await Promise.all([...latest.values()].map((r) => getRun(r.id, knex)));
	return new Map(full.filter((r): r is ProbabilisticRun => r !== undefined && r.state === 'done').map((r) => [r.scenarioId, r]));
}
