/**
 * HTTP headroom, measured against a bare SvelteKit page built from the same
 * package versions on the same machine in the same run, so the figures are
 * ratios that travel between machines:
 *
 *   npm run bench:http                 50 connections, 20 s a page
 *   npm run bench:http -- --seconds 5  shorter runs
 *
 * Starts its own cluster, mail sink and app (port 3200, cluster 54341) with
 * the demo seed, and the bare app on port 3201 (beside its bare page, an
 * empty page of the workbench pages' route shape: what the framework alone
 * costs for it). Prints requests per second,
 * latency percentiles and the ratio of each workbench page to the bare page,
 * then the health route's latency while draft evaluations and tornado
 * requests load the server. Goals (issue: hardening and headroom): projects
 * and project pages at least 0.5 of the bare page, the editor at least 0.25,
 * health p99 under 50 ms under engine load. Figures, not a pass/fail test.
 */
import autocannon, { type Result } from 'autocannon';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdirSync, rmSync, symlinkSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { projectRoot } from '../docker-local/postgres';
import { signIn, waitFor } from './bench-client';

const seconds = Number(process.argv[process.argv.indexOf('--seconds') + 1]) || 20;
const connections = 50;
const appPort = 3200;
const barePort = 3201;
const app = `http://127.0.0.1:${appPort}`;
const bare = `http://127.0.0.1:${barePort}`;
const children: ChildProcess[] = [];

function startApp() {
	const child = spawn('npx', ['tsx', 'scripts/start.ts', '--fresh'], {
		cwd: projectRoot,
		env: {
			...process.env,
			PORT: String(appPort),
			HOST: '127.0.0.1',
			ORIGIN: app,
			PGPORT_LOCAL: '54341',
			PG_DATA_DIR: '.data/pg-bench',
			PG_FSYNC: 'off',
			MAIL_SINK_SMTP_PORT: '54345',
			MAIL_SINK_HTTP_PORT: '54346',
			STRIPE_STANDIN_PORT: '54347',
			// Bench-only: lifts the per-user limits on engine routes, so the engine load below is real load, not 429s.
			TIDEWRIGHT_BENCH: '1'
		},
		stdio: ['ignore', 'ignore', 'inherit'],
		detached: true
	});
	children.push(child);
}

/** A SvelteKit app with one static page, built with this project's own packages. */
function buildAndStartBare() {
	const dir = '/var/tmp/tidewright-bench-bare';
	rmSync(dir, { recursive: true, force: true });
	mkdirSync(join(dir, 'src/routes'), { recursive: true });
	symlinkSync(join(projectRoot, 'node_modules'), join(dir, 'node_modules'));
	writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'bare', private: true, type: 'module' }));
	writeFileSync(join(dir, 'svelte.config.js'), "import adapter from '@sveltejs/adapter-node';\nexport default { kit: { adapter: adapter() } };\n");
	writeFileSync(join(dir, 'vite.config.js'), "import { sveltekit } from '@sveltejs/kit/vite';\nexport default { plugins: [sveltekit()] };\n");
	writeFileSync(join(dir, 'src/app.html'), '<!doctype html><html><head>%sveltekit.head%</head><body>%sveltekit.body%</body></html>\n');
	writeFileSync(join(dir, 'src/routes/+page.svelte'), '<h1>Bare</h1>\n<p>A page with nothing behind it.</p>\n');
	writeEmptyPageOfTheAppsShape(dir);
	const built = spawnSync('npx', ['vite', 'build'], { cwd: dir, stdio: 'ignore' });
	if (built.status !== 0 || !existsSync(join(dir, 'build/index.js'))) throw new Error('the bare app did not build');
	const child = spawn(process.execPath, ['build'], { cwd: dir, env: { ...process.env, PORT: String(barePort), HOST: '127.0.0.1' }, stdio: 'ignore', detached: true });
	children.push(child);
}

/**
 * Beside the bare page, in the same app: a page with the workbench pages'
 * shape and nothing in it (three layouts above it, four server loads of a
 * few fields each), to show what the framework's own work for that shape
 * costs before the app does anything.
 */
function writeEmptyPageOfTheAppsShape(dir: string) {
	const levels: [string, string, string][] = [
		['src/routes/(shape)', "export const load = ({ request }) => ({ locale: request.headers.get('accept-language') ?? 'en' });", '<script>let { children } = $props();</script><div>{@render children()}</div>'],
		[
			'src/routes/(shape)/shape',
			"export const load = () => ({ user: { name: 'Bench', email: 'bench@example.invalid' }, workspaces: [{ id: 'w', name: 'W', role: 'owner' }] });",
			'<script>let { data, children } = $props();</script><nav>{data.user.name}{#each data.workspaces as w}<a href="/shape/{w.id}">{w.name}</a>{/each}</nav>{@render children()}'
		],
		['src/routes/(shape)/shape/w', "export const load = () => ({ workspace: { id: 'w', name: 'W', role: 'owner' }, locale: 'en' });", '<script>let { children } = $props();</script>{@render children()}']
	];
	for (const [path, load, layout] of levels) {
		mkdirSync(join(dir, path), { recursive: true });
		writeFileSync(join(dir, path, '+layout.server.js'), `${load}\n`);
		writeFileSync(join(dir, path, '+layout.svelte'), `${layout}\n`);
	}
	mkdirSync(join(dir, 'src/routes/(shape)/shape/w/page'), { recursive: true });
	writeFileSync(join(dir, 'src/routes/(shape)/shape/w/page/+page.server.js'), 'export const load = () => ({ items: [{ n: 1 }, { n: 2 }] });\n');
	writeFileSync(join(dir, 'src/routes/(shape)/shape/w/page/+page.svelte'), '<script>let { data } = $props();</script><h1>Shape</h1>{#each data.items as item}<p>{item.n}</p>{/each}\n');
}

