/**
 * `npm test`: the Debian packages the tests need (installed when missing, as
 * root), type-check, then the vitest unit and integration tests, then the
 * Playwright browser tests in Debian's Chromium. Ends with the pass/fail counts.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

interface Outcome {
	name: string;
	passed: number;
	failed: number;
	exitCode: number;
	/** Lines naming the failed tests, repeated in the summary so a log's tail shows them. */
	failures: string[];
}

const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/**
 * Debian packages the tests use: Chromium, jq for the worked API example in
 * docs/, poppler's pdftotext to read the PDF summary back, and LibreOffice
 * Calc (headless) to open the XLSX and CSV exports as a spreadsheet would.
 */
function ensureDebianPackages() {
	const missing = [
		{ path: chromiumPath, pkg: 'chromium' },
		{ path: '/usr/bin/jq', pkg: 'jq' },
		{ path: '/usr/bin/pdftotext', pkg: 'poppler-utils' },
		{ path: '/usr/bin/soffice', pkg: 'libreoffice-calc-nogui' }
	].filter((need) => !existsSync(need.path));
	if (missing.length === 0) return;
	const names = missing.map((m) => m.pkg);
	if (process.getuid?.() !== 0) {
		throw new Error(`Missing: ${names.join(', ')}. Install with: sudo apt-get install -y ${names.join(' ')}`);
	}
	console.log(`[test] installing Debian packages ${names.join(', ')} (apt-get)…`);
	for (const args of [['update', '-qq'], ['install', '-y', '-qq', ...names]]) {
		const result = spawnSync('apt-get', args, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
		if (result.status !== 0) throw new Error(`apt-get ${args.join(' ')} failed`);
	}
}

function stripAnsi(text: string) {
	// eslint-disable-next-line no-control-regex
	return text.replace(/\x1b\[[0-9;]*m/g, '');
}

type Count = (output: string) => { passed: number; failed: number; failures: string[] };

function runStep(name: string, command: string, args: string[], count: Count) {
	return new Promise<Outcome>((resolve) => {
		console.log(`\n[test] ── ${name} ──`);
		const child = spawn(command, args, { stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, FORCE_COLOR: '0' } });
		let output = '';
		child.stdout.on('data', (chunk) => {
			output += chunk;
			process.stdout.write(chunk);
		});
		child.stderr.on('data', (chunk) => {
			output += chunk;
			process.stderr.write(chunk);
		});
		child.on('close', (code) => resolve({ name, exitCode: code ?? 1, ...count(stripAnsi(output)) }));
	});
}

function numberAfter(text: string, pattern: RegExp): number {
	const match = text.match(pattern);
	return match ? Number(match[1]) : 0;
}

function linesMatching(text: string, pattern: RegExp): string[] {
	return [...new Set(text.split('\n').filter((line) => pattern.test(line)).map((line) => line.trim()))];
}

const countSvelteCheck: Count = (out) => {
	const errors = numberAfter(out, /found (\d+) errors?/);
	const warnings = numberAfter(out, /(\d+) warnings?/);
	const clean = errors + warnings === 0;
	return { passed: clean ? 1 : 0, failed: clean ? 0 : 1, failures: linesMatching(out, /^(Error|Warn):|\b(Error|Warning)\b.*\.(ts|svelte):\d+/) };
};
const countVitest: Count = (out) => {
	const line = out.split('\n').find((l) => /^\s*Tests\s/.test(l)) ?? '';
	return { passed: numberAfter(line, /(\d+) passed/), failed: numberAfter(line, /(\d+) failed/), failures: linesMatching(out, /^\s*FAIL\s/) };
};
const countPlaywright: Count = (out) => ({
	passed: numberAfter(out, /^\s*(\d+) passed/m),
	failed: numberAfter(out, /^\s*(\d+) failed/m) + numberAfter(out, /^\s*(\d+) flaky/m),
	failures: linesMatching(out, /^\s*[✘×]\s/)
});

async function main() {
	const outcomes: Outcome[] = [];
	// Before vitest: its tests read the PDF back with pdftotext and open the exports with soffice.
	ensureDebianPackages();
	outcomes.push(await runStep('svelte-check', 'npm', ['run', '--silent', 'check'], countSvelteCheck));
	outcomes.push(await runStep('vitest (unit + integration)', 'npx', ['vitest', 'run'], countVitest));
	outcomes.push(await runStep('playwright (Chromium)', 'npx', ['playwright', 'test'], countPlaywright));

	console.log('\n[test] ── summary ──');
	for (const o of outcomes) {
		console.log(`${o.name}: ${o.passed} passed, ${o.failed} failed${o.exitCode !== 0 ? ` (exit ${o.exitCode})` : ''}`);
		for (const failure of o.failures.slice(0, 20)) console.log(`  ${failure}`);
	}
	const passed = outcomes.reduce((n, o) => n + o.passed, 0);
	const failed = outcomes.reduce((n, o) => n + o.failed, 0);
	const broken = outcomes.some((o) => o.exitCode !== 0);
	console.log(`${passed} passed, ${failed} failed`);
	process.exit(broken || failed > 0 ? 1 : 0);
}

main().catch((error) => {
	console.error(error);
	process.exit(1);
});
