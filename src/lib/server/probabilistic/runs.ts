/**
 * Probabilistic runs as a service (no HTTP): start a run (a row and one job
 * per chunk), cancel it, report its progress; and, in the worker processes,
 * compute a chunk and finish the run when its last chunk is in.
 *
 * Failures. A draw's computation (sampling and engine) is pure: what fails
 * once fails every time, so an error there, or a stored revision that no
 * longer reads as a scenario, fails the run at once with the message. Any
 * other error (the database, the worker) is thrown to the queue, which
 * retries the chunk; when its retries are spent, `failedChunk` fails the run
 * with the last message.
 */
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { runInputSchema, type RunInput } from '../../schemas/probabilistic';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { db } from '../db/knex';
import {
	cancelRunRow,
	chunkIsRecorded,
	failRun,
	finishRun,
	getRun,
	getRunState,
	insertRun,
	listRunChunks,
	markRunRunning,
	recordChunk,
	type ProbabilisticRun
} from '../db/probabilistic-runs';
import { getScenarioRevisionDocument } from '../db/scenarios';
import { ENGINE_VERSION } from '../engine/version';
import { evaluateDraw, RUN_OUTPUTS } from './draw-evaluation';
import { drawsCsvText } from './draws-csv';
import { energyComponentsOf } from './energy-components';
import { appQueue, cancelChunkJobs, DEFAULT_JOB_POLICY, enqueueChunks, type ChunkHandlers, type ChunkJob, type JobPolicy } from './queue';
import { createSampler } from './sampling';
import { joinDraws, summariseRun, type RunDraws } from './summary';

/** Draws per job: about half a second of engine time, so a lost job costs little and progress moves often. */
export const DEFAULT_CHUNK_SIZE = 250;
/** Draws between two looks at the run's state, so a cancel stops a chunk within a few tenths of a second. */
const CANCEL_CHECK_EVERY = 50;

export interface RunServiceOptions {
	knex?: Knex;
	/** The queue connection; the web process's own (DATABASE_URL) when left out. */
	boss?: PgBoss;
	jobPolicy?: JobPolicy;
	chunkSize?: number;
}

export interface StartRunRequest {
	workspaceId: string;
	projectId: string;
	scenarioId: string;
	revision: number;
	/** The revision's document (already validated): checked here so a run that cannot be drawn is refused before it is queued. */
	document: Scenario;
	input: RunInput;
	userId: string | null;
}

export const chunkCountOf = (run: Pick<ProbabilisticRun, 'draws' | 'chunkSize'>) => Math.ceil(run.draws / run.chunkSize);

/**
 * Stores a queued run on the revision and sends one job per chunk. Throws
 * (zod or RangeError) when the input does not validate or cannot be drawn on
 * this document. When the jobs cannot be sent the run is marked failed and
 * the error thrown.
 */
export async function startRun(request: StartRunRequest, options: RunServiceOptions = {}): Promise<ProbabilisticRun> {
	const knex = options.knex ?? db();
	const input = runInputSchema.parse(request.input);
	createSampler(input, energyComponentsOf(request.document), request.document.timeline.operatingYears);
	const run = await insertRun(
		{
			workspaceId: request.workspaceId,
			projectId: request.projectId,
			scenarioId: request.scenarioId,
			scenarioRevision: request.revision,
			engineVersion: ENGINE_VERSION,
			input,
			chunkSize: options.chunkSize ?? DEFAULT_CHUNK_SIZE,
			createdBy: request.userId
		},
		knex
	);
	try {
		await enqueueChunks(options.boss ?? (await appQueue()), run.id, chunkCountOf(run), options.jobPolicy ?? DEFAULT_JOB_POLICY);
	} catch (error) {
		await failRun(run.id, `the run could not be queued: ${error instanceof Error ? error.message : error}`, knex);
		throw error;
	}
	return run;
}

