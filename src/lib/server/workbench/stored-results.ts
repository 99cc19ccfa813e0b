/**
 * Results of saved revisions: computed once per (scenario, revision, engine
 * version), stored, and reused by every later read (the evaluate route,
 * compare, exports, the project page). Unsaved drafts are evaluated live and
 * never stored.
 */
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { getStoredMetricsOf, getStoredResult, putStoredResult } from '../db/scenario-results';
import type { MetricKey } from '../../metrics/catalogue';
import type { ScenarioRecord } from '../db/scenarios';
import type { EngineResult } from '../engine/evaluate';
import { evaluateOnPool } from '../compute/pool';
import { ENGINE_VERSION } from '../engine/version';
import type { Scenario } from '../../schemas/scenario';
import { ApiProblem, validateDocument } from './api-route';
import { runEngine } from './evaluation';

export interface SavedResult {
	result: EngineResult;
	engineVersion: string;
	computedAt: Date;
	/** True when the stored result was read, false when it was computed now. */
	reused: boolean;
}

export interface StoredResultOptions {
	/** The engine to run when nothing is stored: the compute pool unless given (tests count its calls; scripts call the engine directly). */
	evaluate?: (document: Scenario) => EngineResult | Promise<EngineResult>;
	engineVersion?: string;
	knex?: Knex;
}

type SavedScenario = Pick<ScenarioRecord, 'id' | 'revision' | 'document'>;

/** The saved revision's result: read from the store, or computed and stored. Invalid documents throw ApiProblem (422). */
export async function resultOfSavedScenario(
	scenario: SavedScenario,
	project: { technology: string },
	options: StoredResultOptions = {}
): Promise<SavedResult> {
	const knex = options.knex ?? db();
	const engineVersion = options.engineVersion ?? ENGINE_VERSION;
	const stored = await getStoredResult(scenario.id, scenario.revision, engineVersion, knex);
	if (stored) return { result: stored.result, engineVersion, computedAt: stored.computedAt, reused: true };
	const document = validateDocument(scenario.document, project);
	const evaluate = options.evaluate ?? evaluateOnPool;
	const result = await runEngine(() => evaluate(document));
	await putStoredResult({ scenarioId: scenario.id, revision: scenario.revision, engineVersion, result }, knex);
	return { result, engineVersion, computedAt: new Date(), reused: false };
}

/**
 * Stores the result of a revision just saved, so the next read finds it. A
 * document the engine cannot evaluate is left unstored: the save stands, and
 * the evaluate route explains the problem to whoever reads it.
 */
export async function storeResultOfSave(scenario: SavedScenario, project: { technology: string }): Promise<void> {
	try {
		await resultOfSavedScenario(scenario, project);
	} catch (e) {
		if (e instanceof ApiProblem) return;
		throw e;
	}
}

/** The figures a scenario list shows beside each name. */
export const KEY_FIGURES = ['lcoeReal', 'equityIrr', 'minDscr', 'netAepMWh'] as const satisfies readonly MetricKey[];
export type KeyFigures = { currency: string; values: Record<(typeof KEY_FIGURES)[number], string | null> };

/**
 * Key figures of saved revisions from the store alone (a read never computes):
 * null for a revision with no stored result of this engine, such as one not
 * re-evaluated yet after an engine change.
 */
export async function storedKeyFigures(scenarios: readonly Pick<ScenarioRecord, 'id' | 'revision'>[]): Promise<Record<string, KeyFigures | null>> {
	const stored = await getStoredMetricsOf(
		scenarios.map((s) => ({ scenarioId: s.id, revision: s.revision })),
		ENGINE_VERSION
	);
	return Object.fromEntries(scenarios.map((s) => [s.id, keyFiguresOf(stored.get(s.id) ?? null)]));
}

/** The key figures of one stored result's metrics (null: none stored for this engine). */
export function keyFiguresOf(stored: { metrics: Record<string, string | null>; currency: string } | null): KeyFigures | null {
	if (!stored) return null;
	return { currency: stored.currency, values: Object.fromEntries(KEY_FIGURES.map((k) => [k, stored.metrics[k] ?? null])) as KeyFigures['values'] };
}
