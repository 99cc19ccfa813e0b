import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { acceptInvitationAs } from '../../src/lib/server/auth/invitations';
import { createSession, generateSessionToken, type SessionUser } from '../../src/lib/server/auth/session';
import type { WorkspaceRole } from '../../src/lib/server/auth/roles';
import {
	acceptInvitation,
	createInvitation,
	getInvitationByToken,
	listOpenInvitations,
	revokeInvitation
} from '../../src/lib/server/db/invitations';
import { getMembership } from '../../src/lib/server/db/memberships';
import { createUser } from '../../src/lib/server/db/users';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';

let database: TestDatabase;
let counter = 0;

beforeAll(async () => {
	database = await createTestDatabase();
	// acceptInvitationAs goes through the app's db() singleton.
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(() => database.drop());

async function newUser(email?: string): Promise<SessionUser> {
	counter += 1;
	const row = await createUser(
		{ email: email ?? `invitee-${counter}@test.example`, name: `Invitee ${counter}`, passwordHash: 'unused' },
		database.knex
	);
	return { id: row.id, email: row.email, name: row.name, emailVerified: true };
}

async function newSessionId(userId: string) {
	return (await createSession(generateSessionToken(), userId, {}, database.knex)).id;
}

async function newWorkspace() {
	const owner = await newUser();
	counter += 1;
	const workspace = await createWorkspaceWithOwner(`Inlet Works ${counter}`, owner.id, database.knex);
	return { owner, workspace };
}

async function invite(workspaceId: string, invitedBy: string, email: string, role: WorkspaceRole) {
	return createInvitation({ workspaceId, email, role, invitedBy }, database.knex);
}

describe('createInvitation', () => {
	it('stores the sha256 of the link token, not the token', async () => {
		const { owner, workspace } = await newWorkspace();
		const { id, token } = await invite(workspace.id, owner.id, 'hash-check@test.example', 'viewer');
		const row = await database.knex('invitations').where({ id }).first();
		// node:crypto SHA-256 (FIPS 180-4), independent of the app's @oslojs implementation.
		expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
		expect(Object.values(row).map(String)).not.toContain(token);
	});

	it('replaces an open invitation for the same address (in any letter case)', async () => {
		const { owner, workspace } = await newWorkspace();
		const first = await invite(workspace.id, owner.id, 'twice@test.example', 'viewer');
		const second = await invite(workspace.id, owner.id, 'Twice@Test.example', 'analyst');
		expect((await getInvitationByToken(first.token, database.knex))?.status).toBe('revoked');
		expect((await getInvitationByToken(second.token, database.knex))?.status).toBe('open');
		expect((await listOpenInvitations(workspace.id, database.knex)).map((i) => i.id)).toEqual([second.id]);
	});
});

describe('acceptInvitationAs', () => {
	it('adds the invitee as a member with the invited role and opens the workspace in their session', async () => {
		for (const role of ['viewer', 'analyst', 'owner'] as const) {
			const { owner, workspace } = await newWorkspace();
			const invitee = await newUser();
			const { token } = await invite(workspace.id, owner.id, invitee.email, role);
			const sessionId = await newSessionId(invitee.id);

			const outcome = await acceptInvitationAs(token, invitee, sessionId, '127.0.0.8');
			expect(outcome.ok, role).toBe(true);
			expect((await getMembership(workspace.id, invitee.id, database.knex))?.role, role).toBe(role);
			const session = await database.knex('sessions').select('workspace_id').where({ id: sessionId }).first();
			expect(session.workspace_id).toBe(workspace.id);
			const audit = await database.knex('audit_events').where({ event: 'invitation-accepted', workspace_id: workspace.id });
			expect(audit).toHaveLength(1);
			expect(audit[0].detail).toEqual({ role });
		}
	});

	it('matches the address case-insensitively', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser('mixed.case@test.example');
		const { token } = await invite(workspace.id, owner.id, 'Mixed.Case@TEST.example', 'analyst');
		const outcome = await acceptInvitationAs(token, invitee, await newSessionId(invitee.id), '127.0.0.8');
		expect(outcome.ok).toBe(true);
		expect((await getMembership(workspace.id, invitee.id, database.knex))?.role).toBe('analyst');
	});

	it('refuses an account whose address is not the invited one, and adds no one', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser();
		const someoneElse = await newUser();
		const { token } = await invite(workspace.id, owner.id, invitee.email, 'analyst');

		const outcome = await acceptInvitationAs(token, someoneElse, await newSessionId(someoneElse.id), '127.0.0.8');
		expect(outcome).toEqual({ ok: false, message: `This invitation was sent to ${invitee.email}. Sign in with that address to accept it.` });
		expect(await getMembership(workspace.id, someoneElse.id, database.knex)).toBeUndefined();
		// The right person can still accept it afterwards.
		expect((await acceptInvitationAs(token, invitee, await newSessionId(invitee.id), '127.0.0.8')).ok).toBe(true);
	});

	it('refuses a revoked invitation', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser();
		const { id, token } = await invite(workspace.id, owner.id, invitee.email, 'analyst');
		expect(await revokeInvitation(workspace.id, id, database.knex)).toBe(true);

		const outcome = await acceptInvitationAs(token, invitee, await newSessionId(invitee.id), '127.0.0.8');
		expect(outcome).toEqual({ ok: false, message: 'This invitation was withdrawn by the workspace owner.' });
		expect(await getMembership(workspace.id, invitee.id, database.knex)).toBeUndefined();
	});

	it('refuses an expired invitation', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser();
		const { id, token } = await invite(workspace.id, owner.id, invitee.email, 'analyst');
		await database.knex('invitations').where({ id }).update({ expires_at: new Date(Date.now() - 1000) });

		const outcome = await acceptInvitationAs(token, invitee, await newSessionId(invitee.id), '127.0.0.8');
		expect(outcome).toEqual({ ok: false, message: 'This invitation has expired. Ask the owner for a new one.' });
		expect(await getMembership(workspace.id, invitee.id, database.knex)).toBeUndefined();
	});

	it('refuses a second acceptance and an unknown token', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser();
		const { token } = await invite(workspace.id, owner.id, invitee.email, 'viewer');
		const sessionId = await newSessionId(invitee.id);
		expect((await acceptInvitationAs(token, invitee, sessionId, '127.0.0.8')).ok).toBe(true);
		expect(await acceptInvitationAs(token, invitee, sessionId, '127.0.0.8')).toEqual({
			ok: false,
			message: 'This invitation has already been accepted.'
		});
		expect(await acceptInvitationAs('no-such-token', invitee, sessionId, '127.0.0.8')).toEqual({
			ok: false,
			message: 'This invitation link is not valid.'
		});
	});

	it('does not let one workspace revoke another workspace\u2019s invitation', async () => {
		const a = await newWorkspace();
		const b = await newWorkspace();
		const { id } = await invite(a.workspace.id, a.owner.id, 'cross@test.example', 'viewer');
		expect(await revokeInvitation(b.workspace.id, id, database.knex)).toBe(false);
		expect((await listOpenInvitations(a.workspace.id, database.knex)).map((i) => i.id)).toEqual([id]);
	});
});

