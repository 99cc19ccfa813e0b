/**
 * One command for a working Tidewright: local PostgreSQL (migrated, seeded when
 * empty), the local stand-ins, a build when the sources changed, the workers
 * for probabilistic runs (scripts/worker.ts; PROBABILISTIC_WORKERS, default 1), and the app on
 * http://127.0.0.1:3000. Ctrl-C stops everything it started.
 *
 *   tsx scripts/start.ts          production build (adapter-node)
 *   tsx scripts/start.ts --dev    Vite's dev server
 *   tsx scripts/start.ts --fresh  throw away the cluster in PG_DATA_DIR first (browser tests)
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { clusterSettingsFromEnv, projectRoot, removeCluster } from '../docker-local/postgres';
import { demoCredentialsText, extraServices, startPostgres, type RunningService } from './local-services';

const dev = process.argv.includes('--dev');
const fresh = process.argv.includes('--fresh');
const host = process.env.HOST ?? '127.0.0.1';
const port = process.env.PORT ?? (dev ? '5173' : '3000');
const origin = process.env.ORIGIN ?? `http://${host}:${port}`;

const services: RunningService[] = [];
let app: ChildProcess | undefined;
const workers: ChildProcess[] = [];
let stopping = false;

function newestMtime(path: string): number {
	if (!existsSync(path)) return 0;
	const stat = statSync(path);
	if (!stat.isDirectory()) return stat.mtimeMs;
	let newest = stat.mtimeMs;
	for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
	return newest;
}

function buildIsStale(): boolean {
	const built = join(projectRoot, 'build', 'index.js');
	if (!existsSync(built)) return true;
	const builtAt = statSync(built).mtimeMs;
	// docs/methods and examples/ are bundled into the build too.
	const inputs = ['src', 'static', 'docs', 'examples', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];
	return inputs.some((input) => newestMtime(join(projectRoot, input)) > builtAt);
}

/** SIGTERM, then SIGKILL when the child is still there after `graceMs`. */
async function stopChild(child: ChildProcess | undefined, graceMs: number) {
	if (!child || child.exitCode !== null || child.signalCode !== null) return;
	child.kill('SIGTERM');
	await new Promise((resolve) => {
		const timer = setTimeout(() => {
			child.kill('SIGKILL');
			resolve(undefined);
		}, graceMs);
		child.once('exit', () => {
			clearTimeout(timer);
			resolve(undefined);
		});
	});
}

async function shutdown(code: number) {
	if (stopping) return;
	stopping = true;
	// Each worker finishes the chunk in hand (well under a second) before PostgreSQL stops.
	await Promise.all([stopChild(app, 5_000), ...workers.map((w) => stopChild(w, 10_000))]);
	for (const service of services.reverse()) {
		try {
			await service.stop();
		} catch (error) {
			console.error(`[start] stopping ${service.name} failed:`, error);
		}
	}
	process.exit(code);
}

/** Worker processes to start: PROBABILISTIC_WORKERS, default 1. */
function workerCount(): number {
	const raw = process.env.PROBABILISTIC_WORKERS ?? '1';
	const count = Number(raw);
	if (!Number.isInteger(count) || count < 0 || count > 64) throw new Error(`PROBABILISTIC_WORKERS must be a whole number from 0 to 64; it is "${raw}".`);
	return count;
}

async function main() {
	mkdirSync(join(projectRoot, '.data'), { recursive: true });
	process.on('SIGINT', () => void shutdown(0));
	process.on('SIGTERM', () => void shutdown(0));

	// The stand-ins read where the app will listen (the Stripe stand-in posts its events there).
	process.env.PORT = port;
	process.env.ORIGIN = origin;
	if (fresh) removeCluster(clusterSettingsFromEnv());
	services.push(await startPostgres());
	for (const startService of extraServices) services.push(await startService());
	const serviceEnv = Object.assign({}, ...services.map((s) => s.env)) as Record<string, string>;
	// adapter-node refuses bodies over 512 KB by default; uploads may be up to 20 MB (src/lib/server/uploads).
	const env = { BODY_SIZE_LIMIT: '60M', ...process.env, ...serviceEnv, HOST: host, PORT: port, ORIGIN: origin };

	// Scenarios saved under an earlier engine get a result of this one (the others stay, for rooms frozen on them).
	const reevaluate = spawnSync('npx', ['tsx', '--tsconfig', 'scripts/tsconfig.json', 'scripts/reevaluate.ts', '--keep-old'], { cwd: projectRoot, env, stdio: 'inherit' });
	if (reevaluate.status !== 0) throw new Error('stored results could not be brought up to this engine');

	if (serviceEnv.STRIPE_STANDIN_URL) {
		// The stand-in starts empty: give the demo's paid workspaces their subscriptions again.
		// Not spawnSync: the stand-in answers from this very process.
		const demoBilling = spawn('npx', ['tsx', '--tsconfig', 'scripts/tsconfig.json', 'scripts/demo-billing.ts'], { cwd: projectRoot, env, stdio: 'inherit' });
		const status = await new Promise<number | null>((resolve) => demoBilling.once('exit', resolve));
		if (status !== 0) throw new Error('the demo subscriptions could not be made in the Stripe stand-in');
	}

	// Probabilistic runs are computed apart from the web server, by worker processes
	// taking jobs from PostgreSQL: one here unless PROBABILISTIC_WORKERS says otherwise (`npm run worker` starts more anywhere). Node with
	// tsx's loader rather than the tsx command, so the child is the worker itself.
	for (let i = 0; i < workerCount(); i++) {
		const worker = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
			cwd: projectRoot,
			env: { ...env, TSX_TSCONFIG_PATH: 'scripts/tsconfig.json' },
			stdio: 'inherit'
		});
		worker.once('exit', (code, signal) => {
			if (!stopping) console.error(`[start] a worker exited (${code ?? signal}); probabilistic runs wait until a worker runs (npm run worker)`);
		});
		workers.push(worker);
	}

	if (dev) {
		app = spawn('npx', ['vite', 'dev', '--host', host, '--port', port, '--strictPort'], {
			cwd: projectRoot,
			env,
			stdio: 'inherit'
		});
	} else {
		if (buildIsStale()) {
			console.log('[start] building the app…');
			const build = spawnSync('npx', ['vite', 'build'], { cwd: projectRoot, env, stdio: 'inherit' });
			if (build.status !== 0) throw new Error('the build failed');
		}
		app = spawn(process.execPath, ['build'], { cwd: projectRoot, env, stdio: 'inherit' });
	}
	app.once('exit', (code) => {
		if (!stopping) {
			console.error(`[start] the app exited (${code}); stopping the local services`);
			void shutdown(code ?? 1);
		}
	});
	console.log(`\n${demoCredentialsText(origin, host)}\n\nTidewright is starting on ${origin}\n`);
}

main().catch(async (error) => {
	console.error('[start]', error instanceof Error ? error.message : error);
	await shutdown(1);
});
