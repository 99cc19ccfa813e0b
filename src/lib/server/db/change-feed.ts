/**
 * This process's ear on PostgreSQL's `tidewright_changes` channel, which the
 * database's own triggers speak on whenever a project, its scenarios, their
 * stored results or its uploads change (migration 20261211000001). One
 * dedicated connection, outside the query pool, LISTENs; when it drops, the
 * feed says it is lost (so nothing read while deaf is trusted) and connects
 * again, with a growing pause.
 */
import pg from 'pg';

const CHANGE_CHANNEL = 'tidewright_changes';

export type Change = { kind: 'project'; projectId: string } | { kind: 'all' };

export interface ChangeListener {
	/** A change was committed. */
	changed(change: Change): void;
	/** The feed stopped or started hearing: whatever was kept may be out of date. */
	lost(): void;
}

export interface ChangeFeed {
	/** True while the LISTEN is in place: only then can a kept read be trusted. */
	readonly live: boolean;
	stop(): Promise<void>;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A notification's payload; anything not understood counts as a change to everything. */
function parseChange(payload: string | undefined): Change {
	const projectId = payload?.startsWith('project:') ? payload.slice('project:'.length) : '';
	return UUID.test(projectId) ? { kind: 'project', projectId: projectId.toLowerCase() } : { kind: 'all' };
}

export function startChangeFeed(connectionString: string, listener: ChangeListener, options: { firstRetryMs?: number; maxRetryMs?: number } = {}): ChangeFeed {
	const firstRetryMs = options.firstRetryMs ?? 500;
	const maxRetryMs = options.maxRetryMs ?? 30_000;
	let live = false;
	let stopped = false;
	let client: pg.Client | undefined;
	let retryMs = firstRetryMs;
	let retryTimer: NodeJS.Timeout | undefined;

	function deaf() {
		if (live) {
			live = false;
			listener.lost();
		}
	}

	function retry() {
		if (stopped || retryTimer) return;
		retryTimer = setTimeout(() => {
			retryTimer = undefined;
			void connect();
		}, retryMs);
		retryTimer.unref();
		retryMs = Math.min(retryMs * 2, maxRetryMs);
	}

	async function connect() {
		if (stopped) return;
		const next = new pg.Client({ connectionString, application_name: 'tidewright-change-feed' });
		client = next;
		next.on('notification', (message) => {
			if (message.channel === CHANGE_CHANNEL) listener.changed(parseChange(message.payload));
		});
		const dropped = () => {
			if (client !== next) return;
			client = undefined;
			deaf();
			next.end().catch(() => undefined);
			retry();
		};
		next.on('error', dropped);
		next.on('end', dropped);
		try {
			await next.connect();
			await next.query(`LISTEN ${CHANGE_CHANNEL}`);
		} catch {
			dropped();
			return;
		}
		if (stopped || client !== next) return;
		retryMs = firstRetryMs;
		live = true;
		// Whatever changed while nobody listened is unknown: start from nothing kept.
		listener.lost();
	}

	void connect();

	return {
		get live() {
			return live;
		},
		async stop() {
			stopped = true;
			if (retryTimer) clearTimeout(retryTimer);
			const open = client;
			client = undefined;
			deaf();
			await open?.end().catch(() => undefined);
		}
	};
}
