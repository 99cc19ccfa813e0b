/**
 * The list routes answer a page at a time: `?limit=` (100 by default, at most
 * 500) and an opaque `?cursor=` from the previous page's `nextCursor`. Walking
 * the pages covers every item exactly once, in the list's order; a cursor the
 * list did not give out is refused by name.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { callRoute, newSessionUser } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { createProject } from '../../src/lib/server/db/projects';
import { archiveScenario, createScenario, listScenariosInProject } from '../../src/lib/server/db/scenarios';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { projectListJsonSchema, scenarioListJsonSchema, uploadListJsonSchema } from '../../src/lib/schemas/api-responses';
import * as projectsRoute from '../../src/routes/api/v1/workspaces/[workspaceId]/projects/+server';
import * as scenariosRoute from '../../src/routes/api/v1/projects/[projectId]/scenarios/+server';
import * as uploadsRoute from '../../src/routes/api/v1/projects/[projectId]/uploads/+server';

let database: TestDatabase;
let viewer: SessionUser;
let workspaceId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	viewer = await newSessionUser(database.knex, 'pager');
	workspaceId = (await createWorkspaceWithOwner('Wrack Bay Consulting', viewer.id, database.knex)).id;
});
afterAll(() => database.drop());

type Handler = Parameters<typeof callRoute>[0];

async function get(handler: Handler, path: string, params: Record<string, string>) {
	const response = await callRoute(handler, viewer, { path, params });
	return { status: response.status, body: await response.json() };
}

/** Follows nextCursor from the first page, answering each page's list; every page must fit the documented answer. */
async function walk(handler: Handler, path: string, params: Record<string, string>, field: string, schema: z.ZodType, limit?: number) {
	const pages: { id: string }[][] = [];
	let cursor: string | null = null;
	do {
		const query = new URLSearchParams();
		if (limit !== undefined) query.set('limit', String(limit));
		if (cursor !== null) query.set('cursor', cursor);
		const { status, body } = await get(handler, `${path}?${query}`, params);
		expect(status, JSON.stringify(body)).toBe(200);
		expect(schema.safeParse(body).error).toBeUndefined();
		pages.push(body[field]);
		cursor = body.nextCursor;
		expect(pages.length).toBeLessThan(100);
	} while (cursor !== null);
	return pages;
}

/** Names sort the same in C collation (the test cluster's) and in JavaScript; ids are lower-case hex. */
const byNameThenId = (a: { name: string; id: string }, b: { name: string; id: string }) =>
	a.name < b.name ? -1 : a.name > b.name ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;

describe('GET /api/v1/workspaces/:workspaceId/projects', () => {
	const projectsPath = () => `/api/v1/workspaces/${workspaceId}/projects`;
	let expected: { id: string; name: string }[];

	beforeAll(async () => {
		// 1,000 live projects in one insert, every tenth sharing its name with the one before (ties fall back to the id),
		// and a few archived ones the live list must leave out.
		const rows = Array.from({ length: 1000 }, (_, i) => ({
			workspace_id: workspaceId,
			name: `Array ${String(i % 10 === 9 ? i - 1 : i).padStart(4, '0')}`,
			technology: 'tidal-stream'
		}));
		const inserted: { id: string; name: string }[] = await database.knex('projects').insert(rows).returning(['id', 'name']);
		await database.knex('projects').insert(
			Array.from({ length: 5 }, (_, i) => ({ workspace_id: workspaceId, name: `Array 0000 old ${i}`, technology: 'wave', archived_at: new Date() }))
		);
		expected = [...inserted].sort(byNameThenId);
	});

	it('covers all 1,000 projects exactly once, in name order, in pages of 100 (the default)', async () => {
		const pages = await walk(projectsRoute.GET, projectsPath(), { workspaceId }, 'projects', projectListJsonSchema);
		expect(pages.map((p) => p.length)).toEqual(Array(10).fill(100));
		const ids = pages.flat().map((p) => p.id);
		expect(new Set(ids).size).toBe(1000);
		expect(ids).toEqual(expected.map((p) => p.id));
	});

	it('keeps the answer’s other fields and says null on the last page', async () => {
		const { body } = await get(projectsRoute.GET, `${projectsPath()}?limit=500`, { workspaceId });
		expect(body.workspace).toMatchObject({ id: workspaceId, name: 'Wrack Bay Consulting', role: 'owner' });
		expect(body.projects).toHaveLength(500);
		expect(typeof body.nextCursor).toBe('string');
		const last = await get(projectsRoute.GET, `${projectsPath()}?limit=500&cursor=${encodeURIComponent(body.nextCursor)}`, { workspaceId });
		expect(last.body.projects).toHaveLength(500);
		expect(last.body.nextCursor).toBeNull();
	});

	it('pages the archived list on its own', async () => {
		const archived = await get(projectsRoute.GET, `${projectsPath()}?archived=1&limit=2`, { workspaceId });
		expect(archived.body.projects.map((p: { name: string }) => p.name)).toEqual(['Array 0000 old 0', 'Array 0000 old 1']);
		const rest = await get(projectsRoute.GET, `${projectsPath()}?archived=1&limit=10&cursor=${encodeURIComponent(archived.body.nextCursor)}`, { workspaceId });
		expect(rest.body.projects.map((p: { name: string }) => p.name)).toEqual(['Array 0000 old 2', 'Array 0000 old 3', 'Array 0000 old 4']);
		expect(rest.body.nextCursor).toBeNull();
	});

	it.each([
		['not base64url at all', 'not a cursor!'],
		['base64url of something else', Buffer.from('hello').toString('base64url')],
		['a key of another list', Buffer.from(JSON.stringify(['uploads', ['2026-01-01T00:00:00.000000Z', '00000000-0000-4000-8000-000000000001']])).toString('base64url')],
		['a key of the wrong shape', Buffer.from(JSON.stringify(['projects', ['Array 0001']])).toString('base64url')]
	])('refuses a cursor that is %s with 422 naming cursor', async (_, cursor) => {
		const { status, body } = await get(projectsRoute.GET, `${projectsPath()}?cursor=${encodeURIComponent(cursor)}`, { workspaceId });
		expect(status).toBe(422);
		expect(body.error.issues).toEqual([{ path: 'cursor', message: expect.stringMatching(/not a cursor this list gave out/) }]);
	});

	it.each(['0', '501', 'ten', '-1', '2.5', ''])('refuses limit=%s with 422 naming limit', async (limit) => {
		const { status, body } = await get(projectsRoute.GET, `${projectsPath()}?limit=${limit}`, { workspaceId });
		expect(status).toBe(422);
		expect(body.error.issues.map((i: { path: string }) => i.path)).toEqual(['limit']);
	});
});

