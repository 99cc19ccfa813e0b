/**
 * Recomputes stored results after an engine change (ENGINE_VERSION raised).
 *
 *     npm run reevaluate                 against DATABASE_URL (npm start's local cluster by default)
 *     npm run reevaluate -- --keep-old   leave results of other engine versions in place
 */
import knexFactory from 'knex';
import { defaultDatabaseUrl, knexConfig } from '../knexfile';
import { ENGINE_VERSION } from '../src/lib/server/engine/version';
import { reevaluateStoredResults } from '../src/lib/server/workbench/reevaluate';

const knex = knexFactory(knexConfig(process.env.DATABASE_URL ?? defaultDatabaseUrl));
try {
	const t = await reevaluateStoredResults(knex, { keepOld: process.argv.includes('--keep-old'), log: (line) => console.log(line) });
	console.log(
		`engine ${ENGINE_VERSION}: ${t.computed} computed, ${t.alreadyStored} already stored, ${t.refused} could not be evaluated, ${t.removed} results of other engine versions removed`
	);
} catch (error) {
	console.error('[reevaluate]', error instanceof Error ? error.message : error);
	process.exitCode = 1;
} finally {
	await knex.destroy();
}
