/**
 * The local PostgreSQL cluster: found from Debian's package, created in a
 * git-ignored folder, served on loopback only, on a port of the project's own.
 *
 *   tsx docker-local/postgres.ts start|stop|status|url
 *
 * Settings: PGPORT_LOCAL (default 54320), PG_DATA_DIR (default .data/pg),
 * PG_DATABASE (default tidewright).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmSync, statSync, chmodSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export interface ClusterSettings {
	dataDir: string;
	port: number;
	database: string;
}

export const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..');

export function clusterSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): ClusterSettings {
	return {
		dataDir: resolve(projectRoot, env.PG_DATA_DIR ?? '.data/pg'),
		port: Number(env.PGPORT_LOCAL ?? 54320),
		database: env.PG_DATABASE ?? 'tidewright'
	};
}

export function databaseUrl(settings: ClusterSettings, database = settings.database): string {
	return `postgres://postgres@127.0.0.1:${settings.port}/${database}`;
}

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function log(message: string) {
	process.stderr.write(`[postgres] ${message}\n`);
}

function findBinDir(): string | null {
	const candidates: string[] = [];
	try {
		candidates.push(execFileSync('pg_config', ['--bindir'], { encoding: 'utf8' }).trim());
	} catch {
		/* pg_config absent: look in Debian's folders */
	}
	if (existsSync('/usr/lib/postgresql')) {
		const versions = readdirSync('/usr/lib/postgresql').sort((a, b) => Number(b) - Number(a));
		for (const v of versions) candidates.push(`/usr/lib/postgresql/${v}/bin`);
	}
	return candidates.find((dir) => existsSync(join(dir, 'initdb')) && existsSync(join(dir, 'pg_ctl'))) ?? null;
}

/** Debian's postgresql package brings initdb and pg_ctl; install it as root when missing. */
export function ensureBinaries(): string {
	let bin = findBinDir();
	if (bin && (!isRoot || userExists('postgres'))) return bin;
	if (!isRoot) {
		throw new Error(
			'PostgreSQL server binaries (initdb, pg_ctl) were not found. Install them with: sudo apt-get install -y postgresql'
		);
	}
	log('installing Debian package postgresql (apt-get)…');
	run('apt-get', ['update', '-qq']);
	run('apt-get', ['install', '-y', '-qq', 'postgresql'], { DEBIAN_FRONTEND: 'noninteractive' });
	bin = findBinDir();
	if (!bin) throw new Error('apt-get installed postgresql but initdb was still not found under /usr/lib/postgresql');
	return bin;
}

function userExists(name: string): boolean {
	return spawnSync('id', ['-u', name]).status === 0;
}

