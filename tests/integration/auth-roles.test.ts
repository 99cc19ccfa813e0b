import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { newPerson, newWorkspaceOf } from '../helpers/people';
import { setAppEnv } from '../helpers/app-env';
import { isWorkspaceRole, roleAtLeast, workspaceRoles, type WorkspaceRole } from '../../src/lib/server/auth/roles';
import { authorize, requireUser, scenarioReadInView } from '../../src/lib/server/auth/access';
import { createProject } from '../../src/lib/server/db/projects';
import { createScenario } from '../../src/lib/server/db/scenarios';
import { db } from '../../src/lib/server/db/knex';
import { tidalDocument } from '../fixtures/scenario-documents';
import { createSession, generateSessionToken, type SessionUser } from '../../src/lib/server/auth/session';
import {
	LastOwnerError,
	addMember,
	changeMemberRole,
	getMembership,
	listMembers,
	listWorkspacesForUser,
	removeMember
} from '../../src/lib/server/db/memberships';

let database: TestDatabase;

beforeAll(async () => {
	database = await createTestDatabase();
	// authorize reads memberships through the app's db() singleton.
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(() => database.drop());

const newUser = () => newPerson(database.knex, 'member');

const newWorkspace = () => newWorkspaceOf(database.knex);

async function roleOf(workspaceId: string, userId: string) {
	return (await getMembership(workspaceId, userId, database.knex))?.role;
}

async function ownerCount(workspaceId: string) {
	return (await listMembers(workspaceId, database.knex)).filter((m) => m.role === 'owner').length;
}

describe('roleAtLeast', () => {
	// The ladder of issue 4: owner > analyst > viewer, each doing all the lower one does.
	const table: [WorkspaceRole, WorkspaceRole, boolean][] = [
		['viewer', 'viewer', true],
		['viewer', 'analyst', false],
		['viewer', 'owner', false],
		['analyst', 'viewer', true],
		['analyst', 'analyst', true],
		['analyst', 'owner', false],
		['owner', 'viewer', true],
		['owner', 'analyst', true],
		['owner', 'owner', true]
	];
	it.each(table)('%s meets a %s minimum: %s', (role, minimum, expected) => {
		expect(roleAtLeast(role, minimum)).toBe(expected);
	});

	it('covers every role', () => {
		expect(new Set(table.map(([role]) => role))).toEqual(new Set(workspaceRoles));
	});
});

describe('isWorkspaceRole', () => {
	it('accepts the three roles and nothing else', () => {
		for (const role of workspaceRoles) expect(isWorkspaceRole(role)).toBe(true);
		for (const other of ['Owner', 'admin', '', 'investor', 3, null, undefined]) expect(isWorkspaceRole(other)).toBe(false);
	});
});

describe('createWorkspaceWithOwner', () => {
	it('makes the creator the one owner', async () => {
		const { owner, workspaceId } = await newWorkspace();
		expect(await listMembers(workspaceId, database.knex)).toEqual([
			expect.objectContaining({ userId: owner.id, role: 'owner' })
		]);
	});
});

describe('the last owner', () => {
	it('cannot be demoted', async () => {
		const { owner, workspaceId } = await newWorkspace();
		for (const role of ['analyst', 'viewer'] as const) {
			await expect(changeMemberRole(workspaceId, owner.id, role, database.knex)).rejects.toBeInstanceOf(LastOwnerError);
		}
		expect(await roleOf(workspaceId, owner.id)).toBe('owner');
	});

	it('cannot be removed, nor leave', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const analyst = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		// Removal by someone and leaving are the same call on the owner's membership.
		await expect(removeMember(workspaceId, owner.id, database.knex)).rejects.toBeInstanceOf(LastOwnerError);
		expect(await roleOf(workspaceId, owner.id)).toBe('owner');
	});

	it('can be kept an owner (a change to the same role is no demotion)', async () => {
		const { owner, workspaceId } = await newWorkspace();
		expect(await changeMemberRole(workspaceId, owner.id, 'owner', database.knex)).toBe('owner');
	});

	it('can step down, be removed or leave once a second owner exists', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const second = await newUser();
		await addMember(workspaceId, second.id, 'analyst', database.knex);
		expect(await changeMemberRole(workspaceId, second.id, 'owner', database.knex)).toBe('analyst');

		expect(await changeMemberRole(workspaceId, owner.id, 'viewer', database.knex)).toBe('owner');
		expect(await roleOf(workspaceId, owner.id)).toBe('viewer');
		// Now `second` is the last owner and is protected in turn.
		await expect(changeMemberRole(workspaceId, second.id, 'analyst', database.knex)).rejects.toBeInstanceOf(LastOwnerError);

		expect(await changeMemberRole(workspaceId, owner.id, 'owner', database.knex)).toBe('viewer');
		expect(await removeMember(workspaceId, owner.id, database.knex)).toBe(true);
		expect(await roleOf(workspaceId, owner.id)).toBeUndefined();
		await expect(removeMember(workspaceId, second.id, database.knex)).rejects.toBeInstanceOf(LastOwnerError);
	});

	it('survives two owners demoting each other at the same moment: exactly one demotion goes through', async () => {
		for (let round = 0; round < 5; round += 1) {
			const { owner, workspaceId } = await newWorkspace();
			const second = await newUser();
			await addMember(workspaceId, second.id, 'owner', database.knex);
			const outcomes = await Promise.allSettled([
				changeMemberRole(workspaceId, owner.id, 'analyst', database.knex),
				changeMemberRole(workspaceId, second.id, 'analyst', database.knex)
			]);
			expect(outcomes.filter((o) => o.status === 'fulfilled'), `round ${round}`).toHaveLength(1);
			const rejected = outcomes.find((o) => o.status === 'rejected') as PromiseRejectedResult;
			expect(rejected.reason).toBeInstanceOf(LastOwnerError);
			expect(await ownerCount(workspaceId)).toBe(1);
		}
	});

	it('survives two owners leaving at the same moment: one stays', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const second = await newUser();
		await addMember(workspaceId, second.id, 'owner', database.knex);
		const outcomes = await Promise.allSettled([
			removeMember(workspaceId, owner.id, database.knex),
			removeMember(workspaceId, second.id, database.knex)
		]);
		expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(1);
		expect(await ownerCount(workspaceId)).toBe(1);
	});
});

