/**
 * The job queue of probabilistic runs: pg-boss 10 in the app's own PostgreSQL
 * (schema `pgboss`), one job per chunk of draws. The web process only sends;
 * worker processes (scripts/worker.ts) take the jobs, one at a time each.
 *
 * A worker that dies mid-chunk leaves its job active. pg-boss has no
 * heartbeat: the job is given up on when it has been active longer than
 * `expireInSeconds`, which the maintenance pass of some supervising process
 * (every worker supervises; pg-boss runs one pass at a time across them,
 * every `maintenanceIntervalSeconds`) turns into a retry `retryDelaySeconds`
 * later. So a lost chunk is computed again after at most about
 * expire + maintenance interval + retry delay + polling interval.
 * A job that fails `retryLimit` more times goes to the failed-chunk queue,
 * whose handler fails the run with the last error.
 *
 * Job ids are derived from (run, chunk): sending a run twice adds no job,
 * and a run's jobs can be cancelled without a look-up.
 */
import PgBoss from 'pg-boss';
import { createHash } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { databaseSettings } from '../settings';

export const QUEUE_SCHEMA = 'pgboss';
export const CHUNK_QUEUE = 'probabilistic-chunk';
export const FAILED_CHUNK_QUEUE = 'probabilistic-chunk-failed';

export interface ChunkJob {
	runId: string;
	chunkIndex: number;
}

/** Per job, fixed when the job is sent. */
export interface JobPolicy {
	/** A chunk of 250 draws takes about half a second; a job active this long is taken for lost. */
	expireInSeconds: number;
	retryLimit: number;
	retryDelaySeconds: number;
}

export const DEFAULT_JOB_POLICY: JobPolicy = { expireInSeconds: 60, retryLimit: 3, retryDelaySeconds: 2 };

export interface QueueConnection {
	url: string;
	/** Run pg-boss's maintenance (expiring lost jobs) from this process: the workers do, the web process does not. */
	supervise: boolean;
	maintenanceIntervalSeconds?: number;
}

export const DEFAULT_MAINTENANCE_INTERVAL_SECONDS = 10;

/** Connects, installs or upgrades pg-boss's schema when needed, and makes sure both queues exist. */
export async function openQueue(connection: QueueConnection): Promise<PgBoss> {
	const boss = new PgBoss({
		connectionString: connection.url,
		schema: QUEUE_SCHEMA,
		application_name: 'tidewright-queue',
		max: 3,
		schedule: false,
		supervise: connection.supervise,
		maintenanceIntervalSeconds: connection.maintenanceIntervalSeconds ?? DEFAULT_MAINTENANCE_INTERVAL_SECONDS
	});
	boss.on('error', (error) => console.error('[queue]', error.message));
	await boss.start();
	await boss.createQueue(FAILED_CHUNK_QUEUE);
	await boss.createQueue(CHUNK_QUEUE, { name: CHUNK_QUEUE, deadLetter: FAILED_CHUNK_QUEUE });
	return boss;
}

let appBoss: { url: string; boss: Promise<PgBoss> } | undefined;

/** The web process's connection, opened on first use on DATABASE_URL; it sends and cancels jobs, never works them. */
export function appQueue(): Promise<PgBoss> {
	const { url } = databaseSettings();
	if (!appBoss || appBoss.url !== url) {
		const opening = openQueue({ url, supervise: false });
		opening.catch(() => {
			if (appBoss?.boss === opening) appBoss = undefined;
		});
		appBoss = { url, boss: opening };
	}
	return appBoss.boss;
}

export async function closeAppQueue(): Promise<void> {
	const open = appBoss;
	appBoss = undefined;
	if (open) await (await open.boss).stop({ graceful: false });
}

