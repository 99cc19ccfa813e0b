/**
 * The members page's owner actions on someone who is not a member: a 404 in
 * words, nothing changed and no audit event (a security log that records a
 * removal that never happened would mislead the owner reading it).
 */
import { isActionFailure, type RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { newPerson, newWorkspaceOf } from '../helpers/people';
import { setAppEnv } from '../helpers/app-env';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { addMember, getMembership } from '../../src/lib/server/db/memberships';
import { actions } from '../../src/routes/(app)/app/w/[workspaceId]/members/+page.server';

let database: TestDatabase;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
});
afterAll(() => database.drop());

const newUser = () => newPerson(database.knex, 'crew');

const newWorkspace = () => newWorkspaceOf(database.knex);

function actionEvent(user: SessionUser, workspaceId: string, action: string, fields: Record<string, string>) {
	const url = new URL(`http://127.0.0.1/app/w/${workspaceId}/members?/${action}`);
	const session = { id: 'unused', userId: user.id, expiresAt: new Date(Date.now() + 60_000), workspaceId };
	return {
		params: { workspaceId },
		url,
		request: new Request(url, { method: 'POST', body: new URLSearchParams(fields) }),
		locals: { principal: { kind: 'member', user, session }, user, session },
		getClientAddress: () => '127.0.0.1'
	} as unknown as RequestEvent as never;
}

async function auditEvents(workspaceId: string) {
	return database.knex('audit_events').select('event').where({ workspace_id: workspaceId });
}

type Outcome = { status?: number; data?: { message?: string } } & Record<string, unknown>;

describe('members action remove', () => {
	it('answers 404 in words for someone who is not a member, and writes no audit event', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const stranger = await newUser();
		const outcome = (await actions.remove(actionEvent(owner, workspaceId, 'remove', { userId: stranger.id }))) as Outcome;
		expect(isActionFailure(outcome)).toBe(true);
		expect(outcome.status).toBe(404);
		expect(outcome.data?.message).toMatch(/not a member/);
		expect(await auditEvents(workspaceId)).toEqual([]);
	});

	it('asks first, naming the person, and changes nothing until the owner confirms', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const analyst = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		const outcome = (await actions.remove(actionEvent(owner, workspaceId, 'remove', { userId: analyst.id }))) as Outcome;
		expect(isActionFailure(outcome)).toBe(false);
		expect(outcome.confirmRemove).toEqual({ userId: analyst.id, name: analyst.name, email: analyst.email, role: 'analyst' });
		expect(await getMembership(workspaceId, analyst.id, database.knex)).toBeDefined();
		expect(await auditEvents(workspaceId)).toEqual([]);
	});

	it('removes a member once confirmed and records whom, once', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const analyst = await newUser();
		await addMember(workspaceId, analyst.id, 'analyst', database.knex);
		const outcome = (await actions.remove(actionEvent(owner, workspaceId, 'remove', { userId: analyst.id, confirmed: 'yes' }))) as Outcome;
		expect(isActionFailure(outcome)).toBe(false);
		expect(await getMembership(workspaceId, analyst.id, database.knex)).toBeUndefined();
		expect(await auditEvents(workspaceId)).toEqual([{ event: 'member-removed' }]);
		const [{ detail }] = await database.knex('audit_events').select('detail').where({ workspace_id: workspaceId });
		expect(detail).toMatchObject({ memberId: analyst.id, memberName: analyst.name, memberEmail: analyst.email });

		const again = (await actions.remove(actionEvent(owner, workspaceId, 'remove', { userId: analyst.id, confirmed: 'yes' }))) as Outcome;
		expect(again.status).toBe(404);
		expect(await auditEvents(workspaceId)).toEqual([{ event: 'member-removed' }]);
	});
});

describe('members action changeRole', () => {
	it('answers 404 in words for someone who is not a member, and writes no audit event', async () => {
		const { owner, workspaceId } = await newWorkspace();
		const stranger = await newUser();
		const outcome = (await actions.changeRole(actionEvent(owner, workspaceId, 'changeRole', { userId: stranger.id, role: 'viewer' }))) as Outcome;
		expect(isActionFailure(outcome)).toBe(true);
		expect(outcome.status).toBe(404);
		expect(outcome.data?.message).toMatch(/not a member/);
		expect(await getMembership(workspaceId, stranger.id, database.knex)).toBeUndefined();
		expect(await auditEvents(workspaceId)).toEqual([]);
	});
});
