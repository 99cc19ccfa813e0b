/**
 * Probabilistic runs and their chunks. A run moves queued -> running -> done,
 * or to cancelled or failed from queued or running; every state change names
 * the states it may leave, so a late worker never undoes a cancel or a
 * failure. A chunk is recorded exactly once: its insert and the run's
 * `draws_done` move together, under the run's row lock (which a cancel also
 * takes), so once a cancel has committed no chunk is recorded after it.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import type { RunInput } from '../../schemas/probabilistic';
import type { RunDraws, RunSummary } from '../probabilistic/summary';

export const RUN_STATES = ['queued', 'running', 'done', 'cancelled', 'failed'] as const;
export type RunState = (typeof RUN_STATES)[number];
const LIVE_STATES: RunState[] = ['queued', 'running'];

export interface ProbabilisticRun {
	id: string;
	workspaceId: string;
	projectId: string;
	scenarioId: string;
	scenarioRevision: number;
	engineVersion: string;
	input: RunInput;
	seed: number;
	draws: number;
	chunkSize: number;
	state: RunState;
	drawsDone: number;
	failure: string | null;
	summary: RunSummary | null;
	createdBy: string | null;
	createdAt: Date;
	startedAt: Date | null;
	finishedAt: Date | null;
}

/** A run as a list shows it: no input, no summary; with the names of its scenario, project and author. */
export type RunListItem = Omit<ProbabilisticRun, 'input' | 'summary'> & {
	scenarioName: string;
	projectName: string;
	createdByName: string | null;
};

/** One chunk's draws, in draw order: each output (null where the draw has none), each drawn driver, the energy factor. */
export type ChunkOutcomes = RunDraws;

export interface RunChunk {
	runId: string;
	chunkIndex: number;
	firstDraw: number;
	drawCount: number;
	outcomes: ChunkOutcomes;
	worker: string;
	completedAt: Date;
}

const runColumns = [
	'probabilistic_runs.id',
	'probabilistic_runs.workspace_id',
	'probabilistic_runs.project_id',
	'probabilistic_runs.scenario_id',
	'probabilistic_runs.scenario_revision',
	'probabilistic_runs.engine_version',
	'probabilistic_runs.seed',
	'probabilistic_runs.draws',
	'probabilistic_runs.chunk_size',
	'probabilistic_runs.state',
	'probabilistic_runs.draws_done',
	'probabilistic_runs.failure',
	'probabilistic_runs.created_by',
	'probabilistic_runs.created_at',
	'probabilistic_runs.started_at',
	'probabilistic_runs.finished_at'
] as const;

interface RunDbRow {
	id: string;
	workspace_id: string;
	project_id: string;
	scenario_id: string;
	scenario_revision: number;
	engine_version: string;
	seed: string; // bigint arrives as text
	draws: number;
	chunk_size: number;
	state: RunState;
	draws_done: number;
	failure: string | null;
	created_by: string | null;
	created_at: Date;
	started_at: Date | null;
	finished_at: Date | null;
	input?: RunInput;
	summary?: RunSummary | null;
}

function toRunBase(row: RunDbRow): Omit<ProbabilisticRun, 'input' | 'summary'> {
	return {
		id: row.id,
		workspaceId: row.workspace_id,
		projectId: row.project_id,
		scenarioId: row.scenario_id,
		scenarioRevision: row.scenario_revision,
		engineVersion: row.engine_version,
		seed: Number(row.seed),
		draws: row.draws,
		chunkSize: row.chunk_size,
		state: row.state,
		drawsDone: row.draws_done,
		failure: row.failure,
		createdBy: row.created_by,
		createdAt: row.created_at,
		startedAt: row.started_at,
		finishedAt: row.finished_at
	};
}

export interface NewRun {
	workspaceId: string;
	projectId: string;
	scenarioId: string;
	scenarioRevision: number;
	engineVersion: string;
	input: RunInput;
	chunkSize: number;
	createdBy: string | null;
}

