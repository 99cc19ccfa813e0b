/**
 * Stored engine results: one row per (scenario, revision, engine version),
 * written when a revision is saved and read on every later view.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import type { EngineResult } from '../engine/evaluate';

export interface StoredResult {
	scenarioId: string;
	revision: number;
	engineVersion: string;
	result: EngineResult;
	computedAt: Date;
}

export async function getStoredResult(scenarioId: string, revision: number, engineVersion: string, knex: Knex = db()): Promise<StoredResult | undefined> {
	const row = await knex('scenario_results')
		.select('scenario_id', 'revision', 'engine_version', 'result', 'computed_at')
		.where({ scenario_id: scenarioId, revision, engine_version: engineVersion })
		.first();
	return row && { scenarioId: row.scenario_id, revision: row.revision, engineVersion: row.engine_version, result: row.result, computedAt: row.computed_at };
}

/** Keeps the first result written for a key: two requests racing to store the same revision agree anyway. */
export async function putStoredResult(entry: Omit<StoredResult, 'computedAt'>, knex: Knex = db()): Promise<void> {
	await knex('scenario_results')
		.insert({ scenario_id: entry.scenarioId, revision: entry.revision, engine_version: entry.engineVersion, result: JSON.stringify(entry.result) })
		.onConflict(['scenario_id', 'revision', 'engine_version'])
		.ignore();
}

/** Results computed by other engine versions (after an engine change). */
export async function deleteResultsOfOtherEngines(engineVersion: string, knex: Knex = db()): Promise<number> {
	return knex('scenario_results').whereNot({ engine_version: engineVersion }).delete();
}

/** Every scenario's current revision, archived ones included, for re-evaluation. */
export async function listCurrentRevisions(knex: Knex = db()): Promise<{ scenarioId: string; revision: number; technology: string }[]> {
	const rows = await knex('scenarios')
		.join('projects', 'projects.id', 'scenarios.project_id')
		.select('scenarios.id', 'scenarios.revision', 'projects.technology')
		.orderBy('scenarios.created_at');
	return rows.map((row) => ({ scenarioId: row.id, revision: row.revision, technology: row.technology }));
}

/** The stored metrics and currency of several saved revisions at once (missing ones are left out). */
export async function getStoredMetricsOf(
	revisions: readonly { scenarioId: string; revision: number }[],
	engineVersion: string,
	knex: Knex = db()
): Promise<Map<string, { metrics: EngineResult['metrics']; currency: string }>> {
	if (revisions.length === 0) return new Map();
	const rows: { scenario_id: string; metrics: EngineResult['metrics']; currency: string }[] = await knex('scenario_results')
		.select('scenario_id', 'metrics', 'currency')
		.where({ engine_version: engineVersion })
		.whereIn(['scenario_id', 'revision'], revisions.map((r) => [r.scenarioId, r.revision]));
	return new Map(rows.map((row) => [row.scenario_id, { metrics: row.metrics, currency: row.currency }]));
}
