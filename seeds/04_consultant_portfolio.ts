/**
 * The consultancy's portfolio: Corvane Advisory runs five client projects at
 * invented sites for invented clients, across tidal stream, ocean current and
 * wave, one archived, one in US dollars. Each has a base case made from the
 * example of its technology (examples/*.json) with its own array size and
 * cost level, so capacity, capex and LCOE spread out, and each base case's
 * result is computed now and stored for the current engine, so the project
 * page and the portfolio show figures at once. Runs only while Corvane
 * Advisory has no projects, and only when the examples are there.
 */
import type { Knex } from 'knex';
import { parseScenario, type Scenario } from '../src/lib/schemas/scenario';
import { demoUsers, otherWorkspace } from './02_demo_users';
import { insertScenario, readExamples } from './03_demo_scenarios';

export interface ConsultantProject {
	name: string;
	technology: Scenario['technology'];
	siteName: string;
	siteDescription: string;
	currency: string;
	/** Devices in the array of the base case. */
	deviceCount: number;
	/** Every capex line of the example times this. */
	capexFactor: number;
	archived: boolean;
}

export const consultantProjects: readonly ConsultantProject[] = [
	{
		name: 'Quenmoor Sound Tidal Array',
		technology: 'tidal-stream',
		siteName: 'Quenmoor Sound',
		siteDescription: 'For Tollmere Power Cooperative: a sound between two low islands, 30–38 m deep, with strong, regular spring tides.',
		currency: 'EUR',
		deviceCount: 16,
		capexFactor: 0.95,
		archived: false
	},
	{
		name: 'Tallowick Race Tidal Pilot',
		technology: 'tidal-stream',
		siteName: 'Tallowick Race',
		siteDescription: 'For Fennick & Daw Energy: a three-turbine pilot in a headland race, far from the nearest grid point.',
		currency: 'EUR',
		deviceCount: 3,
		capexFactor: 1.2,
		archived: false
	},
	{
		name: 'Merrowgate Deep Current Demonstrator',
		technology: 'ocean-current',
		siteName: 'Merrowgate Deep',
		siteDescription: 'For Saltvane Holdings: moored turbines in a steady boundary current over a 400 m deep slope.',
		currency: 'USD',
		deviceCount: 6,
		capexFactor: 1,
		archived: false
	},
	{
		name: 'Ulvenholt Shelf Wave Farm',
		technology: 'wave',
		siteName: 'Ulvenholt Shelf',
		siteDescription: 'For Oarlock Ocean Partners: a 40-converter farm on an exposed shelf 11 km offshore, 55 m deep.',
		currency: 'EUR',
		deviceCount: 40,
		capexFactor: 0.9,
		archived: false
	},
	{
		name: 'Corrandel Point Wave Pilot',
		technology: 'wave',
		siteName: 'Corrandel Point',
		siteDescription: 'For Pellagrin Wave Company: an eight-converter pilot, set aside when the grid offer lapsed.',
		currency: 'EUR',
		deviceCount: 8,
		capexFactor: 1.1,
		archived: true
	}
];

/** The base case of a client project: the example of its technology, resized and recosted, in the project's currency. */
export function baseCaseOf(project: ConsultantProject, example: Scenario): Scenario {
	const document: Scenario = {
		...example,
		name: 'Base case',
		description: `${project.siteName}: ${project.deviceCount} devices, capex at ${Math.round(project.capexFactor * 100)} % of the ${example.name} example.`,
		currency: project.currency,
		array: { ...example.array, deviceCount: project.deviceCount },
		capex: { ...example.capex, lines: example.capex.lines.map((line) => ({ ...line, amount: Math.round(line.amount * project.capexFactor * 100) / 100 })) }
	};
	const parsed = parseScenario(document);
	if (!parsed.ok) throw new Error(`The base case of ${project.name} is not a valid scenario: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
	return parsed.scenario;
}

export async function seed(knex: Knex): Promise<void> {
	const corvane = await knex('workspaces').select('id').where({ slug: otherWorkspace.slug }).first();
	if (!corvane) return;
	const [{ count }] = await knex('projects').where({ workspace_id: corvane.id }).count<{ count: string }[]>({ count: '*' });
	if (Number(count) > 0) return;
	const examples = readExamples();
	if (examples.length === 0) return;
	const personWith = (email: string) => knex('users').select('id').where({ email }).first();
	const author = (await personWith(demoUsers.consultant.email)) ?? (await personWith(demoUsers.outsider.email));
	const userId: string | null = author?.id ?? null;

	await knex.transaction(async (trx) => {
		for (const project of consultantProjects) {
			// Not a lender's case on an assessed energy: its fixed P50 would not follow the resized array.
			const example = examples.find((e) => e.technology === project.technology && e.resource.kind !== 'assessed-energy');
			if (!example) continue;
			const [row] = await trx('projects')
				.insert({
					workspace_id: corvane.id,
					name: project.name,
					technology: project.technology,
					site_name: project.siteName,
					site_description: project.siteDescription,
					currency: project.currency,
					archived_at: project.archived ? trx.fn.now() : null
				})
				.returning(['id']);
			const document = baseCaseOf(project, example);
			await insertScenario(trx, {
				projectId: row.id,
				name: document.name,
				notes: `From the example scenario "${example.name}", resized for ${project.siteName}.`,
				document,
				isBaseCase: true,
				userId
			});
		}
	});
}
