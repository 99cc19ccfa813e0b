/**
 * Writes the scenario document's JSON Schema (zod's own converter, input
 * side: fields with defaults are optional) to docs/scenario.schema.json.
 *
 *     npx tsx scripts/export-schema.ts          write the file
 *     npx tsx scripts/export-schema.ts --check  exit 1 if the file is out of date
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { scenarioSchema, SCHEMA_VERSION } from '../src/lib/schemas/scenario';

const target = join(process.cwd(), 'docs', 'scenario.schema.json');
const schema = {
	...z.toJSONSchema(scenarioSchema, { io: 'input', target: 'draft-2020-12' }),
	$id: `https://tidewright.example/schemas/scenario-v${SCHEMA_VERSION}.json`,
	title: `Tidewright scenario, schema version ${SCHEMA_VERSION}`
};
const text = `${JSON.stringify(schema, null, 2)}\n`;

if (process.argv.includes('--check')) {
	let current = '';
	try {
		current = readFileSync(target, 'utf8');
	} catch {
		// missing counts as out of date
	}
	if (current !== text) {
		process.stderr.write(`${target} is out of date: run npx tsx scripts/export-schema.ts\n`);
		process.exit(1);
	}
	process.stdout.write(`${target} is up to date\n`);
} else {
	writeFileSync(target, text);
	process.stdout.write(`wrote ${target}\n`);
}
