import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import {
	ArchivedScenarioError,
	StaleRevisionError,
	archiveScenario,
	createScenario,
	deleteArchivedScenario,
	duplicateScenario,
	getBaseCaseOfProject,
	getScenarioById,
	getScenarioRevisionDocument,
	listScenarioRevisions,
	listScenariosInProject,
	markBaseCase,
	restoreScenario,
	saveScenario
} from '../../src/lib/server/db/scenarios';
import { archiveProject, createProject, getProjectById, listProjectsInWorkspace, restoreProject, updateProject } from '../../src/lib/server/db/projects';
import { parseScenario, SCHEMA_VERSION } from '../../src/lib/schemas/scenario';
import { tidalDocument } from '../fixtures/scenario-documents';

let database: TestDatabase;
let workspaceId: string;
let projectId: string;
let alice: string;
let bob: string;

beforeAll(async () => {
	database = await createTestDatabase();
	const { knex } = database;
	[{ id: workspaceId }] = await knex('workspaces').insert({ name: 'Test Marine', slug: 'test-marine' }).returning('id');
	[{ id: alice }] = await knex('users').insert({ email: 'alice@test.example', name: 'Alice Test', password_hash: 'x' }).returning('id');
	[{ id: bob }] = await knex('users').insert({ email: 'bob@test.example', name: 'Bob Test', password_hash: 'x' }).returning('id');
});
afterAll(() => database.drop());

beforeEach(async () => {
	const project = await createProject({ workspaceId, name: `Array ${Math.random()}`, technology: 'tidal-stream' }, database.knex);
	projectId = project.id;
});

function withCapex(amount: number) {
	return { ...tidalDocument, capex: { ...tidalDocument.capex, lines: [{ ...tidalDocument.capex.lines[0], amount }, ...tidalDocument.capex.lines.slice(1)] } };
}

async function countRows(table: string) {
	const [row] = await database.knex(table).count<{ count: string }[]>({ count: '*' });
	return Number(row.count);
}

describe('projects', () => {
	it('creates, updates, archives and restores a project', async () => {
		const { knex } = database;
		const created = await createProject(
			{ workspaceId, name: 'Skerry Sound', technology: 'wave', siteName: 'Skerry', currency: 'GBP' },
			knex
		);
		expect(created).toMatchObject({ name: 'Skerry Sound', technology: 'wave', site_name: 'Skerry', currency: 'GBP', archived_at: null });

		const updated = await updateProject(created.id, { name: 'Skerry Sound Wave Farm', siteDescription: 'Exposed shelf' }, knex);
		expect(updated).toMatchObject({ name: 'Skerry Sound Wave Farm', site_description: 'Exposed shelf', technology: 'wave' });

		const archived = await archiveProject(created.id, knex);
		expect(archived?.archived_at).toBeInstanceOf(Date);
		expect((await listProjectsInWorkspace(workspaceId, knex)).map((p) => p.id)).not.toContain(created.id);

		await restoreProject(created.id, knex);
		expect((await getProjectById(created.id, knex))?.archived_at).toBeNull();
		expect((await listProjectsInWorkspace(workspaceId, knex)).map((p) => p.id)).toContain(created.id);
	});
});

describe('createScenario', () => {
	it('stores the document at revision 1 with a first history entry, and makes the first scenario the base case', async () => {
		const first = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		expect(first).toMatchObject({ name: 'Base', revision: 1, schemaVersion: 3, isBaseCase: true, createdBy: { id: alice, name: 'Alice Test' } });
		expect(first.document.name).toBe('Base');
		expect(first.document.capex).toEqual(tidalDocument.capex);

		const second = await createScenario({ projectId, name: 'Downside', document: tidalDocument, userId: alice }, database.knex);
		expect(second.isBaseCase).toBe(false);

		const history = await listScenarioRevisions(first.id, database.knex);
		expect(history).toHaveLength(1);
		expect(history[0]).toMatchObject({ revision: 1, summary: 'Created', changedBy: { id: alice } });
		expect(history[0].changedSections).toContain('capex');
	});
});

