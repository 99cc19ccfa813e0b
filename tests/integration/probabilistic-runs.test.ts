/**
 * Probabilistic runs through the job queue: a real PostgreSQL, pg-boss, and
 * real worker processes (scripts/worker.ts) started and killed by this test.
 * The same seed gives the same run whatever the chunking; every draw is
 * recorded exactly once, even when a worker is killed mid-chunk; a cancel
 * stops a run; a broken document and a chunk that keeps failing fail it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { newWorkspaceOf } from '../helpers/people';
import { createProject } from '../../src/lib/server/db/projects';
import { createScenario, type ScenarioRecord } from '../../src/lib/server/db/scenarios';
import { getRun, listRunsOfScenario, listRunsOfWorkspace, type ProbabilisticRun } from '../../src/lib/server/db/probabilistic-runs';
import { parseScenario, type Scenario } from '../../src/lib/schemas/scenario';
import { runInputSchema, type RunInput, type RunInputDraft } from '../../src/lib/schemas/probabilistic';
import { evaluateDraw } from '../../src/lib/server/probabilistic/draw-evaluation';
import { energyComponentsOf } from '../../src/lib/server/probabilistic/energy-components';
import { createSampler } from '../../src/lib/server/probabilistic/sampling';
import { CHUNK_QUEUE, chunkJobId, openQueue, QUEUE_SCHEMA, type JobPolicy } from '../../src/lib/server/probabilistic/queue';
import { cancelRun, drawsCsv, runProgress, startRun } from '../../src/lib/server/probabilistic/runs';
import { csvNumber } from '../../src/lib/server/probabilistic/draws-csv';

let database: TestDatabase;
let boss: PgBoss;
let workspaceId: string;
let projectId: string;
let userId: string;
let scenario: ScenarioRecord;
const workers: Worker[] = [];

// Lost jobs are given up on after 3 s and looked for every second, so a killed worker's chunk comes back within seconds.
const jobPolicy: JobPolicy = { expireInSeconds: 3, retryLimit: 2, retryDelaySeconds: 0 };

const tidal: Scenario = (() => {
	const parsed = parseScenario(JSON.parse(readFileSync('examples/tidal-stream-kestle-narrows.json', 'utf8')));
	if (!parsed.ok) throw new Error('the tidal example does not parse');
	return parsed.scenario;
})();

function runInput(draft: Partial<RunInputDraft> = {}): RunInput {
	return runInputSchema.parse({
		drivers: [
			{ driver: 'capex', distribution: { shape: 'triangular', min: 0.9, mode: 1, max: 1.3 } },
			{ driver: 'opex', distribution: { shape: 'lognormal', mean: 1, sd: 0.1 } },
			{ driver: 'availability', distribution: { shape: 'truncated-normal', mean: 0.92, sd: 0.03, min: 0.8, max: 0.97 } }
		],
		correlations: [{ a: 'capex', b: 'opex', rankCorrelation: 0.5 }],
		energyUncertainty: true,
		seed: 20261208,
		draws: 400,
		hurdleRate: 0.08,
		...draft
	});
}

interface Worker {
	child: ChildProcess;
	/** The pid the worker logs for itself. */
	pid: number;
	output: string[];
	exited: Promise<number | null>;
}

/** A worker process as `npm run worker` starts it, waiting for its "working" line. */
async function startWorker(): Promise<Worker> {
	const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
		env: {
			...process.env,
			DATABASE_URL: database.url,
			TSX_TSCONFIG_PATH: 'scripts/tsconfig.json',
			PROBABILISTIC_MAINTENANCE_SECONDS: '1',
			PROBABILISTIC_POLL_SECONDS: '0.2'
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	const output: string[] = [];
	const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
	const pid = await new Promise<number>((resolve, reject) => {
		const timer = setTimeout(() => reject(new Error(`the worker did not start:\n${output.join('')}`)), 20_000);
		const read = (chunk: Buffer) => {
			output.push(chunk.toString());
			const match = /working probabilistic runs \(pid (\d+)\)/.exec(output.join(''));
			if (match) {
				clearTimeout(timer);
				resolve(Number(match[1]));
			}
		};
		child.stdout!.on('data', read);
		child.stderr!.on('data', read);
		void exited.then((code) => reject(new Error(`the worker exited (${code}):\n${output.join('')}`)));
	});
	const worker = { child, pid, output, exited };
	workers.push(worker);
	return worker;
}

async function stopWorker(worker: Worker): Promise<number | null> {
	if (worker.child.exitCode === null && worker.child.signalCode === null) process.kill(worker.pid, 'SIGTERM');
	return worker.exited;
}

async function waitFor<T>(what: string, read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 30_000): Promise<T> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const value = await read();
		if (done(value)) return value;
		if (Date.now() > until) throw new Error(`timed out waiting for ${what}: ${JSON.stringify(value)?.slice(0, 400)}`);
		await new Promise((resolve) => setTimeout(resolve, 50));
	}
}

