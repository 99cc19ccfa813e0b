/**
 * The app process's kept reads (db/project-read-cache.ts), told about every
 * committed change by the database's change feed (db/change-feed.ts), and
 * about this process's own writes directly:
 *
 * - a statement that writes a watched table forgets everything at once, and
 *   nothing is kept or handed out again until the request that wrote has
 *   finished (its transactions are committed by then), so its redirect and
 *   the page a form action renders after the write both read the database;
 * - writes by other processes (workers, scripts, other app instances) arrive
 *   through the feed, at their commit;
 * - while the feed is not listening, nothing is kept at all.
 *
 * Started by hooks.server.ts; scripts and tests that never start it read
 * the database every time.
 */
import type { Knex } from 'knex';
import { startChangeFeed, type ChangeFeed } from './change-feed';
import { ProjectReadCache } from './project-read-cache';

/** Enough for every project and scenario a busy team has open; an editor's entry holds its whole document. */
const CAPACITY = 200;

let feed: ChangeFeed | undefined;
let stopWatching: (() => void) | undefined;
const writingRequests = new Set<object>();
/** A write after its request has answered (work left to run afterwards) holds nothing back: the feed reports its commit. */
const finishedRequests = new WeakSet<object>();

export const projectReads = new ProjectReadCache(CAPACITY, () => feed?.live === true && writingRequests.size === 0);

/** The tables whose rows the kept reads show (the migration's triggers announce the same ones). */
const WATCHED_WRITE = /^\s*(?:insert\s+into|update|delete\s+from)\s+"?(?:projects|scenarios|scenario_results|uploads|users)"?[\s(]/i;

/**
 * @param knex the app's query pool, watched for its own writes
 * @param currentRequest a key for the request a statement runs in (its `locals`), or undefined outside requests
 */
export function startCachedReads(knex: Knex, connectionString: string, currentRequest: () => object | undefined): void {
	if (feed) return;
	const watch = (query: { sql?: unknown }) => {
		if (typeof query.sql !== 'string' || !WATCHED_WRITE.test(query.sql)) return;
		projectReads.forgetAll();
		const request = currentRequest();
		if (request && !finishedRequests.has(request)) writingRequests.add(request);
	};
	knex.on('query', watch);
	stopWatching = () => knex.off('query', watch);
	feed = startChangeFeed(connectionString, {
		changed: (change) => (change.kind === 'all' ? projectReads.forgetAll() : projectReads.forgetProject(change.projectId)),
		lost: () => projectReads.forgetAll()
	});
}

/** At the end of every request: one that wrote has committed by now, so what was kept before is forgotten and keeping resumes. */
export function requestFinished(request: object): void {
	finishedRequests.add(request);
	if (writingRequests.delete(request)) projectReads.forgetAll();
}

export async function stopCachedReads(): Promise<void> {
	const open = feed;
	feed = undefined;
	stopWatching?.();
	stopWatching = undefined;
	writingRequests.clear();
	projectReads.forgetAll();
	await open?.stop();
}
