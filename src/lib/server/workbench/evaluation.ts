/**
 * Running the engine for an API request: the saved document (a read, open to
 * viewers) or an unsaved draft sent in the body (analysts and owners).
 */
import { error } from '@sveltejs/kit';
import { roleAtLeast } from '../auth/roles';
import { getScenarioById, type ScenarioRecord } from '../db/scenarios';
import type { EngineResult } from '../engine/evaluate';
import { evaluateOnPool } from '../compute/pool';
import type { Scenario } from '../../schemas/scenario';
import { ApiProblem, validateDocument } from './api-route';
import type { ScenarioAccess } from '../auth/access';

/**
 * Runs an engine call (on the compute pool, or here), turning the engine's
 * refusals of an input (RangeError, also when it crossed back from a worker
 * thread) into a 422 answer.
 */
export async function runEngine<T>(compute: () => T | Promise<T>): Promise<T> {
	try {
		return await compute();
	} catch (e) {
		if (e instanceof RangeError) throw new ApiProblem(422, `The engine cannot evaluate this scenario: ${e.message}.`);
		throw e;
	}
}

/** The engine's result for a document, computed on the compute pool. */
export function evaluateDocument(document: Scenario): Promise<EngineResult> {
	return runEngine(() => evaluateOnPool(document));
}

export async function loadScenario(scenarioId: string): Promise<ScenarioRecord> {
	const scenario = await getScenarioById(scenarioId);
	if (!scenario) error(404, 'No such scenario, or it is not yours.');
	return scenario;
}

/**
 * The document to evaluate: the draft from the body when one is given (needs
 * the analyst role: a draft is work in progress, not a read), else the saved one.
 */
export async function documentToEvaluate(
	access: ScenarioAccess,
	draft: unknown
): Promise<{ document: Scenario; source: 'draft' | 'saved'; scenario: ScenarioRecord }> {
	const scenario = await loadScenario(access.scenarioId);
	if (draft !== undefined) {
		if (!roleAtLeast(access.membership.role, 'analyst')) {
			error(403, `Evaluating an unsaved draft needs the analyst role in ${access.membership.workspaceName}; you are a ${access.membership.role}. You can evaluate the saved scenario.`);
		}
		return { document: validateDocument(draft, access.project), source: 'draft', scenario };
	}
	return { document: validateDocument(scenario.document, access.project), source: 'saved', scenario };
}
