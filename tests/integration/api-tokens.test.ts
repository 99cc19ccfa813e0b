/**
 * Personal API tokens through the one door: stored as a hash only, refused
 * when expired, revoked or orphaned, never more than the member's role, a
 * read-only token at most a viewer, and never outside the token's workspace.
 */
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { newPerson, newWorkspaceOf } from '../helpers/people';
import { setAppEnv } from '../helpers/app-env';
import { authorize, requireBrowserSession, visibleWorkspaces } from '../../src/lib/server/auth/access';
import { authenticateApiToken, bearerToken, createApiToken, revokeApiToken } from '../../src/lib/server/auth/api-tokens';
import type { Principal } from '../../src/lib/server/auth/principal';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { hashToken } from '../../src/lib/server/auth/tokens';
import type { WorkspaceRole } from '../../src/lib/server/auth/roles';
import { addMember, changeMemberRole, removeMember } from '../../src/lib/server/db/memberships';
import { createProject } from '../../src/lib/server/db/projects';

let database: TestDatabase;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(() => database.drop());

const newUser = () => newPerson(database.knex, 'token');

async function newWorkspace(owner: SessionUser) {
	return { id: (await newWorkspaceOf(database.knex, owner)).workspaceId };
}

async function tokenFor(userId: string, workspaceId: string, access: 'read' | 'read-write', lifetimeDays = 30) {
	const outcome = await createApiToken(userId, { name: `script for ${access}`, workspaceId, access, lifetimeDays });
	if (!outcome.ok) throw new Error(outcome.message);
	return outcome;
}

async function principalFor(token: string): Promise<Principal> {
	const outcome = await authenticateApiToken(token);
	if (!outcome.ok) throw new Error(outcome.message);
	return outcome.principal;
}

function apiEvent(principal: Principal, path = '/api/v1/x') {
	return { locals: { principal, user: null, session: null }, url: new URL(`http://127.0.0.1${path}`) } as unknown as Pick<RequestEvent, 'locals' | 'url'>;
}

async function statusOf(promise: Promise<unknown> | (() => unknown)): Promise<number | string> {
	try {
		await (typeof promise === 'function' ? promise() : promise);
		return 'allowed';
	} catch (e) {
		if (isHttpError(e)) return e.status;
		if (isRedirect(e)) return `${e.status} ${e.location}`;
		throw e;
	}
}

describe('createApiToken', () => {
	it('shows the token once and stores only its sha256', async () => {
		const owner = await newUser();
		const workspace = await newWorkspace(owner);
		const { token, id } = await tokenFor(owner.id, workspace.id, 'read-write');
		expect(token).toMatch(/^tw_[a-z2-7]{32}$/);
		const row = await database.knex('api_tokens').where({ id }).first();
		expect(row.token_hash).toBe(hashToken(token));
		expect(JSON.stringify(row)).not.toContain(token.slice(3));
	});

	it('refuses a read-and-write token to a viewer, and any token outside the member’s workspaces', async () => {
		const owner = await newUser();
		const viewer = await newUser();
		const workspace = await newWorkspace(owner);
		await addMember(workspace.id, viewer.id, 'viewer', database.knex);
		const refused = await createApiToken(viewer.id, { name: 'x', workspaceId: workspace.id, access: 'read-write', lifetimeDays: 30 });
		expect(refused).toMatchObject({ ok: false, field: 'access' });
		const stranger = await newUser();
		const outside = await createApiToken(stranger.id, { name: 'x', workspaceId: workspace.id, access: 'read', lifetimeDays: 30 });
		expect(outside).toMatchObject({ ok: false, field: 'workspaceId' });
	});
});

describe('authenticateApiToken', () => {
	it('refuses unknown, malformed, expired and revoked tokens', async () => {
		const owner = await newUser();
		const workspace = await newWorkspace(owner);
		const { token, id } = await tokenFor(owner.id, workspace.id, 'read', 7);
		expect((await authenticateApiToken(token)).ok).toBe(true);
		expect(await authenticateApiToken(`tw_${'a'.repeat(32)}`)).toMatchObject({ ok: false, message: expect.stringMatching(/not valid/) });
		expect(await authenticateApiToken('not a token')).toMatchObject({ ok: false });
		const eightDaysOn = new Date(Date.now() + 8 * 24 * 3600 * 1000);
		expect(await authenticateApiToken(token, eightDaysOn)).toMatchObject({ ok: false, message: expect.stringMatching(/expired/) });
		expect(await revokeApiToken(owner.id, id)).toBeDefined();
		// A refusal of a token the workspace issued names it, so the security log can record the attempt.
		expect(await authenticateApiToken(token)).toMatchObject({ ok: false, message: expect.stringMatching(/revoked/), known: { tokenId: id, workspaceId: workspace.id, reason: 'revoked' } });
		expect(await authenticateApiToken(`tw_${'b'.repeat(32)}`)).not.toHaveProperty('known');
		expect(await revokeApiToken(owner.id, id)).toBeUndefined();
	});

	it('revokes the tokens of a member who leaves; coming back does not revive them', async () => {
		const owner = await newUser();
		const analyst = await newUser();
		const workspace = await newWorkspace(owner);
		await addMember(workspace.id, analyst.id, 'analyst', database.knex);
		const { token } = await tokenFor(analyst.id, workspace.id, 'read-write');
		await removeMember(workspace.id, analyst.id, database.knex);
		expect(await authenticateApiToken(token)).toMatchObject({ ok: false, message: expect.stringMatching(/revoked/) });
		await addMember(workspace.id, analyst.id, 'analyst', database.knex);
		expect(await authenticateApiToken(token)).toMatchObject({ ok: false, message: expect.stringMatching(/revoked/) });
	});

	it('refuses a token whose membership is gone by any other path', async () => {
		const owner = await newUser();
		const analyst = await newUser();
		const workspace = await newWorkspace(owner);
		await addMember(workspace.id, analyst.id, 'analyst', database.knex);
		const { token } = await tokenFor(analyst.id, workspace.id, 'read');
		await database.knex('memberships').where({ workspace_id: workspace.id, user_id: analyst.id }).delete();
		expect(await authenticateApiToken(token)).toMatchObject({ ok: false, message: expect.stringMatching(/no longer a member/) });
	});

	it('only another member’s revocation of their own tokens counts', async () => {
		const owner = await newUser();
		const other = await newUser();
		const workspace = await newWorkspace(owner);
		const { id } = await tokenFor(owner.id, workspace.id, 'read');
		expect(await revokeApiToken(other.id, id)).toBeUndefined();
	});
});