/** Cancels a queued or running run and withdraws its waiting jobs; false when it had already ended (or does not exist). */
export async function cancelRun(runId: string, options: RunServiceOptions = {}): Promise<boolean> {
	const knex = options.knex ?? db();
	if (!(await cancelRunRow(runId, knex))) return false;
	const run = await getRun(runId, knex);
	try {
		if (run) await cancelChunkJobs(options.boss ?? (await appQueue()), runId, chunkCountOf(run));
	} catch (error) {
		// The jobs left find the run cancelled and do nothing.
		console.error(`[runs] the jobs of cancelled run ${runId} could not be withdrawn: ${error instanceof Error ? error.message : error}`);
	}
	return true;
}

export interface RunProgress {
	drawsDone: number;
	draws: number;
	fraction: number;
	/** Seconds left at the rate so far; null before the first chunk is in, or once the run has ended. */
	etaSeconds: number | null;
}

export function runProgress(
	run: Pick<ProbabilisticRun, 'draws' | 'drawsDone' | 'startedAt' | 'state'>,
	now: Date = new Date()
): RunProgress {
	const fraction = run.draws > 0 ? run.drawsDone / run.draws : 0;
	const live = run.state === 'queued' || run.state === 'running';
	let etaSeconds: number | null = null;
	if (live && run.startedAt && run.drawsDone > 0) {
		const elapsed = Math.max(0, (now.getTime() - run.startedAt.getTime()) / 1000);
		etaSeconds = (elapsed * (run.draws - run.drawsDone)) / run.drawsDone;
	}
	return { drawsDone: run.drawsDone, draws: run.draws, fraction, etaSeconds };
}

/** What became of a chunk job. */
export type ChunkOutcome = 'recorded' | 'finished' | 'already-recorded' | 'not-live' | 'cancelled' | 'failed';

/** An error of the pure computation of a draw: the same inputs fail the same way, so retrying is pointless. */
class DrawComputationError extends Error {}

async function scenarioOfRun(run: ProbabilisticRun, knex: Knex): Promise<Scenario> {
	const stored = await getScenarioRevisionDocument(run.scenarioId, run.scenarioRevision, knex);
	if (stored === undefined) throw new DrawComputationError(`revision ${run.scenarioRevision} of the scenario is no longer stored`);
	const parsed = parseScenario(stored);
	if (!parsed.ok) {
		const issues = parsed.issues.slice(0, 3).map((i) => `${i.path}: ${i.message}`).join('; ');
		throw new DrawComputationError(`revision ${run.scenarioRevision} of the scenario is not a valid scenario (${issues})`);
	}
	return parsed.scenario;
}

/** Draws first..first+count-1 of the run; undefined when the run stopped being live meanwhile. */
async function computeDraws(run: ProbabilisticRun, scenario: Scenario, first: number, count: number, knex: Knex): Promise<RunDraws | undefined> {
	const drivers = run.input.drivers.map((d) => d.driver);
	const draws: RunDraws = {
		outputs: Object.fromEntries(RUN_OUTPUTS.map((key) => [key, []])) as unknown as RunDraws['outputs'],
		drivers: Object.fromEntries(drivers.map((d) => [d, []])),
		energyFactor: []
	};
	let sample: ReturnType<typeof createSampler>;
	try {
		sample = createSampler(run.input, energyComponentsOf(scenario), scenario.timeline.operatingYears);
	} catch (error) {
		throw new DrawComputationError(`the draws could not be set up: ${error instanceof Error ? error.message : error}`);
	}
	for (let i = first; i < first + count; i++) {
		if ((i - first) % CANCEL_CHECK_EVERY === 0 && i > first) {
			const state = await getRunState(run.id, knex);
			if (state !== 'running' && state !== 'queued') return undefined;
		}
		try {
			const vector = sample(i);
			const outcome = evaluateDraw(scenario, { drivers: vector.drivers, energyOutturn: vector.energyFactor });
			for (const d of drivers) draws.drivers[d]!.push(vector.drivers[d]!);
			draws.energyFactor.push(vector.energyFactor);
			for (const key of RUN_OUTPUTS) draws.outputs[key].push(outcome[key]);
		} catch (error) {
			throw new DrawComputationError(`draw ${i} could not be computed: ${error instanceof Error ? error.message : error}`);
		}
	}
	return draws;
}