describe('saveScenario', () => {
	it('saves a new revision and records who changed which sections', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		const saved = await saveScenario({ scenarioId: created.id, expectedRevision: 1, document: withCapex(4500), userId: bob }, database.knex);
		expect(saved).toMatchObject({ revision: 2, updatedBy: { id: bob, name: 'Bob Test' }, createdBy: { id: alice } });
		expect(saved!.document.capex.lines[0].amount).toBe(4500);

		const history = await listScenarioRevisions(created.id, database.knex);
		expect(history.map((h) => h.revision)).toEqual([2, 1]);
		expect(history[0]).toMatchObject({ changedSections: ['capex'], summary: 'Edited capex', changedBy: { id: bob } });
		expect((await getScenarioRevisionDocument(created.id, 1, database.knex))!.capex.lines[0].amount).toBe(4000);
		expect((await getScenarioRevisionDocument(created.id, 2, database.knex))!.capex.lines[0].amount).toBe(4500);
	});

	it('refuses a stale save with StaleRevisionError and overwrites nothing', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		await saveScenario({ scenarioId: created.id, expectedRevision: 1, document: withCapex(4500), userId: alice }, database.knex);
		const revisionsBefore = await countRows('scenario_revisions');

		const stale = saveScenario(
			{ scenarioId: created.id, expectedRevision: 1, document: withCapex(9999), notes: 'mine', userId: bob },
			database.knex
		);
		await expect(stale).rejects.toBeInstanceOf(StaleRevisionError);
		await expect(stale).rejects.toMatchObject({ expectedRevision: 1, currentRevision: 2, updatedByName: 'Alice Test' });
		await expect(stale).rejects.toThrow(/Nothing was saved/);

		const after = await getScenarioById(created.id, database.knex);
		expect(after).toMatchObject({ revision: 2, notes: '', updatedBy: { id: alice } });
		expect(after!.document.capex.lines[0].amount).toBe(4500);
		expect(await countRows('scenario_revisions')).toBe(revisionsBefore);
	});

	it('lets only one of two saves from the same revision through when they race', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		const results = await Promise.allSettled([
			saveScenario({ scenarioId: created.id, expectedRevision: 1, document: withCapex(4100), userId: alice }, database.knex),
			saveScenario({ scenarioId: created.id, expectedRevision: 1, document: withCapex(4200), userId: bob }, database.knex)
		]);
		expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
		const rejected = results.filter((r) => r.status === 'rejected');
		expect(rejected).toHaveLength(1);
		expect((rejected[0] as PromiseRejectedResult).reason).toBeInstanceOf(StaleRevisionError);
		expect((await listScenarioRevisions(created.id, database.knex)).map((h) => h.revision)).toEqual([2, 1]);
	});

	it('keeps the row name and the document name the same, and records a notes change', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		const renamed = await saveScenario({ scenarioId: created.id, expectedRevision: 1, name: 'P50 case', notes: 'after survey', userId: alice }, database.knex);
		expect(renamed).toMatchObject({ name: 'P50 case', notes: 'after survey', revision: 2 });
		expect(renamed!.document.name).toBe('P50 case');
		const [latest] = await listScenarioRevisions(created.id, database.knex);
		expect(latest.changedSections).toEqual(['name', 'notes']);
	});

	it('writes no revision for a save that changes nothing', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		const same = await saveScenario({ scenarioId: created.id, expectedRevision: 1, document: { ...tidalDocument, name: 'Base' }, userId: bob }, database.knex);
		expect(same).toMatchObject({ revision: 1, updatedBy: { id: alice } });
		expect(await listScenarioRevisions(created.id, database.knex)).toHaveLength(1);
	});

	it('answers undefined for a scenario that does not exist', async () => {
		expect(
			await saveScenario({ scenarioId: '00000000-0000-4000-8000-000000000000', expectedRevision: 1, notes: 'x', userId: alice }, database.knex)
		).toBeUndefined();
	});

	it('refuses to edit an archived scenario', async () => {
		const created = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		await archiveScenario(created.id, alice, database.knex);
		await expect(
			saveScenario({ scenarioId: created.id, expectedRevision: 1, notes: 'x', userId: alice }, database.knex)
		).rejects.toBeInstanceOf(ArchivedScenarioError);
	});
});