describe('acceptInvitation', () => {
	it('lets exactly one of two concurrent acceptances through', async () => {
		const { owner, workspace } = await newWorkspace();
		const invitee = await newUser();
		const { token } = await invite(workspace.id, owner.id, invitee.email, 'analyst');
		const outcomes = await Promise.all([
			acceptInvitation(token, invitee.id, database.knex),
			acceptInvitation(token, invitee.id, database.knex)
		]);
		expect(outcomes.filter((o) => o !== null)).toHaveLength(1);
		const memberships = await database.knex('memberships').where({ workspace_id: workspace.id, user_id: invitee.id });
		expect(memberships).toHaveLength(1);
	});

	it('raises an existing member to a higher invited role and never lowers one', async () => {
		const { owner, workspace } = await newWorkspace();
		const member = await newUser();
		await database.knex('memberships').insert({ workspace_id: workspace.id, user_id: member.id, role: 'viewer' });

		const up = await invite(workspace.id, owner.id, member.email, 'analyst');
		await acceptInvitation(up.token, member.id, database.knex);
		expect((await getMembership(workspace.id, member.id, database.knex))?.role).toBe('analyst');

		const down = await invite(workspace.id, owner.id, member.email, 'viewer');
		await acceptInvitation(down.token, member.id, database.knex);
		expect((await getMembership(workspace.id, member.id, database.knex))?.role).toBe('analyst');
	});
});