const runNow = (id: string) => getRun(id, database.knex).then((run) => run!);
const ended = (run: ProbabilisticRun) => !['queued', 'running'].includes(run.state);

async function chunksOf(runId: string): Promise<{ chunk_index: number; first_draw: number; draw_count: number; worker: string; completed_at: Date }[]> {
	return database.knex('probabilistic_run_chunks').select('chunk_index', 'first_draw', 'draw_count', 'worker', 'completed_at').where({ run_id: runId }).orderBy('chunk_index');
}

/** Each chunk once, the chunks end to end from draw 0, their draws adding up to `total`. */
function expectChunksCover(chunks: { chunk_index: number; first_draw: number; draw_count: number }[], total: number, chunkSize: number) {
	expect(new Set(chunks.map((c) => c.chunk_index)).size).toBe(chunks.length);
	expect(chunks.map((c) => c.chunk_index)).toEqual(Array.from({ length: Math.ceil(total / chunkSize) }, (_, i) => i));
	let next = 0;
	for (const c of chunks) {
		expect(c.first_draw).toBe(next);
		next += c.draw_count;
	}
	expect(next).toBe(total);
}

function start(input: RunInput, chunkSize: number, policy: JobPolicy = jobPolicy, on: ScenarioRecord = scenario) {
	return startRun(
		{ workspaceId, projectId, scenarioId: on.id, revision: on.revision, document: on.document, input, userId },
		{ knex: database.knex, boss, jobPolicy: policy, chunkSize }
	);
}

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	boss = await openQueue({ url: database.url, supervise: false });
	const { owner, workspaceId: ws } = await newWorkspaceOf(database.knex);
	workspaceId = ws;
	userId = owner.id;
	projectId = (await createProject({ workspaceId, name: 'Kestle Narrows array', technology: 'tidal-stream' }, database.knex)).id;
	scenario = await createScenario({ projectId, name: 'Lender case', document: tidal, userId }, database.knex);
	await Promise.all([startWorker(), startWorker()]);
});

afterAll(async () => {
	await Promise.all(workers.map(stopWorker));
	await boss?.stop({ graceful: false });
	await database?.drop();
});