/** Finishes a running run whose every draw is in, with its summary; false when not (yet) complete or already finished. */
export async function finishRunIfComplete(runId: string, knex: Knex = db()): Promise<boolean> {
	const run = await getRun(runId, knex);
	if (!run || run.state !== 'running' || run.drawsDone !== run.draws) return false;
	const scenario = await scenarioOfRun(run, knex);
	const chunks = await listRunChunks(runId, knex);
	const summary = summariseRun(joinDraws(chunks.map((c) => c.outcomes)), {
		drivers: run.input.drivers.map((d) => d.driver),
		energyUncertainty: run.input.energyUncertainty,
		lockUpDscr: scenario.finance.covenants?.lockUpDscr ?? null,
		hurdleRate: run.input.hurdleRate
	});
	return finishRun(runId, summary, knex);
}

/**
 * Computes and records one chunk of a run. Does nothing for a run that has
 * ended, and records nothing once it has been cancelled. Recording the last
 * chunk finishes the run; a chunk found already recorded (its job retried
 * after a worker died) only finishes the run if that had not happened.
 */
export async function computeChunk(runId: string, chunkIndex: number, options: { knex?: Knex; worker?: string } = {}): Promise<ChunkOutcome> {
	const knex = options.knex ?? db();
	const run = await getRun(runId, knex);
	if (!run || (run.state !== 'queued' && run.state !== 'running')) return 'not-live';
	const first = chunkIndex * run.chunkSize;
	const count = Math.min(run.chunkSize, run.draws - first);
	if (!(Number.isInteger(chunkIndex) && chunkIndex >= 0 && count > 0)) return 'not-live';
	try {
		if (await chunkIsRecorded(runId, chunkIndex, knex)) return (await finishRunIfComplete(runId, knex)) ? 'finished' : 'already-recorded';
		if (!(await markRunRunning(runId, knex))) return 'not-live';
		const scenario = await scenarioOfRun(run, knex);
		const outcomes = await computeDraws(run, scenario, first, count, knex);
		if (!outcomes) return 'cancelled';
		const recording = await recordChunk({ runId, chunkIndex, firstDraw: first, drawCount: count, outcomes, worker: options.worker ?? '' }, knex);
		if (!recording.recorded) return recording.state === 'running' ? 'already-recorded' : recording.state === 'cancelled' ? 'cancelled' : 'not-live';
		if (recording.drawsDone < recording.draws) return 'recorded';
		return (await finishRunIfComplete(runId, knex)) ? 'finished' : 'recorded';
	} catch (error) {
		if (!(error instanceof DrawComputationError)) throw error;
		await failRun(runId, error.message, knex);
		return 'failed';
	}
}

/** A chunk that failed on every attempt fails its run. */
export async function failRunOfChunk(job: ChunkJob, message: string, knex: Knex = db()): Promise<void> {
	await failRun(job.runId, `chunk ${job.chunkIndex} of the draws failed on every attempt: ${message}`, knex);
}

/** What a worker process does with the two queues. */
export function chunkHandlers(options: { knex?: Knex; worker?: string } = {}): ChunkHandlers {
	return {
		chunk: async (job) => {
			await computeChunk(job.runId, job.chunkIndex, options);
		},
		failedChunk: (job, message) => failRunOfChunk(job, message, options.knex)
	};
}

/** The run's draws as CSV (see draws-csv.ts): every draw of a finished run, those recorded so far of another; undefined for an unknown run. */
export async function drawsCsv(runId: string, knex: Knex = db()): Promise<string | undefined> {
	const run = await getRun(runId, knex);
	if (!run) return undefined;
	const chunks = await listRunChunks(runId, knex);
	return drawsCsvText(
		chunks.map((c) => ({ firstDraw: c.firstDraw, draws: c.outcomes })),
		run.input.drivers.map((d) => d.driver)
	);
}
