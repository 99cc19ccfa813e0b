/**
 * The compute pool: worker threads for the engine, the upload parsers, the
 * export builder and the PDF summary, so a long calculation or a 20 MB file
 * never holds up the request thread, and with it every other request
 * (/api/v1/health included).
 *
 * Each task has a time limit and waits in a bounded queue; past either, the
 * caller gets a 503 in words rather than a request that hangs. An engine
 * refusal of its input comes back as a RangeError, as if the engine had run
 * here (../workbench/evaluation.ts turns it into the 422).
 *
 * Threads: the COMPUTE_THREADS setting, else min(2, cores - 1), at least 1.
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { ApiProblem } from '../workbench/api-route';
import { computeSettings } from '../settings';
import type { EngineResult } from '../engine/evaluate';
import type { DriverId, DriverRange, TornadoResult } from '../engine/sensitivity';
import type { UploadResult } from '../uploads';
import type { CsvTableName, ExportFile, ExportFormat } from '../workbench/export';
import type { ExportContext } from '../workbench/export-tables';
import type { ScenarioSummaryInput } from '../pdf/summary';
import type { MetricKey } from '../../metrics/catalogue';
import type { Scenario } from '../../schemas/scenario';
import type { UploadKind } from '../../schemas/workbench';
import type { SpiderAnswer, TaskInput, TaskMessage, TaskName, TaskOutcome, TaskValue } from './worker';

/** The longest a task may take, waiting in the queue included. */
export const COMPUTE_TIMEOUT_MS = 20_000;
/** Tasks that may wait per thread before the pool answers "busy". */
const QUEUE_PER_THREAD = 16;
const BUSY_RETRY_SECONDS = 5;
const MAX_THREADS = 64;
const COMPUTE_NICE_INCREMENT = 10;

/** Worker threads from the COMPUTE_THREADS setting (checked at start-up in settings.ts), else min(2, cores - 1), at least 1. */
export function computeThreadCount(setting: string | undefined = computeSettings().threads?.toString(), cores: number = availableParallelism()): number {
	if (setting === undefined || setting.trim() === '') return Math.max(1, Math.min(2, cores - 1));
	const threads = Number(setting.trim());
	if (!Number.isInteger(threads) || threads < 1 || threads > MAX_THREADS) {
		throw new Error(`COMPUTE_THREADS must be a whole number from 1 to ${MAX_THREADS}; it is "${setting}".`);
	}
	return threads;
}

export interface ComputePoolOptions {
	threads?: number;
	/** Per task, queue wait included (tests use a tiny one). */
	timeoutMs?: number;
	/** Tasks that may wait for a thread; one more is refused as busy. */
	maxQueue?: number;
}

function isAbort(e: unknown): boolean {
	return e instanceof Error && e.name === 'AbortError';
}

function seconds(ms: number): string {
	const s = ms / 1000;
	return s === 1 ? '1 second' : `${Number(s.toFixed(3))} seconds`;
}

export class ComputePool {
	readonly threads: number;
	readonly timeoutMs: number;
	readonly maxQueue: number;
	readonly #piscina: Piscina;
	/** Tasks running or waiting. Counted here: piscina leaves tasks with a time limit out of its own queue bound. */
	#inFlight = 0;

	private constructor(piscina: Piscina, threads: number, timeoutMs: number, maxQueue: number) {
		this.#piscina = piscina;
		this.threads = threads;
		this.timeoutMs = timeoutMs;
		this.maxQueue = maxQueue;
	}