function run(cmd: string, args: string[], extraEnv: Record<string, string> = {}) {
	const result = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...extraEnv } });
	if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed with exit code ${result.status}`);
}

/** Run a PostgreSQL binary as the unprivileged `postgres` user when we are root. */
function pg(bin: string, tool: string, args: string[], options: { allowFailure?: boolean } = {}) {
	const command = isRoot ? 'runuser' : join(bin, tool);
	const fullArgs = isRoot ? ['-u', 'postgres', '--', join(bin, tool), ...args] : args;
	const result = spawnSync(command, fullArgs, { encoding: 'utf8' });
	if (result.status !== 0 && !options.allowFailure) {
		throw new Error(`${tool} ${args.join(' ')} failed (exit ${result.status}):\n${result.stderr}${result.stdout}`);
	}
	return result;
}

/**
 * The postgres user must be able to walk to the data folder. A clone under a
 * private folder (mode 700) breaks that, so such a clone keeps its cluster in
 * a reachable folder named after the clone's path instead.
 */
export function reachableDataDir(dataDir: string): string {
	if (!isRoot) return dataDir;
	let dir = dirname(dataDir);
	while (!existsSync(dir)) dir = dirname(dir);
	for (let d = dir; ; d = dirname(d)) {
		if ((statSync(d).mode & 0o001) === 0) {
			const key = createHash('sha256').update(dataDir).digest('hex').slice(0, 12);
			const fallback = `/var/tmp/tidewright-pg/${key}`;
			log(`${d} is not reachable by the postgres user; keeping the cluster in ${fallback}`);
			return fallback;
		}
		if (d === dirname(d)) break;
	}
	return dataDir;
}

function ensureOwnedDir(dir: string) {
	mkdirSync(dir, { recursive: true });
	if (isRoot) {
		run('chown', ['postgres:postgres', dir]);
	}
	chmodSync(dir, 0o700);
}

function socketDir(dataDir: string) {
	return join(dataDir, 'socket');
}

export function isRunning(settings: ClusterSettings): boolean {
	const bin = ensureBinaries();
	const dataDir = reachableDataDir(settings.dataDir);
	if (!existsSync(join(dataDir, 'PG_VERSION'))) return false;
	return pg(bin, 'pg_ctl', ['-D', dataDir, 'status'], { allowFailure: true }).status === 0;
}

/** Create (first time) and start the cluster, then make sure the database exists. Safe to run twice. */
export function startCluster(settings: ClusterSettings): string {
	const bin = ensureBinaries();
	const dataDir = reachableDataDir(settings.dataDir);
	if (!existsSync(join(dataDir, 'PG_VERSION'))) {
		log(`creating cluster in ${dataDir}`);
		rmSync(dataDir, { recursive: true, force: true });
		ensureOwnedDir(dataDir);
		pg(bin, 'initdb', ['-D', dataDir, '-U', 'postgres', '--auth=trust', '--encoding=UTF8', '--locale=C.UTF-8']);
	}
	const sock = socketDir(dataDir);
	if (!existsSync(sock)) ensureOwnedDir(sock);

	const status = pg(bin, 'pg_ctl', ['-D', dataDir, 'status'], { allowFailure: true });
	if (status.status !== 0) {
		// A crash can leave a pid file behind; pg_ctl status says "no server running", so it is stale.
		const pidFile = join(dataDir, 'postmaster.pid');
		if (existsSync(pidFile)) {
			log('removing stale postmaster.pid');
			rmSync(pidFile, { force: true });
		}
		const logFile = join(dataDir, 'server.log');
		const options = `-c listen_addresses=127.0.0.1 -p ${settings.port} -c unix_socket_directories=${sock} -c fsync=${process.env.PG_FSYNC ?? 'on'}`;
		const started = pg(bin, 'pg_ctl', ['-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', options, 'start'], {
			allowFailure: true
		});
		if (started.status !== 0) {
			const tail = existsSync(logFile) ? readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
			throw new Error(`PostgreSQL did not start on port ${settings.port}:\n${started.stderr}\n${tail}`);
		}
		log(`started on 127.0.0.1:${settings.port}`);
	} else {
		log(`already running (${dataDir})`);
	}
	ensureDatabase(bin, settings);
	return databaseUrl(settings);
}

function ensureDatabase(bin: string, settings: ClusterSettings) {
	const psql = (sql: string) =>
		pg(bin, 'psql', ['-h', '127.0.0.1', '-p', String(settings.port), '-U', 'postgres', '-d', 'postgres', '-tAc', sql]);
	const exists = psql(`SELECT 1 FROM pg_database WHERE datname = '${settings.database.replace(/'/g, "''")}'`);
	if (exists.stdout.trim() !== '1') {
		psql(`CREATE DATABASE "${settings.database.replace(/"/g, '""')}"`);
		log(`created database ${settings.database}`);
	}
}

export function stopCluster(settings: ClusterSettings) {
	const bin = ensureBinaries();
	const dataDir = reachableDataDir(settings.dataDir);
	if (!existsSync(join(dataDir, 'PG_VERSION'))) return;
	const status = pg(bin, 'pg_ctl', ['-D', dataDir, 'status'], { allowFailure: true });
	if (status.status !== 0) return;
	pg(bin, 'pg_ctl', ['-D', dataDir, '-m', 'fast', '-w', '-t', '60', 'stop']);
	log('stopped');
}

export function removeCluster(settings: ClusterSettings) {
	stopCluster(settings);
	rmSync(reachableDataDir(settings.dataDir), { recursive: true, force: true });
}

function main() {
	mkdirSync(join(projectRoot, '.data'), { recursive: true });
	const settings = clusterSettingsFromEnv();
	const command = process.argv[2] ?? 'status';
	switch (command) {
		case 'start':
			console.log(startCluster(settings));
			break;
		case 'stop':
			stopCluster(settings);
			break;
		case 'status':
			console.log(isRunning(settings) ? `running on 127.0.0.1:${settings.port}` : 'stopped');
			break;
		case 'url':
			console.log(databaseUrl(settings));
			break;
		default:
			console.error('usage: tsx docker-local/postgres.ts start|stop|status|url');
			process.exit(2);
	}
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
	try {
		main();
	} catch (error) {
		console.error(error instanceof Error ? error.message : error);
		process.exit(1);
	}
}
