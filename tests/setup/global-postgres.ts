/**
 * Vitest global setup: one throw-away PostgreSQL cluster per test run, on a
 * free loopback port, in its own folder, so parallel runs never collide.
 * Each integration test file then makes its own database (tests/helpers/db.ts).
 */
import { mkdtempSync, mkdirSync } from 'node:fs';
import { freePort } from '../helpers/free-port';
import type {} from 'vitest';
import type { TestProject } from 'vitest/node';
import { removeCluster, startCluster, type ClusterSettings } from '../../docker-local/postgres';

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