describe('members', () => {
	it('answers null when changing the role of someone who is not a member', async () => {
		const { workspaceId } = await newWorkspace();
		const stranger = await newUser();
		expect(await changeMemberRole(workspaceId, stranger.id, 'viewer', database.knex)).toBeNull();
		expect(await roleOf(workspaceId, stranger.id)).toBeUndefined();
	});

	it('forgets a removed member\u2019s open workspace in their sessions', async () => {
		const { workspaceId } = await newWorkspace();
		const analyst = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		const session = await createSession(generateSessionToken(), analyst.id, { workspaceId }, database.knex);
		await removeMember(workspaceId, analyst.id, database.knex);
		const row = await database.knex('sessions').select('workspace_id').where({ id: session.id }).first();
		expect(row.workspace_id).toBeNull();
	});

	it('lets a user belong to several workspaces with a role in each', async () => {
		const a = await newWorkspace();
		const b = await newWorkspace();
		const person = await newUser();
		await addMember(a.workspaceId, person.id, 'viewer', database.knex);
		await addMember(b.workspaceId, person.id, 'analyst', database.knex);
		const mine = await listWorkspacesForUser(person.id, database.knex);
		expect(Object.fromEntries(mine.map((m) => [m.workspaceId, m.role]))).toEqual({ [a.workspaceId]: 'viewer', [b.workspaceId]: 'analyst' });
	});
});

