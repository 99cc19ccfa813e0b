/**
 * Demo scenarios: for each demo project a base case from the example scenario
 * of its technology (examples/*.json, read at seed time) and a downside case
 * (capex +15 %, availability 5 points lower). Runs only into an empty
 * scenarios table, and only when the examples are there. The documents are
 * written as parseScenario returns them: in the current schemaVersion.
 */
import type { Knex } from 'knex';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseScenario, type Scenario } from '../src/lib/schemas/scenario';
import { demoProjects, demoWorkspace } from './01_demo_workspace';
import { demoUsers } from './02_demo_users';
import { ENGINE_VERSION } from '../src/lib/server/engine/version';
import { evaluateScenario } from '../src/lib/server/engine/evaluate';

const examplesDirectory = join(dirname(fileURLToPath(import.meta.url)), '..', 'examples');

export const DOWNSIDE_CAPEX_FACTOR = 1.15;
export const DOWNSIDE_AVAILABILITY_DROP = 0.05;

/** The example scenarios, validated (and upgraded, were one in an older format); an invalid one stops the seed, naming its problems. */
export function readExamples(): Scenario[] {
	if (!existsSync(examplesDirectory)) return [];
	return readdirSync(examplesDirectory)
		.filter((file) => file.endsWith('.json'))
		.sort()
		.map((file) => {
			const parsed = parseScenario(JSON.parse(readFileSync(join(examplesDirectory, file), 'utf8')));
			if (!parsed.ok) {
				throw new Error(`examples/${file} is not a valid scenario: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
			}
			return parsed.scenario;
		});
}

/** The example for a project: the one naming the project's site, else the first of its technology. */
function exampleFor(project: { technology: string; site_name: string }, examples: Scenario[]): Scenario | undefined {
	const sameTechnology = examples.filter((e) => e.technology === project.technology);
	return sameTechnology.find((e) => e.name.includes(project.site_name)) ?? sameTechnology[0];
}

export function downsideOf(base: Scenario, name: string): Scenario {
	return {
		...base,
		name,
		description: `Downside of the base case: capex +${Math.round((DOWNSIDE_CAPEX_FACTOR - 1) * 100)} %, availability ${DOWNSIDE_AVAILABILITY_DROP * 100} points lower.`,
		capex: { ...base.capex, lines: base.capex.lines.map((line) => ({ ...line, amount: Math.round(line.amount * DOWNSIDE_CAPEX_FACTOR * 100) / 100 })) },
		array: { ...base.array, availability: Math.max(0, Math.round((base.array.availability - DOWNSIDE_AVAILABILITY_DROP) * 1e6) / 1e6) }
	};
}

/** A scenario at revision 1 with its revision row; answers its id. */
export async function insertScenario(
	trx: Knex.Transaction,
	row: { projectId: string; name: string; notes: string; document: Scenario; isBaseCase: boolean; userId: string | null }
): Promise<string> {
	const document = { ...row.document, name: row.name };
	const [scenario] = await trx('scenarios')
		.insert({
			project_id: row.projectId,
			name: row.name,
			notes: row.notes,
			document: JSON.stringify(document),
			schema_version: document.schemaVersion,
			revision: 1,
			is_base_case: row.isBaseCase,
			created_by: row.userId,
			updated_by: row.userId
		})
		.returning('id');
	await trx('scenario_revisions').insert({
		scenario_id: scenario.id,
		revision: 1,
		name: row.name,
		document: JSON.stringify(document),
		changed_sections: Object.keys(document).sort(),
		summary: 'Created with the demo data',
		changed_by: row.userId
	});
	// As a save through the app would: the revision's result stored for the current engine.
	await trx('scenario_results').insert({ scenario_id: scenario.id, revision: 1, engine_version: ENGINE_VERSION, result: JSON.stringify(evaluateScenario(document)) });
	return scenario.id;
}

export async function seed(knex: Knex): Promise<void> {
	const existing = await knex('scenarios').count<{ count: string }[]>({ count: '*' });
	if (Number(existing[0].count) > 0) return;
	const examples = readExamples();
	if (examples.length === 0) return;

	const workspace = await knex('workspaces').select('id').where({ slug: demoWorkspace.slug }).first();
	if (!workspace) return;
	const projects = await knex('projects')
		.select('id', 'name', 'technology', 'site_name', 'currency')
		.where({ workspace_id: workspace.id })
		.whereIn('name', demoProjects.map((p) => p.name));
	const analyst = await knex('users').select('id').where({ email: demoUsers.analyst.email }).first();
	const userId: string | null = analyst?.id ?? null;

	await knex.transaction(async (trx) => {
		for (const project of projects) {
			const example = exampleFor(project, examples);
			if (!example) continue;
			const base = { ...example, currency: project.currency };
			await insertScenario(trx, {
				projectId: project.id,
				name: 'Base case',
				notes: `From the example scenario "${example.name}".`,
				document: base,
				isBaseCase: true,
				userId
			});
			await insertScenario(trx, {
				projectId: project.id,
				name: 'Downside',
				notes: 'For the lenders: higher capex and lower availability than the base case.',
				document: downsideOf(base, 'Downside'),
				isBaseCase: false,
				userId
			});
		}
	});
}