/** A UUID that only (run, chunk) decides, in UUID form (version 8: custom). */
export function chunkJobId(runId: string, chunkIndex: number): string {
	const hex = createHash('sha256').update(`${runId}:${chunkIndex}`).digest('hex');
	const variant = ((parseInt(hex[16], 16) & 0x3) | 0x8).toString(16);
	return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-${variant}${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

/** One job per chunk, in one statement; chunks already queued are left as they are. */
export async function enqueueChunks(boss: PgBoss, runId: string, chunkCount: number, policy: JobPolicy = DEFAULT_JOB_POLICY): Promise<void> {
	const jobs: PgBoss.JobInsert<ChunkJob>[] = Array.from({ length: chunkCount }, (_, chunkIndex) => ({
		id: chunkJobId(runId, chunkIndex),
		name: CHUNK_QUEUE,
		data: { runId, chunkIndex },
		singletonKey: `${runId}:${chunkIndex}`,
		expireInSeconds: policy.expireInSeconds,
		retryLimit: policy.retryLimit,
		retryDelay: policy.retryDelaySeconds,
		deadLetter: FAILED_CHUNK_QUEUE
	}));
	await boss.insert(jobs);
}

/** Withdraws a run's jobs not yet finished (a worker busy with one finds the run cancelled anyway). */
export async function cancelChunkJobs(boss: PgBoss, runId: string, chunkCount: number): Promise<void> {
	const ids = Array.from({ length: chunkCount }, (_, chunkIndex) => chunkJobId(runId, chunkIndex));
	await boss.cancel(CHUNK_QUEUE, ids);
}

export interface ChunkHandlers {
	/** Computes a chunk; throwing makes pg-boss retry it (or, with no retry left, send it to the failed-chunk queue). */
	chunk(job: ChunkJob): Promise<void>;
	/** A chunk that failed every attempt, with the last error's message. */
	failedChunk(job: ChunkJob, message: string): Promise<void>;
}

function failureMessage(output: unknown): string {
	const o = output as { message?: unknown; value?: { message?: unknown } } | null | undefined;
	const message = o?.message ?? o?.value?.message;
	return typeof message === 'string' && message !== '' ? message : 'the chunk failed for an unknown reason';
}

/** Takes one job of `queue` and handles it; false when there was none. */
async function takeOne(boss: PgBoss, queue: string, handle: (job: PgBoss.JobWithMetadata<ChunkJob>) => Promise<void>): Promise<boolean> {
	const [job] = await boss.fetch<ChunkJob>(queue, { includeMetadata: true, batchSize: 1 });
	if (!job) return false;
	try {
		await handle(job);
		await boss.complete(queue, job.id);
	} catch (error) {
		const message = error instanceof Error ? error.message : String(error);
		console.error(`[worker ${process.pid}] ${queue} job ${job.id} failed (attempt ${job.retryCount + 1} of ${job.retryLimit + 1}): ${message}`);
		await boss.fail(queue, job.id, { message });
	}
	return true;
}

/**
 * Works both queues, one job at a time, until `signal` aborts; the job in hand
 * is finished first. Fetches again at once after a job (pg-boss's own `work`
 * waits a polling interval between jobs even when more are waiting), and
 * waits `pollingIntervalMs` only when both queues are empty.
 */
export async function workChunks(boss: PgBoss, handlers: ChunkHandlers, options: { signal: AbortSignal; pollingIntervalMs?: number }): Promise<void> {
	const pause = options.pollingIntervalMs ?? 1000;
	while (!options.signal.aborted) {
		let busy = false;
		try {
			busy =
				(await takeOne(boss, FAILED_CHUNK_QUEUE, (job) => handlers.failedChunk(job.data, failureMessage(job.output)))) ||
				(await takeOne(boss, CHUNK_QUEUE, (job) => handlers.chunk(job.data)));
		} catch (error) {
			// The database went away for a moment: say so and try again after a pause.
			console.error(`[worker ${process.pid}] the queue could not be read: ${error instanceof Error ? error.message : error}`);
		}
		if (!busy) await sleep(pause, undefined, { signal: options.signal }).catch(() => undefined);
	}
}
