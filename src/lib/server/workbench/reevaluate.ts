/**
 * After an engine change: every scenario's current revision gets a stored
 * result from this engine version, and (unless kept) results of other engine
 * versions are removed. Used by `npm run reevaluate`.
 */
import type { Knex } from 'knex';
import { deleteResultsOfOtherEngines, listCurrentRevisions } from '../db/scenario-results';
import { getScenarioById } from '../db/scenarios';
import { evaluateScenario } from '../engine/evaluate';
import { ENGINE_VERSION } from '../engine/version';
import { ApiProblem } from './api-route';
import { resultOfSavedScenario, type StoredResultOptions } from './stored-results';

export interface ReevaluationTally {
	computed: number;
	alreadyStored: number;
	refused: number;
	removed: number;
}

export async function reevaluateStoredResults(
	knex: Knex,
	options: { keepOld?: boolean; log?: (line: string) => void } & Pick<StoredResultOptions, 'engineVersion' | 'evaluate'> = {}
): Promise<ReevaluationTally> {
	const engineVersion = options.engineVersion ?? ENGINE_VERSION;
	const tally: ReevaluationTally = { computed: 0, alreadyStored: 0, refused: 0, removed: 0 };
	for (const { scenarioId, technology } of await listCurrentRevisions(knex)) {
		const scenario = await getScenarioById(scenarioId, knex);
		if (!scenario) continue;
		try {
			const saved = await resultOfSavedScenario(scenario, { technology }, { knex, engineVersion, evaluate: options.evaluate ?? evaluateScenario });
			if (saved.reused) tally.alreadyStored += 1;
			else tally.computed += 1;
		} catch (e) {
			if (!(e instanceof ApiProblem)) throw e;
			tally.refused += 1;
			const details = e.issues.map((i) => `${i.path}: ${i.message}`).join('; ');
			options.log?.(`  "${scenario.name}" (${scenarioId}, revision ${scenario.revision}) was not evaluated: ${e.message}${details ? ` ${details}` : ''}`);
		}
	}
	if (!options.keepOld) tally.removed = await deleteResultsOfOtherEngines(engineVersion, knex);
	return tally;
}
