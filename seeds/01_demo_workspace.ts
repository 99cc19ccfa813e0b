/**
 * Demo data in an invented setting: Halvard Marine Energy, a small developer,
 * with a tidal-stream array in the Kestle Narrows and a wave farm off Orrin Bank.
 * Every name here is made up. Seeds run only into an empty database.
 */
import type { Knex } from 'knex';

export const demoWorkspace = { name: 'Halvard Marine Energy', slug: 'halvard-marine' };

export const demoProjects = [
	{
		name: 'Kestle Narrows Tidal Array',
		technology: 'tidal-stream',
		site_name: 'Kestle Narrows',
		site_description: 'A 1.2 km wide channel between two islands, 35–42 m deep, peak spring currents near 3 m/s.',
		currency: 'EUR'
	},
	{
		name: 'Orrin Bank Wave Farm',
		technology: 'wave',
		site_name: 'Orrin Bank',
		site_description: 'An exposed shelf 9 km offshore, 60 m deep, facing the prevailing swell.',
		currency: 'EUR'
	}
] as const;

export async function seed(knex: Knex): Promise<void> {
	const existing = await knex('workspaces').count<{ count: string }[]>({ count: '*' });
	if (Number(existing[0].count) > 0) return;

	await knex.transaction(async (trx) => {
		const [workspace] = await trx('workspaces').insert(demoWorkspace).returning(['id']);
		await trx('projects').insert(demoProjects.map((p) => ({ ...p, workspace_id: workspace.id })));
	});
}