describe('bearerToken', () => {
	it('reads the Bearer scheme only', () => {
		const request = (value?: string) => new Request('http://127.0.0.1/api/v1/workspaces', { headers: value ? { authorization: value } : {} });
		expect(bearerToken(request('Bearer tw_abc'))).toBe('tw_abc');
		expect(bearerToken(request('bearer   tw_abc  '))).toBe('tw_abc');
		expect(bearerToken(request('Basic dXNlcg=='))).toBe('');
		expect(bearerToken(request())).toBeNull();
	});
});

describe('authorize with a token', () => {
	const ladder: WorkspaceRole[] = ['viewer', 'analyst', 'owner'];

	it('acts with exactly the member’s role; a read-only token at most as a viewer', async () => {
		const owner = await newUser();
		const analyst = await newUser();
		const workspace = await newWorkspace(owner);
		await addMember(workspace.id, analyst.id, 'analyst', database.knex);
		const cases: [string, WorkspaceRole[]][] = [
			[(await tokenFor(owner.id, workspace.id, 'read-write')).token, ['viewer', 'analyst', 'owner']],
			[(await tokenFor(owner.id, workspace.id, 'read')).token, ['viewer']],
			[(await tokenFor(analyst.id, workspace.id, 'read-write')).token, ['viewer', 'analyst']],
			[(await tokenFor(analyst.id, workspace.id, 'read')).token, ['viewer']]
		];
		for (const [token, allowed] of cases) {
			const event = apiEvent(await principalFor(token));
			for (const minimum of ladder) {
				expect(await statusOf(authorize(event, { workspaceId: workspace.id }, minimum)), minimum).toBe(allowed.includes(minimum) ? 'allowed' : 403);
			}
		}
	});

	it('follows the member’s current role: a demoted analyst’s read-write token can no longer write', async () => {
		const owner = await newUser();
		const analyst = await newUser();
		const workspace = await newWorkspace(owner);
		await addMember(workspace.id, analyst.id, 'analyst', database.knex);
		const { token } = await tokenFor(analyst.id, workspace.id, 'read-write');
		const event = apiEvent(await principalFor(token));
		expect(await statusOf(authorize(event, { workspaceId: workspace.id }, 'analyst'))).toBe('allowed');
		await changeMemberRole(workspace.id, analyst.id, 'viewer', database.knex);
		expect(await statusOf(authorize(apiEvent(await principalFor(token)), { workspaceId: workspace.id }, 'analyst'))).toBe(403);
	});

	it('never reaches another workspace, even one its member belongs to', async () => {
		const owner = await newUser();
		const home = await newWorkspace(owner);
		const other = await newWorkspace(owner);
		const project = await createProject({ workspaceId: other.id, name: 'Elsewhere', technology: 'wave' }, database.knex);
		const event = apiEvent(await principalFor((await tokenFor(owner.id, home.id, 'read-write')).token));
		expect(await statusOf(authorize(event, { workspaceId: other.id }, 'viewer'))).toBe(404);
		expect(await statusOf(authorize(event, { projectId: project.id }, 'viewer'))).toBe(404);
		expect((await visibleWorkspaces(event)).map((w) => w.workspaceId)).toEqual([home.id]);
	});

	it('cannot manage accounts, members, tokens or billing', async () => {
		const owner = await newUser();
		const workspace = await newWorkspace(owner);
		const event = apiEvent(await principalFor((await tokenFor(owner.id, workspace.id, 'read-write')).token));
		expect(await statusOf(() => requireBrowserSession(event))).toBe(403);
	});

	it('keeps nested ids honest: a project id under the wrong workspace is hidden', async () => {
		const owner = await newUser();
		const a = await newWorkspace(owner);
		const b = await newWorkspace(owner);
		const project = await createProject({ workspaceId: a.id, name: 'Nested', technology: 'tidal-stream' }, database.knex);
		const member = apiEvent({ kind: 'member', user: { id: owner.id, email: owner.email, name: owner.name, emailVerified: true }, session: { id: 's', userId: owner.id, expiresAt: new Date(), workspaceId: null } }, '/app/w');
		expect(await statusOf(authorize(member, { workspaceId: a.id, projectId: project.id }, 'viewer'))).toBe('allowed');
		expect(await statusOf(authorize(member, { workspaceId: b.id, projectId: project.id }, 'viewer'))).toBe(404);
	});
});
