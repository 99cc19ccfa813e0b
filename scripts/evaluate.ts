/**
 * Evaluate a scenario file and print the result JSON.
 *
 *     npm run evaluate -- examples/tidal-stream-kestle-narrows.json [--tornado]
 *
 * Invalid input prints each problem with its field path (an unknown key with
 * the key probably meant) and exits with code 1. A document in an older
 * schemaVersion is upgraded in memory first; what moved is printed on stderr
 * (the file is left as it is).
 */
import { readFileSync } from 'node:fs';
import { parseScenario, SCHEMA_VERSION } from '../src/lib/schemas/scenario';
import { evaluateScenario } from '../src/lib/server/engine/evaluate';
import { defaultDrivers, tornado } from '../src/lib/server/engine/sensitivity';

function fail(message: string): never {
	process.stderr.write(`${message}\n`);
	process.exit(1);
}

const args = process.argv.slice(2);
const withTornado = args.includes('--tornado');
const files = args.filter((a) => !a.startsWith('--'));
if (files.length !== 1) fail('usage: npm run evaluate -- path/to/scenario.json [--tornado]');

let json: unknown;
try {
	json = JSON.parse(readFileSync(files[0], 'utf8'));
} catch (error) {
	fail(`cannot read ${files[0]} as JSON: ${(error as Error).message}`);
}

const parsed = parseScenario(json);
if (!parsed.ok) {
	const upgraded = parsed.upgradedFrom === null ? '' : ` (read as schema version ${SCHEMA_VERSION}, upgraded from version ${parsed.upgradedFrom})`;
	fail([`${files[0]} is not a valid scenario${upgraded}:`, ...parsed.issues.map((i) => `  ${i.path}: ${i.message}`)].join('\n'));
}
if (parsed.upgradedFrom !== null) {
	const notes = parsed.upgradeNotes.map((note) => `  ${note}`);
	process.stderr.write(
		[`note: ${files[0]} is in schema version ${parsed.upgradedFrom}; read as version ${SCHEMA_VERSION} (the file is unchanged):`, ...notes].join('\n') + '\n'
	);
}

const result = evaluateScenario(parsed.scenario);
const output = withTornado ? { ...result, tornado: tornado(parsed.scenario, defaultDrivers(parsed.scenario), 'lcoeReal') } : result;
process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