describe('authorize on a workspace', () => {
	function eventFor(user: SessionUser | null, path = '/app/w/x') {
		const principal = user ? { kind: 'member', user, session: { id: 'unused', userId: user.id, expiresAt: new Date(), workspaceId: null } } : { kind: 'anonymous' };
		return { locals: { principal, user, session: null }, url: new URL(`http://127.0.0.1${path}`) } as unknown as Pick<RequestEvent, 'locals' | 'url'>;
	}
	const requireWorkspaceRole = (event: Pick<RequestEvent, 'locals' | 'url'>, workspaceId: string, minimum: WorkspaceRole) =>
		authorize(event, { workspaceId }, minimum);

	async function statusOf(promise: Promise<unknown>): Promise<number | string> {
		try {
			await promise;
			return 'allowed';
		} catch (e) {
			if (isHttpError(e)) return e.status;
			if (isRedirect(e)) return `${e.status} ${e.location}`;
			throw e;
		}
	}

	it('answers each role by the ladder: 403 below the minimum, allowed at or above it', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const analyst = await newUser();
		const viewer = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		await addMember(workspaceId, viewer.id, 'viewer', database.knex);
		const people: Record<WorkspaceRole, SessionUser> = { owner, analyst, viewer };
		for (const role of workspaceRoles) {
			for (const minimum of workspaceRoles) {
				const expected = roleAtLeast(role, minimum) ? 'allowed' : 403;
				expect(await statusOf(requireWorkspaceRole(eventFor(people[role]), workspaceId, minimum)), `${role} vs ${minimum}`).toBe(expected);
			}
		}
	});

	it('hides another workspace behind 404, whatever the role asked', async () => {
		const { workspaceId } = await newWorkspace();
		const outsider = (await newWorkspace()).owner;
		for (const minimum of workspaceRoles) {
			expect(await statusOf(requireWorkspaceRole(eventFor(outsider), workspaceId, minimum))).toBe(404);
		}
	});

	it('answers 404 for an id that is not a uuid or names no workspace', async () => {
		const { owner } = await newWorkspace();
		expect(await statusOf(requireWorkspaceRole(eventFor(owner), 'not-a-uuid', 'viewer'))).toBe(404);
		expect(await statusOf(requireWorkspaceRole(eventFor(owner), '00000000-0000-4000-8000-000000000000', 'viewer'))).toBe(404);
	});

	it('answers 401 to an anonymous API call and sends an anonymous page visit to sign-in', async () => {
		const { workspaceId } = await newWorkspace();
		expect(await statusOf(requireWorkspaceRole(eventFor(null, `/api/v1/workspaces/${workspaceId}/projects`), workspaceId, 'viewer'))).toBe(401);
		expect(await statusOf(requireWorkspaceRole(eventFor(null, `/app/w/${workspaceId}?tab=1`), workspaceId, 'viewer'))).toBe(
			`303 /signin?next=${encodeURIComponent(`/app/w/${workspaceId}?tab=1`)}`
		);
		expect(() => requireUser(eventFor(null, '/api/v1/workspaces'))).toThrow();
	});

	it('stops answering for a member once removed', async () => {
		const { workspaceId } = await newWorkspace();
		const analyst = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		expect(await statusOf(requireWorkspaceRole(eventFor(analyst), workspaceId, 'analyst'))).toBe('allowed');
		await removeMember(workspaceId, analyst.id, database.knex);
		expect(await statusOf(requireWorkspaceRole(eventFor(analyst), workspaceId, 'viewer'))).toBe(404);
	});
});

describe('authorize on a scenario, on a page view', () => {
	it('reads the scenario with its project in one query, keeps it for the page, and still hides it from outsiders', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const project = await createProject({ workspaceId, name: 'View probe', technology: 'tidal-stream' }, database.knex);
		const scenario = await createScenario({ projectId: project.id, name: 'One query', document: tidalDocument, userId: owner.id }, database.knex);
		const event = {
			locals: { principal: { kind: 'member', user: owner, session: { id: 'unused', userId: owner.id, expiresAt: new Date(), workspaceId: null } }, user: owner, session: null },
			url: new URL(`http://127.0.0.1/app/w/${workspaceId}/projects/${project.id}/scenarios/${scenario.id}`),
			request: new Request('http://127.0.0.1/', { method: 'GET' })
		} as unknown as RequestEvent;
		const appDb = db();
		let queries = 0;
		const count = () => (queries += 1);
		appDb.on('query', count);
		try {
			const params = { workspaceId, projectId: project.id, scenarioId: scenario.id };
			const [layout, page] = [await authorize(event, params, 'viewer'), await authorize(event, params, 'viewer')];
			expect(layout.project.id).toBe(project.id);
			expect(page.scenarioId).toBe(scenario.id);
			// One query for the project and the scenario (memberships come with the session; here the list is read once).
			expect(queries).toBe(2);
			expect(scenarioReadInView(event, scenario.id)?.document).toEqual(scenario.document);
		} finally {
			appDb.off('query', count);
		}
		const outsider = (await newWorkspace()).owner;
		const outsiderEvent = { ...event, locals: { principal: { kind: 'member', user: outsider, session: { id: 'x', userId: outsider.id, expiresAt: new Date(), workspaceId: null } }, user: outsider, session: null } } as unknown as RequestEvent;
		await expect(authorize(outsiderEvent, { scenarioId: scenario.id }, 'viewer')).rejects.toMatchObject({ status: 404 });
	});
});
