/**
 * Evaluate a scenario file and print the result JSON.
 *
 *     npm run evaluate -- examples/tidal-stream-kestle-narrows.json [--tornado]
 *
 * Invalid input prints each problem with its field path and exits with code 1.
 */
import { readFileSync } from 'node:fs';
import { parseScenario } from '../src/lib/schemas/scenario';
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
	fail([`${files[0]} is not a valid scenario:`, ...parsed.issues.map((i) => `  ${i.path}: ${i.message}`)].join('\n'));
}

const result = evaluateScenario(parsed.scenario);
const output = withTornado ? { ...result, tornado: tornado(parsed.scenario, defaultDrivers(parsed.scenario), 'lcoeReal') } : result;
process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
