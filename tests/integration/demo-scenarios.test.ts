import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Decimal from 'decimal.js';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { runSeeds } from '../../seeds/index';
import { DOWNSIDE_CAPEX_FACTOR } from '../../seeds/03_demo_scenarios';
import { demoProjects } from '../../seeds/01_demo_workspace';
import { parseScenario, SCHEMA_VERSION } from '../../src/lib/schemas/scenario';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { listScenariosInProject, getScenarioById, listScenarioRevisions } from '../../src/lib/server/db/scenarios';

describe('demo scenarios seed', () => {
	let database: TestDatabase;
	beforeAll(async () => {
		database = await createTestDatabase({ seed: true });
	});
	afterAll(() => database.drop());

	it('gives every demo project a base case and a downside that validate against the scenario schema', async () => {
		const projects = await database.knex('projects').select('id', 'name', 'technology').whereIn('name', demoProjects.map((p) => p.name));
		expect(projects).toHaveLength(demoProjects.length);
		for (const project of projects) {
			const scenarios = await listScenariosInProject(project.id, {}, database.knex);
			expect(scenarios.map((s) => [s.name, s.isBaseCase])).toEqual([
				['Base case', true],
				['Downside', false]
			]);
			for (const summary of scenarios) {
				const scenario = (await getScenarioById(summary.id, database.knex))!;
				const parsed = parseScenario(scenario.document);
				expect(parsed.ok, `${project.name} / ${summary.name}`).toBe(true);
				expect(parsed.ok && parsed.upgradedFrom, 'seeded in the current schema version').toBeNull();
				expect(summary.schemaVersion).toBe(SCHEMA_VERSION);
				expect(scenario.document.technology).toBe(project.technology);
				expect(scenario.createdBy?.name).toBe('Tomas Vell');
				expect(await listScenarioRevisions(summary.id, database.knex)).toHaveLength(1);
			}
		}
	});

	it('builds the downside with capex 15 % higher and a higher LCOE than the base case', async () => {
		const project = await database.knex('projects').select('id').where({ name: demoProjects[0].name }).first();
		const [base, downside] = await Promise.all(
			(await listScenariosInProject(project.id, {}, database.knex)).map((s) => getScenarioById(s.id, database.knex))
		);
		base!.document.capex.lines.forEach((line, i) => {
			expect(downside!.document.capex.lines[i].amount).toBeCloseTo(line.amount * DOWNSIDE_CAPEX_FACTOR, 2);
		});
		const baseLcoe = new Decimal(evaluateScenario(base!.document).metrics.lcoeReal!);
		const downsideLcoe = new Decimal(evaluateScenario(downside!.document).metrics.lcoeReal!);
		expect(downsideLcoe.greaterThan(baseLcoe)).toBe(true);
	});

	it('stores each demo scenario’s result for the current engine, as a save through the app would', async () => {
		const rows = await database.knex('scenarios').leftJoin('scenario_results', function () {
			this.on('scenario_results.scenario_id', 'scenarios.id').andOn('scenario_results.revision', 'scenarios.revision').andOnVal('scenario_results.engine_version', ENGINE_VERSION);
		}).select('scenarios.id', 'scenarios.document', 'scenario_results.metrics');
		expect(rows.length).toBeGreaterThan(0);
		for (const row of rows) {
			expect(row.metrics, `stored result of ${row.document.name}`).not.toBeNull();
			expect(row.metrics.lcoeReal).toBe(evaluateScenario(row.document).metrics.lcoeReal);
		}
	});

	it('runs only into an empty scenarios table', async () => {
		const count = async () => Number((await database.knex('scenarios').count<{ count: string }[]>({ count: '*' }))[0].count);
		const before = await count();
		await runSeeds(database.knex);
		expect(await count()).toBe(before);
	});
});
