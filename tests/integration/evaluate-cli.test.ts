/**
 * The evaluate command (`npm run evaluate -- file.json`) run as a user runs it:
 * a separate process on a file, judged by its exit code and its output.
 */
import { SCHEMA_VERSION } from '../../src/lib/schemas/scenario-upgrades';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const directory = mkdtempSync(join(tmpdir(), 'tidewright-evaluate-'));
afterAll(() => rmSync(directory, { recursive: true, force: true }));

const example = JSON.parse(readFileSync('examples/ocean-current-mornstrand.json', 'utf8'));

function evaluateFile(name: string, document: unknown) {
	const file = join(directory, name);
	writeFileSync(file, JSON.stringify(document));
	const run = spawnSync('npx', ['tsx', 'scripts/evaluate.ts', file], { encoding: 'utf8', timeout: 60_000 });
	return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

describe('scripts/evaluate.ts', () => {
	it('refuses a misspelt key with exit code 1, naming its path and the key probably meant', () => {
		const run = evaluateFile('misspelt.json', { ...example, array: { ...example.array, availabilty: 0.5 } });
		expect(run.status).toBe(1);
		expect(run.stdout).toBe('');
		expect(run.stderr).toContain('is not a valid scenario');
		expect(run.stderr).toContain('array.availabilty: "availabilty" is not a field here; did you mean "availability"?');
	});

	it('reads a version 1 file through the upgrade, says what moved, and gives the figures of its current form', () => {
		const version1 = {
			...example,
			schemaVersion: 1,
			decommissioning: { basis: 'percent-of-capex', amount: example.decommissioning.fraction },
			revenue: {
				...example.revenue,
				grants: example.revenue.grants.map((g: { name: string; basis: string; fraction: number }) => ({ name: g.name, basis: g.basis, amount: g.fraction }))
			}
		};
		const old = evaluateFile('version-1.json', version1);
		expect(old.status).toBe(0);
		expect(old.stderr).toContain(`is in schema version 1; read as version ${SCHEMA_VERSION}`);
		expect(old.stderr).toContain('decommissioning.amount moved to decommissioning.fraction (percent-of-capex)');
		// Version 2 indexed a partly indexed tariff by scaled inflation; the upgrade says so, and the current form must too.
		const partlyIndexed = example.revenue.tariffIndexation > 0 && example.revenue.tariffIndexation < 1;
		const current = evaluateFile('current.json', partlyIndexed ? { ...example, revenue: { ...example.revenue, indexationMethod: 'scaled-inflation' } } : example);
		expect(current.status).toBe(0);
		expect(current.stderr).toBe('');
		expect(JSON.parse(old.stdout).metrics).toEqual(JSON.parse(current.stdout).metrics);
	});

	it('refuses a document written by a newer version', () => {
		const run = evaluateFile('newer.json', { ...example, schemaVersion: SCHEMA_VERSION + 1 });
		expect(run.status).toBe(1);
		expect(run.stderr).toContain(`schemaVersion: schemaVersion ${SCHEMA_VERSION + 1} is newer than this Tidewright reads`);
	});
});
