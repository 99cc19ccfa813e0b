/**
 * Invented members and workspaces for integration tests, written straight to
 * a test database (no sign-up, no mail). Each call makes new ones, so tests
 * in one file never share a person by accident.
 */
import type { Knex } from 'knex';
import { randomBytes } from 'node:crypto';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { createUser } from '../../src/lib/server/db/users';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';

function tag(): string {
	return randomBytes(4).toString('hex');
}

/** A confirmed member with no workspace yet. */
export async function newPerson(knex: Knex, label = 'member'): Promise<SessionUser> {
	const id = tag();
	const row = await createUser({ email: `${label}-${id}@test.example`, name: `${label[0].toUpperCase()}${label.slice(1)} ${id}`, passwordHash: 'unused' }, knex);
	return { id: row.id, email: row.email, name: row.name, emailVerified: true };
}

/** A workspace for `owner` (a new person when none is given). */
export async function newWorkspaceOf(knex: Knex, owner?: SessionUser): Promise<{ owner: SessionUser; workspaceId: string }> {
	const person = owner ?? (await newPerson(knex, 'owner'));
	const workspace = await createWorkspaceWithOwner(`Sound Partners ${tag()}`, person.id, knex);
	return { owner: person, workspaceId: workspace.id };
}