async function json<T>(path: string, cookie: string): Promise<T> {
	const response = await fetch(`${app}${path}`, { headers: { cookie, accept: 'application/json' } });
	if (!response.ok) throw new Error(`${path}: ${response.status}`);
	return response.json() as Promise<T>;
}

function run(options: autocannon.Options): Promise<Result> {
	return new Promise((resolve, reject) => {
		autocannon({ ...options, duration: options.duration ?? seconds }, (error, result) => (error ? reject(error) : resolve(result)));
	});
}

function line(name: string, r: Result, reference?: Result) {
	const ratio = reference ? (r.requests.average / reference.requests.average).toFixed(2) : '1.00';
	const failures = r.non2xx + r.errors + r.timeouts;
	console.log(
		`${name.padEnd(34)} ${r.requests.average.toFixed(0).padStart(6)} req/s  ratio ${ratio.padStart(5)}  p50 ${String(r.latency.p50).padStart(5)} ms  p99 ${String(r.latency.p99).padStart(5)} ms  ${(r.throughput.average / 1024).toFixed(0).padStart(6)} KB/s${failures ? `  (${failures} failed)` : ''}`
	);
}

async function main() {
	console.log(`[bench:http] ${connections} connections, ${seconds} s a page; starting the app and the bare page…`);
	startApp();
	buildAndStartBare();
	await Promise.all([waitFor(`${app}/api/v1/health`), waitFor(bare)]);

	const cookie = await signIn(app);
	const { workspaces } = await json<{ workspaces: { id: string }[] }>('/api/v1/workspaces', cookie);
	const workspaceId = workspaces[0].id;
	const { projects } = await json<{ projects: { id: string }[] }>(`/api/v1/workspaces/${workspaceId}/projects`, cookie);
	const projectId = projects[0].id;
	const { scenarios } = await json<{ scenarios: { id: string }[] }>(`/api/v1/projects/${projectId}/scenarios`, cookie);
	const scenarioId = scenarios[0].id;
	const { scenario } = await json<{ scenario: { document: unknown } }>(`/api/v1/scenarios/${scenarioId}`, cookie);
	const headers = { cookie, origin: app };

	const pages: [string, string][] = [
		['projects page', `/app/w/${workspaceId}`],
		['project page', `/app/w/${workspaceId}/projects/${projectId}`],
		['scenario editor', `/app/w/${workspaceId}/projects/${projectId}/scenarios/${scenarioId}`]
	];
	const editorBytes = (await (await fetch(`${app}${pages[2][1]}`, { headers })).arrayBuffer()).byteLength;

	const reference = await run({ url: bare, connections });
	line('bare SvelteKit page', reference);
	line('empty page of the app pages\' shape', await run({ url: `${bare}/shape/w/page`, connections }), reference);
	const ratios: Record<string, number> = {};
	for (const [name, path] of pages) {
		const result = await run({ url: `${app}${path}`, connections, headers });
		line(name, result, reference);
		ratios[name] = result.requests.average / reference.requests.average;
	}
	console.log(`scenario editor page: ${(editorBytes / 1024).toFixed(0)} KB`);

	// Health while the engine works: draft evaluations and tornado requests, as an analyst editing would send.
	const quiet = await run({ url: `${app}/api/v1/health`, connections: 2, duration: Math.min(seconds, 5) });
	line('health, quiet', quiet);
	const body = JSON.stringify({ document: scenario.document });
	const load = [
		run({ url: `${app}/api/v1/scenarios/${scenarioId}/evaluate`, method: 'POST', connections: 8, headers: { ...headers, 'content-type': 'application/json' }, body }),
		run({
			url: `${app}/api/v1/scenarios/${scenarioId}/tornado`,
			method: 'POST',
			connections: 2,
			headers: { ...headers, 'content-type': 'application/json' },
			body: JSON.stringify({ metric: 'lcoeReal' })
		})
	];
	await new Promise((r) => setTimeout(r, 1000));
	const loaded = await run({ url: `${app}/api/v1/health`, connections: 2, duration: Math.max(1, seconds - 2) });
	const [evaluations, tornados] = await Promise.all(load);
	line('draft evaluate (load)', evaluations);
	line('tornado (load)', tornados);
	line('health, under engine load', loaded);

	const listed = await fetch(`${app}/api/v1/workspaces/${workspaceId}/projects`, { headers });
	console.log(`projects list API: ${listed.headers.get('content-length') ?? '?'} bytes for ${projects.length} projects`);

	console.log('\n[bench:http] goals');
	const goal = (what: string, ok: boolean, figure: string) => console.log(`  ${ok ? 'met ' : 'MISS'}  ${what}: ${figure}`);
	goal('projects page >= 0.5 of bare', ratios['projects page'] >= 0.5, ratios['projects page'].toFixed(2));
	goal('project page >= 0.5 of bare', ratios['project page'] >= 0.5, ratios['project page'].toFixed(2));
	goal('editor >= 0.25 of bare', ratios['scenario editor'] >= 0.25, ratios['scenario editor'].toFixed(2));
	goal('health p99 < 50 ms under engine load', loaded.latency.p99 < 50, `${loaded.latency.p99} ms`);
}

function stopAll() {
	for (const child of children) {
		try {
			if (child.pid) process.kill(-child.pid, 'SIGTERM');
		} catch {
			// already gone
		}
	}
}

main()
	.catch((error) => {
		console.error('[bench:http]', error instanceof Error ? error.message : error);
		process.exitCode = 1;
	})
	.finally(() => {
		stopAll();
		setTimeout(() => process.exit(), 3000).unref();
	});
