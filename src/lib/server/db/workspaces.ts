import type { Knex } from 'knex';
import { db } from './knex';

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