describe('a document stored in an older schema version', () => {
	it('stays as stored; parseScenario upgrades it in memory, and the next save writes the current version', async () => {
		const version1 = { ...tidalDocument, schemaVersion: 1, decommissioning: { basis: 'percent-of-capex', amount: 0.05 } };
		const created = await createScenario({ projectId, name: 'Base', document: version1 as unknown as typeof tidalDocument, userId: alice }, database.knex);
		const stored = (await getScenarioById(created.id, database.knex))!;
		expect(stored.schemaVersion).toBe(1);
		expect(stored.document.decommissioning).toEqual({ basis: 'percent-of-capex', amount: 0.05 });

		const parsed = parseScenario(stored.document);
		if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
		expect(parsed.upgradedFrom).toBe(1);
		expect(parsed.scenario.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		expect((await getScenarioById(created.id, database.knex))!.document).toEqual(stored.document);

		const saved = await saveScenario({ scenarioId: created.id, expectedRevision: 1, document: parsed.scenario, userId: alice }, database.knex);
		expect(saved?.schemaVersion).toBe(SCHEMA_VERSION);
		expect(saved?.document.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		expect(await getScenarioRevisionDocument(created.id, 1, database.knex)).toMatchObject({ schemaVersion: 1, decommissioning: { amount: 0.05 } });
	});
});

describe('duplicateScenario', () => {
	it('copies the document into a new scenario at revision 1, never the base case, and leaves the source as it was', async () => {
		const source = await createScenario({ projectId, name: 'Base', notes: 'survey 2026', document: tidalDocument, userId: alice }, database.knex);
		await saveScenario({ scenarioId: source.id, expectedRevision: 1, document: withCapex(4800), userId: alice }, database.knex);

		const copy = await duplicateScenario(source.id, { name: 'Downside', userId: bob }, database.knex);
		expect(copy).toMatchObject({ name: 'Downside', revision: 1, isBaseCase: false, notes: 'survey 2026', createdBy: { id: bob } });
		expect(copy!.id).not.toBe(source.id);
		expect(copy!.document).toEqual({ ...withCapex(4800), name: 'Downside' });

		const [entry] = await listScenarioRevisions(copy!.id, database.knex);
		expect(entry.summary).toBe('Duplicated from "Base" (revision 2)');
		expect((await getScenarioById(source.id, database.knex))).toMatchObject({ revision: 2, isBaseCase: true });
	});

	it('names the copy after its source when no name is given', async () => {
		const source = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		expect((await duplicateScenario(source.id, { userId: alice }, database.knex))!.name).toBe('Base (copy)');
	});
});

describe('markBaseCase', () => {
	it('moves the base-case mark so a project has exactly one', async () => {
		const a = await createScenario({ projectId, name: 'A', document: tidalDocument, userId: alice }, database.knex);
		const b = await createScenario({ projectId, name: 'B', document: tidalDocument, userId: alice }, database.knex);
		await markBaseCase(b.id, alice, database.knex);
		expect((await getScenarioById(a.id, database.knex))!.isBaseCase).toBe(false);
		expect((await getBaseCaseOfProject(projectId, database.knex))!.id).toBe(b.id);
		const bases = await database.knex('scenarios').where({ project_id: projectId, is_base_case: true }).count<{ count: string }[]>({ count: '*' });
		expect(Number(bases[0].count)).toBe(1);
	});

	it('is enforced by the database: a second base case in a project is refused', async () => {
		const a = await createScenario({ projectId, name: 'A', document: tidalDocument, userId: alice }, database.knex);
		const b = await createScenario({ projectId, name: 'B', document: tidalDocument, userId: alice }, database.knex);
		expect(a.isBaseCase).toBe(true);
		await expect(database.knex('scenarios').where({ id: b.id }).update({ is_base_case: true })).rejects.toThrow(
			/scenarios_one_base_case_per_project/
		);
	});

	it('keeps one base case when two scenarios are marked at the same moment', async () => {
		const a = await createScenario({ projectId, name: 'A', document: tidalDocument, userId: alice }, database.knex);
		const b = await createScenario({ projectId, name: 'B', document: tidalDocument, userId: alice }, database.knex);
		const c = await createScenario({ projectId, name: 'C', document: tidalDocument, userId: alice }, database.knex);
		await Promise.all([markBaseCase(b.id, alice, database.knex), markBaseCase(c.id, bob, database.knex)]);
		const bases = await database.knex('scenarios').select('id').where({ project_id: projectId, is_base_case: true });
		expect(bases).toHaveLength(1);
		expect([b.id, c.id]).toContain(bases[0].id);
		expect(bases[0].id).not.toBe(a.id);
	});

	it('refuses an archived scenario', async () => {
		await createScenario({ projectId, name: 'A', document: tidalDocument, userId: alice }, database.knex);
		const b = await createScenario({ projectId, name: 'B', document: tidalDocument, userId: alice }, database.knex);
		await archiveScenario(b.id, alice, database.knex);
		await expect(markBaseCase(b.id, alice, database.knex)).rejects.toBeInstanceOf(ArchivedScenarioError);
	});
});

describe('archive and restore', () => {
	it('hides an archived scenario from the live list, drops its base-case mark, and brings it back on restore', async () => {
		const base = await createScenario({ projectId, name: 'Base', document: tidalDocument, userId: alice }, database.knex);
		const archived = await archiveScenario(base.id, bob, database.knex);
		expect(archived).toMatchObject({ isBaseCase: false, updatedBy: { id: bob }, revision: 1 });
		expect(archived!.archivedAt).toBeInstanceOf(Date);
		expect(await listScenariosInProject(projectId, {}, database.knex)).toHaveLength(0);
		expect((await listScenariosInProject(projectId, { archived: true }, database.knex)).map((s) => s.id)).toEqual([base.id]);

		const restored = await restoreScenario(base.id, alice, database.knex);
		expect(restored).toMatchObject({ archivedAt: null, isBaseCase: false, revision: 1 });
		expect((await listScenariosInProject(projectId, {}, database.knex)).map((s) => s.id)).toEqual([base.id]);
	});

	it('deletes only an archived scenario, with its history', async () => {
		const s = await createScenario({ projectId, name: 'Scratch', document: tidalDocument, userId: alice }, database.knex);
		expect(await deleteArchivedScenario(s.id, database.knex)).toBe('not-archived');
		await archiveScenario(s.id, alice, database.knex);
		expect(await deleteArchivedScenario(s.id, database.knex)).toBe('deleted');
		expect(await getScenarioById(s.id, database.knex)).toBeUndefined();
		expect(await listScenarioRevisions(s.id, database.knex)).toHaveLength(0);
		expect(await deleteArchivedScenario(s.id, database.knex)).toBe('missing');
	});
});
