/**
 * Vitest global setup: one throw-away PostgreSQL cluster per test run, on a
 * free loopback port, in its own folder, so parallel runs never collide.
 * Each integration test file then makes its own database (tests/helpers/db.ts).
 */
import { mkdtempSync, mkdirSync } from 'node:fs';
import { createServer } from 'node:net';
import type {} from 'vitest';
import type { TestProject } from 'vitest/node';
import { removeCluster, startCluster, type ClusterSettings } from '../../docker-local/postgres';

async function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolve(port));
		});
	});
}

declare module 'vitest' {
	export interface ProvidedContext {
		postgresAdminUrl: string;
	}
}

export default async function setup(project: TestProject) {
	mkdirSync('/var/tmp/tidewright-test', { recursive: true, mode: 0o755 });
	const settings: ClusterSettings = {
		dataDir: mkdtempSync('/var/tmp/tidewright-test/pg-'),
		port: await freePort(),
		database: 'postgres'
	};
	process.env.PG_FSYNC = 'off';
	const url = startCluster(settings);
	project.provide('postgresAdminUrl', url);
	return () => removeCluster(settings);
}