describe('GET /api/v1/projects/:projectId/scenarios', () => {
	it('pages the scenarios in the list’s order, the base case first, same names by creation', async () => {
		const { knex } = database;
		const project = await createProject({ workspaceId, name: 'Wrack Bay North', technology: 'tidal-stream' }, knex);
		for (const name of ['Zulu base', 'Mid', 'Alpha', 'Mid', 'Mid', 'Beta', 'Alpha', 'Gone']) {
			await createScenario({ projectId: project.id, name, document: tidalDocument, userId: viewer.id }, knex);
		}
		const gone = (await listScenariosInProject(project.id, {}, knex)).find((s) => s.name === 'Gone')!;
		await archiveScenario(gone.id, viewer.id, knex);
		const whole = await listScenariosInProject(project.id, {}, knex);

		const pages = await walk(scenariosRoute.GET, `/api/v1/projects/${project.id}/scenarios`, { projectId: project.id }, 'scenarios', scenarioListJsonSchema, 2);
		expect(pages.map((p) => p.length)).toEqual([2, 2, 2, 1]);
		const walked = pages.flat() as unknown as { id: string; name: string }[];
		expect(walked.map((s) => s.id)).toEqual(whole.map((s) => s.id));
		expect(walked.map((s) => s.name)).toEqual(['Zulu base', 'Alpha', 'Alpha', 'Beta', 'Mid', 'Mid', 'Mid']);
		const archived = await get(scenariosRoute.GET, `/api/v1/projects/${project.id}/scenarios?archived=1&limit=1`, { projectId: project.id });
		expect(archived.body.scenarios.map((s: { id: string }) => s.id)).toEqual([gone.id]);
		expect(archived.body.nextCursor).toBeNull();
	});
});

describe('GET /api/v1/projects/:projectId/uploads', () => {
	it('pages the uploads newest first, telling apart times a microsecond apart', async () => {
		const { knex } = database;
		const project = await createProject({ workspaceId, name: 'Wrack Bay South', technology: 'tidal-stream' }, knex);
		const content = Buffer.from('speed_m_s,hours\n1.0,5\n');
		// Six uploads within two microseconds of 10:00: a cursor kept to the millisecond would skip or repeat some.
		const microseconds = [1, 2, 2, 1, 0, 2];
		const inserted: { id: string; micro: number }[] = [];
		for (const micro of microseconds) {
			const created_at = `2026-05-01 10:00:00.${String(micro).padStart(6, '0')}+00`;
			const [row] = await knex('uploads')
				.insert({ project_id: project.id, kind: 'speed-histogram', file_name: 'h.csv', content_type: 'text/csv', byte_size: content.byteLength, sha256: '0'.repeat(64), content, parsed: JSON.stringify({ data: null, summary: {}, warnings: [] }), created_at })
				.returning('id');
			inserted.push({ id: row.id, micro });
		}
		// Newest first, then by id, descending.
		const expected = [...inserted].sort((a, b) => b.micro - a.micro || (a.id < b.id ? 1 : -1)).map((u) => u.id);

		const pages = await walk(uploadsRoute.GET, `/api/v1/projects/${project.id}/uploads`, { projectId: project.id }, 'uploads', uploadListJsonSchema, 2);
		expect(pages.map((p) => p.length)).toEqual([2, 2, 2]);
		expect(pages.flat().map((u) => u.id)).toEqual(expected);
	});
});
