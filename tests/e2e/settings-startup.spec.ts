/**
 * The built app refuses to start without its settings, naming each missing or
 * malformed one (src/lib/server/settings.ts, checked in hooks.server.ts init).
 * Runs the same build the other browser tests use.
 */
import { spawnSync } from 'node:child_process';
import { expect, test } from '@playwright/test';
import { freePort } from '../helpers/free-port';

test('the built app stops at start-up, naming every missing or malformed setting', async () => {
	const port = await freePort();
	const env: Record<string, string> = { PATH: process.env.PATH ?? '', PORT: String(port), HOST: '127.0.0.1', ORIGIN: 'http://127.0.0.1/has/a/path', SMTP_PORT: 'twenty-five' };
	const run = spawnSync(process.execPath, ['build'], { env, encoding: 'utf8', timeout: 30_000 });
	expect(run.status, run.stderr).toBe(78);
	expect(run.stderr).toContain('Tidewright cannot start');
	expect(run.stderr).toMatch(/DATABASE_URL is not set/);
	expect(run.stderr).toMatch(/SMTP_HOST is not set/);
	expect(run.stderr).toMatch(/SMTP_PORT must be a port number/);
	expect(run.stderr).toMatch(/ORIGIN must be an origin/);
});
