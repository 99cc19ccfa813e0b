/**
 * A worker process for probabilistic runs: takes chunk jobs from the queue in
 * PostgreSQL (pg-boss) one at a time and computes their draws, away from the
 * web server. Start as many as there are cores to spare, on any machine that
 * reaches the database; `npm start` starts one.
 *
 *     DATABASE_URL=postgres://… npm run worker
 *
 * SIGTERM or SIGINT: the chunk in hand is finished (well under a second),
 * then the worker stops. A worker killed outright leaves its chunk to be
 * taken up again by another once the chunk's job expires.
 *
 * Optional settings, in seconds:
 *   PROBABILISTIC_MAINTENANCE_SECONDS  how often lost jobs are looked for (default 10)
 *   PROBABILISTIC_POLL_SECONDS         how long an idle worker waits before looking for work again (default 1)
 *
 * The worker lowers its own priority (nice +10, as the web server's compute
 * threads do): on a machine shared with a web process, requests go first.
 */
import { hostname, setPriority } from 'node:os';
import { closeDb } from '../src/lib/server/db/knex';
import { DEFAULT_MAINTENANCE_INTERVAL_SECONDS, openQueue, workChunks } from '../src/lib/server/probabilistic/queue';
import { chunkHandlers } from '../src/lib/server/probabilistic/runs';

function seconds(name: string, fallback: number, min: number): number {
	const raw = process.env[name];
	if (raw === undefined || raw === '') return fallback;
	const value = Number(raw);
	if (!Number.isFinite(value) || value < min) {
		console.error(`[worker] ${name} must be a number of seconds of at least ${min}, got "${raw}"`);
		process.exit(2);
	}
	return value;
}

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('[worker] DATABASE_URL is not set: give the PostgreSQL connection string of the app’s database');
	process.exit(2);
}
const maintenanceIntervalSeconds = Math.round(seconds('PROBABILISTIC_MAINTENANCE_SECONDS', DEFAULT_MAINTENANCE_INTERVAL_SECONDS, 1));
const pollingIntervalMs = seconds('PROBABILISTIC_POLL_SECONDS', 1, 0.05) * 1000;
const workerName = `${hostname()}:${process.pid}`;

// A signal may come twice (Ctrl-C reaches the whole process group, and `npm start`
// passes it on as well): the first one starts the stop, the others change nothing.
const stop = new AbortController();
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
	process.on(signal, () => {
		if (stop.signal.aborted) return;
		console.log(`[worker ${process.pid}] ${signal}: finishing the chunk in hand, then stopping`);
		stop.abort();
	});
}

try {
	setPriority(10);
} catch {
	// Not allowed here (some containers): the worker runs at the usual priority.
}

try {
	const boss = await openQueue({ url, supervise: true, maintenanceIntervalSeconds });
	console.log(`[worker ${process.pid}] working probabilistic runs (pid ${process.pid})`);
	await workChunks(boss, chunkHandlers({ worker: workerName }), { signal: stop.signal, pollingIntervalMs });
	await boss.stop({ graceful: true, timeout: 10_000 });
	await closeDb();
	console.log(`[worker ${process.pid}] stopped`);
} catch (error) {
	console.error(`[worker ${process.pid}]`, error instanceof Error ? error.message : error);
	process.exitCode = 1;
	await closeDb().catch(() => undefined);
}
