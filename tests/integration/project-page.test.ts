/**
 * The project page's one-statement read gives exactly what the API's paged
 * list reads give (the same rows, order, dates and people), with the stored
 * key figures of each current revision, in one query.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { createProject, getProjectById } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, listScenariosPage, markBaseCase } from '../../src/lib/server/db/scenarios';
import { listUploadsPage } from '../../src/lib/server/db/uploads';
import { getStoredResult } from '../../src/lib/server/db/scenario-results';
import { readProjectPage } from '../../src/lib/server/db/project-page';
import { receiveUpload } from '../../src/lib/server/workbench/receive-upload';
import { resultOfSavedScenario } from '../../src/lib/server/workbench/stored-results';
import { evaluateScenario } from '../../src/lib/server/engine/evaluate';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { tidalDocument } from '../fixtures/scenario-documents';

let database: TestDatabase;
let projectId: string;
let otherProjectId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	const knex = database.knex;
	const [{ id: workspaceId }] = await knex('workspaces').insert({ name: 'Page Test', slug: 'page-test' }).returning('id');
	const [{ id: userId }] = await knex('users').insert({ email: 'page@test.example', name: 'Pia Reader', password_hash: 'x' }).returning('id');
	projectId = (await createProject({ workspaceId, name: 'Read in one', technology: 'tidal-stream' }, knex)).id;
	otherProjectId = (await createProject({ workspaceId, name: 'Next door', technology: 'tidal-stream' }, knex)).id;
	const make = (name: string, project = projectId) => createScenario({ projectId: project, name, document: tidalDocument, userId }, knex);
	// Made out of list order, so the list's own order (base case, then by name) has to come from the query.
	const zephyr = await make('Zephyr case');
	await make('alpha case');
	const base = await make('Middle case');
	await make('Beta case');
	await markBaseCase(base.id, userId, knex);
	await archiveScenario((await make('Archived case')).id, null, knex);
	await make('Other project case', otherProjectId);
	await resultOfSavedScenario(zephyr, { technology: 'tidal-stream' }, { evaluate: evaluateScenario, knex });
	const csv = new Uint8Array(readFileSync('static/templates/power-curve.csv'));
	for (const fileName of ['first.csv', 'second.csv', 'third.csv']) {
		await receiveUpload({ projectId, kind: 'power-curve', fileName, contentType: 'text/csv', bytes: csv, userId }, knex);
	}
	await receiveUpload({ projectId: otherProjectId, kind: 'power-curve', fileName: 'elsewhere.csv', contentType: 'text/csv', bytes: csv, userId: null }, knex);
});
afterAll(() => database.drop());

describe('readProjectPage', () => {
	it('gives the project, its live scenarios with stored metrics and its uploads as the separate reads do, in one query', async () => {
		let queries = 0;
		const count = () => (queries += 1);
		database.knex.on('query', count);
		const page = await readProjectPage(projectId, ENGINE_VERSION, database.knex);
		database.knex.off('query', count);
		expect(queries).toBe(1);

		expect(page?.project).toEqual(await getProjectById(projectId, database.knex));
		const everything = { limit: 100, after: null };
		expect(page?.scenarios.map(({ stored: _, ...summary }) => summary)).toEqual((await listScenariosPage(projectId, everything, database.knex)).items);
		expect(page?.uploads).toEqual((await listUploadsPage(projectId, everything, database.knex)).items);
		// What the comparison above stands on: the base case first, then by name; one stored result; newest upload first.
		expect(page?.scenarios.map((s) => s.name)).toHaveLength(4);
		expect(page?.scenarios[0].name).toBe('Middle case');
		expect(page?.scenarios[0].isBaseCase).toBe(true);
		expect(page?.scenarios.filter((s) => s.stored !== null).map((s) => s.name)).toEqual(['Zephyr case']);
		const zephyr = page!.scenarios.find((s) => s.name === 'Zephyr case')!;
		const stored = await getStoredResult(zephyr.id, zephyr.revision, ENGINE_VERSION, database.knex);
		expect(zephyr.stored).toEqual({ metrics: stored!.result.metrics, currency: stored!.result.currency });
		expect(page?.scenarios[0].createdAt).toBeInstanceOf(Date);
		expect(page?.scenarios[0].createdBy?.name).toBe('Pia Reader');
		expect(page?.uploads.map((u) => u.fileName)).toEqual(['third.csv', 'second.csv', 'first.csv']);
	});

	it('reads an empty project as empty lists, and no project as nothing', async () => {
		const [{ id: workspaceId }] = await database.knex('workspaces').insert({ name: 'Empty Test', slug: 'empty-test' }).returning('id');
		const empty = (await createProject({ workspaceId, name: 'Nothing yet', technology: 'wave' }, database.knex)).id;
		expect(await readProjectPage(empty, ENGINE_VERSION, database.knex)).toMatchObject({ scenarios: [], uploads: [] });
		expect(await readProjectPage('00000000-0000-4000-8000-000000000000', ENGINE_VERSION, database.knex)).toBeUndefined();
	});
});