/** A queued run; its seed and draws are the input's. */
export async function insertRun(run: NewRun, knex: Knex = db()): Promise<ProbabilisticRun> {
	const [row] = await knex('probabilistic_runs')
		.insert({
			workspace_id: run.workspaceId,
			project_id: run.projectId,
			scenario_id: run.scenarioId,
			scenario_revision: run.scenarioRevision,
			engine_version: run.engineVersion,
			input: JSON.stringify(run.input),
			seed: run.input.seed,
			draws: run.input.draws,
			chunk_size: run.chunkSize,
			created_by: run.createdBy
		})
		.returning('id');
	return (await getRun(row.id, knex))!;
}

export async function getRun(id: string, knex: Knex = db()): Promise<ProbabilisticRun | undefined> {
	const row: RunDbRow | undefined = await knex('probabilistic_runs')
		.select([...runColumns, 'probabilistic_runs.input', 'probabilistic_runs.summary'])
		.where('probabilistic_runs.id', id)
		.first();
	return row && { ...toRunBase(row), input: row.input!, summary: row.summary ?? null };
}

/** The state alone: what a worker checks between draws to see a cancel. */
export async function getRunState(id: string, knex: Knex = db()): Promise<RunState | undefined> {
	const row = await knex('probabilistic_runs').select('state').where({ id }).first();
	return row?.state;
}

function listQuery(knex: Knex) {
	return knex('probabilistic_runs')
		.join('scenarios', 'scenarios.id', 'probabilistic_runs.scenario_id')
		.join('projects', 'projects.id', 'probabilistic_runs.project_id')
		.leftJoin('users as author', 'author.id', 'probabilistic_runs.created_by')
		.select([...runColumns, 'scenarios.name as scenario_name', 'projects.name as project_name', 'author.name as created_by_name']);
}

type ListDbRow = RunDbRow & { scenario_name: string; project_name: string; created_by_name: string | null };

function toListItem(row: ListDbRow): RunListItem {
	return { ...toRunBase(row), scenarioName: row.scenario_name, projectName: row.project_name, createdByName: row.created_by_name };
}

/** A scenario's runs, newest first. */
export async function listRunsOfScenario(scenarioId: string, options: { limit?: number } = {}, knex: Knex = db()): Promise<RunListItem[]> {
	const rows: ListDbRow[] = await listQuery(knex)
		.where('probabilistic_runs.scenario_id', scenarioId)
		.orderBy([{ column: 'probabilistic_runs.created_at', order: 'desc' }, { column: 'probabilistic_runs.id', order: 'desc' }])
		.limit(options.limit ?? 50);
	return rows.map(toListItem);
}

/** A workspace's runs, newest first (optionally only those still queued or running). */
export async function listRunsOfWorkspace(
	workspaceId: string,
	options: { limit?: number; liveOnly?: boolean } = {},
	knex: Knex = db()
): Promise<RunListItem[]> {
	const query = listQuery(knex).where('probabilistic_runs.workspace_id', workspaceId);
	if (options.liveOnly) query.whereIn('probabilistic_runs.state', LIVE_STATES);
	const rows: ListDbRow[] = await query
		.orderBy([{ column: 'probabilistic_runs.created_at', order: 'desc' }, { column: 'probabilistic_runs.id', order: 'desc' }])
		.limit(options.limit ?? 50);
	return rows.map(toListItem);
}

/** A worker took up the run: running from now (the first chunk's start stays its start). False when no longer live. */
export async function markRunRunning(id: string, knex: Knex = db()): Promise<boolean> {
	const changed = await knex('probabilistic_runs')
		.where({ id })
		.whereIn('state', LIVE_STATES)
		.update({ state: 'running', started_at: knex.raw('coalesce(started_at, now())') });
	return changed === 1;
}

export interface ChunkRecord {
	runId: string;
	chunkIndex: number;
	firstDraw: number;
	drawCount: number;
	outcomes: ChunkOutcomes;
	worker: string;
}

