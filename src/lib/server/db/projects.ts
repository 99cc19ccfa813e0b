import type { Knex } from 'knex';
import { db } from './knex';

export const projectColumns = [
	'id',
	'workspace_id',
	'name',
	'technology',
	'site_name',
	'site_description',
	'currency',
	'created_at',
	'updated_at',
	'archived_at'
] as const;

export interface ProjectRow {
	id: string;
	workspace_id: string;
	name: string;
	technology: 'tidal-stream' | 'ocean-current' | 'wave';
	site_name: string;
	site_description: string;
	currency: string;
	created_at: Date;
	updated_at: Date;
	archived_at: Date | null;
}

export async function listProjectsInWorkspace(workspaceId: string, knex: Knex = db()): Promise<ProjectRow[]> {
	return knex('projects')
		.select(projectColumns)
		.where({ workspace_id: workspaceId })
		.whereNull('archived_at')
		.orderBy('name');
}