	static async start(options: ComputePoolOptions = {}): Promise<ComputePool> {
		// Imported only dynamically, so the build keeps it as a file of its own; its entry point is
		// named here so the build cannot shake the tasks out of that file as unused.
		const tasks = await import('./worker');
		if (typeof tasks.runTask !== 'function') throw new Error('The compute worker file has no runTask.');
		const { tasksFileUrl } = tasks;
		// From the sources (Vite's dev server, vitest) a thread needs tsx to read TypeScript; a build is plain JavaScript.
		const fromSources = tasksFileUrl.endsWith('.ts');
		const threads = options.threads ?? computeThreadCount();
		const maxQueue = options.maxQueue ?? threads * QUEUE_PER_THREAD;
		const piscina = new Piscina({
			filename: fromSources ? new URL('./dev-worker.js', tasksFileUrl).href : tasksFileUrl,
			name: 'runTask',
			workerData: { tasksFileUrl },
			maxThreads: threads,
			// A built app keeps its threads warm; from the sources idle threads end, so the next one reads edited code.
			minThreads: fromSources ? 0 : threads,
			idleTimeout: fromSources ? 10_000 : 0,
			// Lower CPU priority (Linux nice, per thread): when cores are short, answering requests comes first.
			niceIncrement: COMPUTE_NICE_INCREMENT
		});
		return new ComputePool(piscina, threads, options.timeoutMs ?? COMPUTE_TIMEOUT_MS, maxQueue);
	}

	/** Runs one task on a worker thread; a refusal by the engine rejects with a RangeError, a timeout or a full queue with a 503. */
	async run<N extends TaskName>(task: N, input: TaskInput<N>): Promise<TaskValue<N>> {
		if (this.#inFlight >= this.threads + this.maxQueue) {
			throw new ApiProblem(503, 'The server is busy with other calculations: try again in a few seconds.', [], {}, { 'retry-after': String(BUSY_RETRY_SECONDS) });
		}
		this.#inFlight += 1;
		let outcome: TaskOutcome<unknown>;
		try {
			outcome = await this.#piscina.run({ task, input } as TaskMessage, { signal: AbortSignal.timeout(this.timeoutMs) });
		} catch (e) {
			if (isAbort(e)) {
				throw new ApiProblem(
					503,
					`The calculation did not finish within ${seconds(this.timeoutMs)} and was stopped. The server may be busy: try again in a minute, or make the scenario smaller.`,
					[],
					{},
					{ 'retry-after': '60' }
				);
			}
			throw e;
		} finally {
			this.#inFlight -= 1;
		}
		if (!outcome.ok) throw new RangeError(outcome.engineRefusal);
		return outcome.value as TaskValue<N>;
	}

	close(): Promise<void> {
		// Lets running tasks finish (their requests still get answers) before the threads stop.
		return this.#piscina.close();
	}
}

let shared: Promise<ComputePool> | undefined;

/** The app's one pool, started on first use. */
export function computePool(): Promise<ComputePool> {
	shared ??= ComputePool.start().catch((e: unknown) => {
		shared = undefined;
		throw e;
	});
	return shared;
}

/** Stops the pool's threads, if they were started (at shutdown). */
export async function closeComputePool(): Promise<void> {
	const started = shared;
	shared = undefined;
	if (started) await (await started).close();
}

export async function evaluateOnPool(document: Scenario): Promise<EngineResult> {
	return (await computePool()).run('evaluate', { document });
}

export async function tornadoOnPool(document: Scenario, drivers: readonly DriverRange[], metric: MetricKey): Promise<TornadoResult> {
	return (await computePool()).run('tornado', { document, drivers, metric });
}

export async function spiderOnPool(document: Scenario, drivers: readonly DriverId[], metric: MetricKey, changes?: readonly number[]): Promise<SpiderAnswer> {
	return (await computePool()).run('spider', { document, drivers, metric, changes });
}

export async function parseUploadOnPool(kind: UploadKind, bytes: Uint8Array): Promise<UploadResult<unknown, unknown>> {
	return (await computePool()).run('parseUpload', { kind, bytes });
}

export async function buildExportOnPool(result: EngineResult, context: ExportContext, format: ExportFormat, table: CsvTableName): Promise<ExportFile> {
	return (await computePool()).run('buildExport', { result, context, format, table });
}

/** The PDF summary's bytes, drawn on a worker thread (pdfkit works synchronously and would hold up the request thread for its whole run). */
export async function renderSummaryPdfOnPool(summary: ScenarioSummaryInput): Promise<Uint8Array<ArrayBuffer>> {
	return (await computePool()).run('summaryPdf', { summary });
}