export interface ChunkRecording {
	/** True when this call stored the chunk; false when it was there already, or the run is gone or no longer live. */
	recorded: boolean;
	state: RunState | null;
	drawsDone: number;
	draws: number;
}

/**
 * Stores a chunk once and adds its draws to the run, in one transaction under
 * the run's row lock. A chunk stored before (a retried job) or a run no longer
 * queued or running changes nothing.
 */
export async function recordChunk(chunk: ChunkRecord, knex: Knex = db()): Promise<ChunkRecording> {
	return knex.transaction(async (trx) => {
		const run = await trx('probabilistic_runs').select('state', 'draws', 'draws_done').where({ id: chunk.runId }).forUpdate().first();
		if (!run) return { recorded: false, state: null, drawsDone: 0, draws: 0 };
		const unchanged = { recorded: false, state: run.state as RunState, drawsDone: run.draws_done as number, draws: run.draws as number };
		if (!LIVE_STATES.includes(run.state)) return unchanged;
		const inserted = await trx('probabilistic_run_chunks')
			.insert({
				run_id: chunk.runId,
				chunk_index: chunk.chunkIndex,
				first_draw: chunk.firstDraw,
				draw_count: chunk.drawCount,
				outcomes: JSON.stringify(chunk.outcomes),
				worker: chunk.worker
			})
			.onConflict(['run_id', 'chunk_index'])
			.ignore()
			.returning('chunk_index');
		if (inserted.length === 0) return unchanged;
		const [updated] = await trx('probabilistic_runs')
			.where({ id: chunk.runId })
			.update({ draws_done: trx.raw('draws_done + ?', [chunk.drawCount]), state: 'running', started_at: trx.raw('coalesce(started_at, now())') })
			.returning(['state', 'draws_done', 'draws']);
		return { recorded: true, state: updated.state, drawsDone: updated.draws_done, draws: updated.draws };
	});
}

export async function chunkIsRecorded(runId: string, chunkIndex: number, knex: Knex = db()): Promise<boolean> {
	const row = await knex('probabilistic_run_chunks').select('chunk_index').where({ run_id: runId, chunk_index: chunkIndex }).first();
	return row !== undefined;
}

/** The run's chunks in draw order, with their outcomes. */
export async function listRunChunks(runId: string, knex: Knex = db()): Promise<RunChunk[]> {
	const rows = await knex('probabilistic_run_chunks')
		.select('run_id', 'chunk_index', 'first_draw', 'draw_count', 'outcomes', 'worker', 'completed_at')
		.where({ run_id: runId })
		.orderBy('chunk_index');
	return rows.map((row) => ({
		runId: row.run_id,
		chunkIndex: row.chunk_index,
		firstDraw: row.first_draw,
		drawCount: row.draw_count,
		outcomes: row.outcomes,
		worker: row.worker,
		completedAt: row.completed_at
	}));
}

/** Done, with its summary: only a running run whose every draw is recorded. False when another call got there first. */
export async function finishRun(id: string, summary: RunSummary, knex: Knex = db()): Promise<boolean> {
	const changed = await knex('probabilistic_runs')
		.where({ id, state: 'running' })
		.whereRaw('draws_done = draws')
		.update({ state: 'done', summary: JSON.stringify(summary), finished_at: knex.fn.now() });
	return changed === 1;
}

/** Failed with a message, from queued or running; false when the run had already ended. */
export async function failRun(id: string, message: string, knex: Knex = db()): Promise<boolean> {
	const changed = await knex('probabilistic_runs')
		.where({ id })
		.whereIn('state', LIVE_STATES)
		.update({ state: 'failed', failure: message.slice(0, 2000), finished_at: knex.fn.now() });
	return changed === 1;
}

/** Cancelled, from queued or running; false when the run had already ended. */
export async function cancelRunRow(id: string, knex: Knex = db()): Promise<boolean> {
	const changed = await knex('probabilistic_runs')
		.where({ id })
		.whereIn('state', LIVE_STATES)
		.update({ state: 'cancelled', finished_at: knex.fn.now() });
	return changed === 1;
}
