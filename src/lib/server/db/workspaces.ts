import type { Knex } from 'knex';
import { randomBytes } from 'node:crypto';
import { db } from './knex';
import { forgetCachedSessions } from '../auth/session-cache';

export interface WorkspaceRow {
	id: string;
	name: string;
	slug: string;
	created_at: Date;
	updated_at: Date;
}

const workspaceColumns = ['id', 'name', 'slug', 'created_at', 'updated_at'] as const;

export async function getWorkspaceBySlug(slug: string, knex: Knex = db()): Promise<WorkspaceRow | undefined> {
	return knex('workspaces').select(workspaceColumns).where({ slug }).first();
}

export async function getWorkspaceById(id: string, knex: Knex = db()): Promise<WorkspaceRow | undefined> {
	return knex('workspaces').select(workspaceColumns).where({ id }).first();
}

function slugFor(name: string): string {
	const base = name
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-|-$/g, '')
		.slice(0, 40);
	return `${base || 'workspace'}-${randomBytes(3).toString('hex')}`;
}

/** A new workspace with its first owner, in one transaction. */
export async function createWorkspaceWithOwner(name: string, ownerUserId: string, knex: Knex = db()): Promise<WorkspaceRow> {
	const created = await knex.transaction(async (trx) => {
		const [workspace] = await trx('workspaces').insert({ name: name.trim(), slug: slugFor(name) }).returning(workspaceColumns);
		await trx('memberships').insert({ workspace_id: workspace.id, user_id: ownerUserId, role: 'owner' });
		return workspace;
	});
	forgetCachedSessions();
	return created;
}