describe('probabilistic runs through worker processes', () => {
	it('gives the same summary and draws for one seed however the draws are chunked, each chunk recorded once', async () => {
		const input = runInput();
		const [inHundreds, inOddChunks] = await Promise.all([start(input, 100), start(input, 170)]);
		expect(inHundreds.state).toBe('queued');
		expect(runProgress(inHundreds).etaSeconds).toBeNull();
		const [a, b] = await Promise.all([
			waitFor('the first run', () => runNow(inHundreds.id), ended),
			waitFor('the second run', () => runNow(inOddChunks.id), ended)
		]);
		expect([a.state, b.state, a.failure, b.failure]).toEqual(['done', 'done', null, null]);
		expect([a.drawsDone, b.drawsDone]).toEqual([400, 400]);
		expect(runProgress(a)).toEqual({ drawsDone: 400, draws: 400, fraction: 1, etaSeconds: null });
		expectChunksCover(await chunksOf(a.id), 400, 100);
		expectChunksCover(await chunksOf(b.id), 400, 170);
		// Computed by the worker processes, not here.
		const pids = new Set(workers.map((w) => String(w.pid)));
		for (const c of [...(await chunksOf(a.id)), ...(await chunksOf(b.id))]) expect(pids.has(c.worker.split(':').pop()!)).toBe(true);

		expect(b.summary).toEqual(a.summary);
		const csvA = (await drawsCsv(a.id, database.knex))!;
		expect(await drawsCsv(b.id, database.knex)).toBe(csvA);

		// The rows are the draws themselves: draw i recomputed here from (seed, i) gives the same row.
		const rows = csvA.trimEnd().split('\r\n');
		expect(rows[0]).toBe('draw,capex,opex,availability,energyFactor,lcoeReal,projectIrrPostTax,equityIrr,npv,minDscr');
		expect(rows).toHaveLength(401);
		const sample = createSampler(input, energyComponentsOf(tidal), tidal.timeline.operatingYears);
		for (const i of [0, 171, 399]) {
			const v = sample(i);
			const o = evaluateDraw(tidal, { drivers: v.drivers, energyOutturn: v.energyFactor });
			const expected = [i, v.drivers.capex!, v.drivers.opex!, v.drivers.availability!, v.energyFactor, o.lcoeReal, o.projectIrrPostTax, o.equityIrr, o.npv, o.minDscr];
			expect(rows[i + 1]).toBe(expected.map((x, k) => (k === 0 ? String(x) : csvNumber(x as number | null))).join(','));
		}

		// The summary agrees with the draws: LCOE's P90 (lower is better) is its 90th percentile, NPV's its 10th.
		const summary = a.summary!;
		const column = (name: string) => rows.slice(1).map((r) => Number(r.split(',')[rows[0].split(',').indexOf(name)]));
		const lcoe = column('lcoeReal').sort((x, y) => x - y);
		expect(summary.outputs.lcoeReal.stats.count).toBe(400);
		// numpy.percentile (definition 7) of 400 values at 0.9: h = 399 * 0.9 = 359.1 (Hyndman and Fan 1996).
		expect(summary.outputs.lcoeReal.stats.p90).toBeCloseTo(lcoe[359] + 0.1 * (lcoe[360] - lcoe[359]), 6);
		expect(summary.outputs.lcoeReal.stats.p90!).toBeGreaterThan(summary.outputs.lcoeReal.stats.p10!);
		expect(summary.outputs.npv.stats.p90!).toBeLessThan(summary.outputs.npv.stats.p10!);
		expect(summary.thresholds).toEqual({ lockUpDscr: 1.15, hurdleRate: 0.08 });
		const minDscr = column('minDscr');
		expect(summary.probabilities.minDscrBelowLockUp).toBe(minDscr.filter((x) => x < 1.15).length / 400);
		expect(summary.probabilities.minDscrBelowOne).toBe(minDscr.filter((x) => x < 1).length / 400);
		// More capex, dearer energy: the LCOE follows capex; more energy, cheaper (common practice).
		const importance = Object.fromEntries(summary.importance.map((f) => [f.factor, f.rankCorrelation]));
		expect(Object.keys(importance)).toEqual(['capex', 'opex', 'availability', 'energyFactor']);
		expect(importance.capex.lcoeReal!).toBeGreaterThan(0.2);
		expect(importance.energyFactor.lcoeReal!).toBeLessThan(-0.2);

		const listed = await listRunsOfScenario(scenario.id, {}, database.knex);
		expect(new Set(listed.map((r) => r.id))).toEqual(new Set([inHundreds.id, inOddChunks.id]));
		expect(listed[0].createdAt.getTime()).toBeGreaterThanOrEqual(listed[1].createdAt.getTime());
		expect(listed.every((r) => r.state === 'done' && r.scenarioName === 'Lender case' && r.drawsDone === 400)).toBe(true);
		expect((await listRunsOfWorkspace(workspaceId, { liveOnly: true }, database.knex)).length).toBe(0);
	});

	it('finishes every draw exactly once when a worker is killed mid-chunk and another takes over', async () => {
		// Only the worker about to be killed works this run.
		const stopped = await Promise.all(workers.splice(0).map(stopWorker));
		expect(stopped).toEqual([0, 0]); // SIGTERM: a clean stop
		const doomed = await startWorker();
		const run = await start(runInput({ draws: 1000, seed: 7 }), 100);
		const activeJob = () =>
			database.knex
				.withSchema(QUEUE_SCHEMA)
				.from('job')
				.select('id', 'data')
				.where({ name: CHUNK_QUEUE, state: 'active' })
				.whereRaw(`data->>'runId' = ?`, [run.id])
				.first();
		await waitFor("a few chunks", () => runNow(run.id), (r) => r.drawsDone >= 200);
		const held = await waitFor('a chunk in hand', activeJob, (job) => job !== undefined);
		process.kill(doomed.pid, 'SIGKILL');
		await doomed.exited;
		const killedAt = Date.now();
		const before = await runNow(run.id);
		expect(before.state).toBe('running');
		expect(before.drawsDone).toBeLessThan(1000);
		const progress = runProgress(before);
		expect(progress.etaSeconds).not.toBeNull();
		expect(progress.etaSeconds!).toBeGreaterThan(0);

		const rescuer = await startWorker();
		const after = await waitFor('the run to finish', () => runNow(run.id), ended, 40_000);
		expect(after.state).toBe('done');
		expect(after.drawsDone).toBe(1000);
		const chunks = await chunksOf(run.id);
		expectChunksCover(chunks, 1000, 100);
		expect(chunks.some((c) => c.worker.endsWith(`:${rescuer.pid}`))).toBe(true);
		// The chunk the killed worker held was given up on and done again. When the killed worker had
		// recorded it before dying, the run can end before the retry does, so wait for the retry too.
		const retried = await waitFor(
			'the held chunk to be done again',
			() => database.knex.withSchema(QUEUE_SCHEMA).from('job').select('state', 'retry_count').where({ name: CHUNK_QUEUE, id: held!.id }).first(),
			(job) => job?.state === 'completed',
			20_000
		);
		expect(retried.retry_count).toBeGreaterThanOrEqual(1);
		expect(held!.id).toBe(chunkJobId(run.id, held!.data.chunkIndex));
		// Its draws count once (expectChunksCover): by the rescuer, or, when the kill came between
		// recording the chunk and telling the queue, by the killed worker before it died (the retry then
		// leaves that record as it is).
		const heldChunk = chunks.find((c) => c.chunk_index === held!.data.chunkIndex)!;
		if (heldChunk.worker.endsWith(`:${doomed.pid}`)) expect(heldChunk.completed_at.getTime()).toBeLessThanOrEqual(killedAt);
		else expect(heldChunk.worker.endsWith(`:${rescuer.pid}`)).toBe(true);
	});

	it('stops a cancelled run: no chunk is recorded after the cancel, its waiting jobs are withdrawn', async () => {
		const run = await start(runInput({ draws: 2000, seed: 11 }), 50);
		await waitFor('the run to start', () => runNow(run.id), (r) => r.drawsDone >= 100);
		expect(await cancelRun(run.id, { knex: database.knex, boss })).toBe(true);
		const cancelled = await runNow(run.id);
		expect(cancelled.state).toBe('cancelled');
		const atCancel = await chunksOf(run.id);
		await new Promise((resolve) => setTimeout(resolve, 1500));
		const later = await chunksOf(run.id);
		expect(later).toEqual(atCancel);
		expect((await runNow(run.id)).drawsDone).toBe(later.reduce((sum, c) => sum + c.draw_count, 0));
		expect(later.length).toBeLessThan(40);
		for (const c of later) expect(c.completed_at.getTime()).toBeLessThanOrEqual(cancelled.finishedAt!.getTime());
		const waiting = await database.knex.withSchema(QUEUE_SCHEMA).from('job').where({ name: CHUNK_QUEUE }).whereIn('state', ['created', 'retry']).whereRaw(`data->>'runId' = ?`, [run.id]).count({ n: '*' });
		expect(Number(waiting[0].n)).toBe(0);
		expect(await cancelRun(run.id, { knex: database.knex, boss })).toBe(false);
		expect(cancelled.summary).toBeNull();
	});

	it('fails a run whose stored revision no longer reads as a scenario, with the reason', async () => {
		const broken = await createScenario({ projectId, name: 'Broken revision', document: tidal, userId }, database.knex);
		// A document that bypassed validation (written by hand, or by an older release): no finance section.
		await database.knex('scenario_revisions').where({ scenario_id: broken.id, revision: broken.revision }).update({ document: database.knex.raw(`document - 'finance'`) });
		const run = await start(runInput({ draws: 200, seed: 3 }), 50, jobPolicy, broken);
		const after = await waitFor('the run to fail', () => runNow(run.id), ended);
		expect(after.state).toBe('failed');
		expect(after.failure).toMatch(/not a valid scenario.*finance/);
		expect(after.summary).toBeNull();
		expect(await chunksOf(run.id)).toEqual([]);
	});

	it('fails a run once a chunk has failed on every retry, with the last error', async () => {
		const refused = await createScenario({ projectId, name: 'Refused chunks', document: tidal, userId }, database.knex);
		// Chunks of this scenario's runs cannot be stored: every attempt fails in the database, as a lasting outage would.
		await database.knex.raw(`
			create function refuse_chunk() returns trigger language plpgsql as $$
			begin
				if exists (select 1 from probabilistic_runs r where r.id = new.run_id and r.scenario_id = '${refused.id}') then
					raise exception 'chunk storage refused for the test';
				end if;
				return new;
			end $$;
			create trigger refuse_chunk before insert on probabilistic_run_chunks for each row execute function refuse_chunk();
		`);
		const run = await start(runInput({ draws: 100, seed: 5 }), 50, { ...jobPolicy, retryLimit: 1 }, refused);
		const after = await waitFor('the run to fail', () => runNow(run.id), ended);
		expect(after.state).toBe('failed');
		expect(after.failure).toMatch(/failed on every attempt: .*chunk storage refused for the test/);
		const attempts = await database.knex.withSchema(QUEUE_SCHEMA).from('job').select('retry_count', 'state').where({ name: CHUNK_QUEUE }).whereRaw(`data->>'runId' = ?`, [run.id]);
		expect(attempts.some((j) => j.state === 'failed' && j.retry_count === 1)).toBe(true);
	});
});
