import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { listProjectsInWorkspace } from '../../src/lib/server/db/projects';
import { getWorkspaceBySlug } from '../../src/lib/server/db/workspaces';
import { demoProjects, demoWorkspace } from '../../seeds/01_demo_workspace';
import { runSeeds } from '../../seeds/index';

describe('migrations', () => {
	let database: TestDatabase;
	beforeAll(async () => {
		database = await createTestDatabase({ migrate: false });
	});
	afterAll(() => database.drop());

	it('migrates up, rolls every migration back down, and up again', async () => {
		const { knex } = database;
		await knex.migrate.latest();
		expect(await knex.schema.hasTable('projects')).toBe(true);

		await knex.migrate.rollback(undefined, true);
		expect(await knex.schema.hasTable('projects')).toBe(false);
		expect(await knex.schema.hasTable('workspaces')).toBe(false);

		await knex.migrate.latest();
		const [, pending] = await knex.migrate.list();
		expect(pending).toHaveLength(0);
	});

	it('refuses a project with a technology Tidewright does not model', async () => {
		const { knex } = database;
		const [ws] = await knex('workspaces').insert({ name: 'Check', slug: 'check-tech' }).returning('id');
		await expect(
			knex('projects').insert({ workspace_id: ws.id, name: 'Dam', technology: 'hydro' })
		).rejects.toThrow(/projects_technology_check/);
	});
});

describe('demo seed', () => {
	let database: TestDatabase;
	beforeAll(async () => {
		database = await createTestDatabase({ seed: true });
	});
	afterAll(() => database.drop());

	it('reads the seeded demo projects through the query module', async () => {
		const workspace = await getWorkspaceBySlug(demoWorkspace.slug, database.knex);
		expect(workspace?.name).toBe(demoWorkspace.name);
		const projects = await listProjectsInWorkspace(workspace!.id, database.knex);
		expect(projects.map((p) => p.name).sort()).toEqual(demoProjects.map((p) => p.name).sort());
		expect(new Set(projects.map((p) => p.technology))).toEqual(new Set(['tidal-stream', 'wave']));
	});

	it('runs only into an empty database: a second seed run adds nothing', async () => {
		const before = await database.knex('projects').count<{ count: string }[]>({ count: '*' });
		await runSeeds(database.knex);
		const after = await database.knex('projects').count<{ count: string }[]>({ count: '*' });
		expect(after[0].count).toBe(before[0].count);
	});
});
