/**
 * Stored results: a saved revision is evaluated once per engine version and
 * reused afterwards; a new revision or a new engine version computes afresh;
 * re-evaluation fills the store for the current engine and clears the old.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { createProject } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, saveScenario } from '../../src/lib/server/db/scenarios';
import { readProjectPage } from '../../src/lib/server/db/project-page';
import { getStoredResult } from '../../src/lib/server/db/scenario-results';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import type { Scenario } from '../../src/lib/schemas/scenario';
import { resultOfSavedScenario } from '../../src/lib/server/workbench/stored-results';
import { reevaluateStoredResults } from '../../src/lib/server/workbench/reevaluate';
import { tidalDocument } from '../fixtures/scenario-documents';

let database: TestDatabase;
let projectId: string;
const project = { technology: 'tidal-stream' };

/** The real engine, counting its calls. */
function countingEngine() {
	const engine = (document: Scenario) => {
		engine.calls += 1;
		return evaluateScenario(document);
	};
	engine.calls = 0;
	return engine;
}

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	const [{ id: workspaceId }] = await database.knex('workspaces').insert({ name: 'Store Test', slug: 'store-test' }).returning('id');
	projectId = (await createProject({ workspaceId, name: 'Stored array', technology: 'tidal-stream' }, database.knex)).id;
});
afterAll(() => database.drop());

async function newScenario(name: string) {
	return createScenario({ projectId, name, document: tidalDocument, userId: null }, database.knex);
}

describe('resultOfSavedScenario', () => {
	it('evaluates a saved revision once and reuses the stored result on every later read', async () => {
		const scenario = await newScenario('Once only');
		const engine = countingEngine();
		const first = await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex });
		const second = await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex });
		const third = await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex });
		expect(engine.calls).toBe(1);
		expect([first.reused, second.reused, third.reused]).toEqual([false, true, true]);
		expect(second.result).toEqual(first.result);
		expect(second.engineVersion).toBe(ENGINE_VERSION);
		const row = await getStoredResult(scenario.id, scenario.revision, ENGINE_VERSION, database.knex);
		expect(row?.result.metrics.lcoeReal).toBe(first.result.metrics.lcoeReal);
	});

	it('computes afresh for a new revision, and keys the old one apart', async () => {
		const scenario = await newScenario('Two revisions');
		const engine = countingEngine();
		const before = await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex });
		const document = { ...scenario.document, array: { ...scenario.document.array, availability: 0.8 } };
		const saved = (await saveScenario({ scenarioId: scenario.id, expectedRevision: scenario.revision, document, userId: null }, database.knex))!;
		const after = await resultOfSavedScenario(saved, project, { evaluate: engine, knex: database.knex });
		expect(engine.calls).toBe(2);
		expect(saved.revision).toBe(scenario.revision + 1);
		expect(Number(after.result.metrics.netAepMWh)).toBeLessThan(Number(before.result.metrics.netAepMWh));
		// The first revision's stored result is still the first revision's.
		expect((await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex })).result).toEqual(before.result);
		expect(engine.calls).toBe(2);
	});

	it('recomputes when the engine version changes', async () => {
		const scenario = await newScenario('Engine change');
		const engine = countingEngine();
		await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex });
		const next = await resultOfSavedScenario(scenario, project, { evaluate: engine, knex: database.knex, engineVersion: `${ENGINE_VERSION}-next` });
		expect(engine.calls).toBe(2);
		expect(next.reused).toBe(false);
		expect(next.engineVersion).toBe(`${ENGINE_VERSION}-next`);
	});
});

describe('the project page read', () => {
	it('gives each live scenario its current revision’s stored metrics in one query, null where none is stored for this engine', async () => {
		const [{ id: workspaceId }] = await database.knex('workspaces').insert({ name: 'List Test', slug: 'list-test' }).returning('id');
		const listProject = (await createProject({ workspaceId, name: 'Listed array', technology: 'tidal-stream' }, database.knex)).id;
		const make = (name: string) => createScenario({ projectId: listProject, name, document: tidalDocument, userId: null }, database.knex);
		const [stored, bare, gone] = [await make('A stored'), await make('B bare'), await make('C archived')];
		const { result } = await resultOfSavedScenario(stored, project, { evaluate: evaluateScenario, knex: database.knex });
		// A newer revision without a result of its own: the older revision's result must not be shown for it.
		await resultOfSavedScenario(bare, project, { evaluate: evaluateScenario, knex: database.knex });
		await saveScenario({ scenarioId: bare.id, expectedRevision: bare.revision, document: { ...bare.document, array: { ...bare.document.array, availability: 0.8 } }, userId: null }, database.knex);
		await archiveScenario(gone.id, null, database.knex);
		let queries = 0;
		const count = () => (queries += 1);
		database.knex.on('query', count);
		const listed = (await readProjectPage(listProject, ENGINE_VERSION, database.knex))!.scenarios;
		database.knex.off('query', count);
		expect(queries).toBe(1);
		expect(listed.map((s) => s.name)).toEqual(['A stored', 'B bare']);
		expect(listed[0].stored).toEqual({ metrics: result.metrics, currency: result.currency });
		expect(listed[1].stored).toBeNull();
	});
});

describe('reevaluateStoredResults', () => {
	it('stores a result of the new engine for every current revision and removes the old engine’s', async () => {
		await newScenario('Reevaluated');
		const nextVersion = `${ENGINE_VERSION}-reevaluated`;
		const engine = countingEngine();
		const scenarios = Number((await database.knex('scenarios').count<{ count: string }[]>({ count: '*' }))[0].count);
		const tally = await reevaluateStoredResults(database.knex, { engineVersion: nextVersion, evaluate: engine });
		expect(tally.computed).toBe(scenarios);
		expect(engine.calls).toBe(scenarios);
		expect(tally.removed).toBeGreaterThan(0);
		const versions = await database.knex('scenario_results').distinct('engine_version');
		expect(versions.map((v) => v.engine_version)).toEqual([nextVersion]);

		const again = await reevaluateStoredResults(database.knex, { engineVersion: nextVersion, evaluate: engine });
		expect(again).toEqual({ computed: 0, alreadyStored: scenarios, refused: 0, removed: 0 });
		expect(engine.calls).toBe(scenarios);
	});
});
