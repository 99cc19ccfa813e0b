import type { Knex } from 'knex';
import { db } from './knex';
import { keysetPage, type KeysetPage, type KeysetRequest } from './keyset';
import { roomColumns, type RoomRow } from './rooms';

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

/** Projects are listed by name, then id (so two of the same name keep one order). */
const projectOrder = [{ column: 'name' }, { column: 'id' }];

export async function listProjectsInWorkspace(workspaceId: string, knex: Knex = db()): Promise<ProjectRow[]> {
	return knex('projects')
		.select(projectColumns)
		.where({ workspace_id: workspaceId })
		.whereNull('archived_at')
		.orderBy(projectOrder);
}

export async function listArchivedProjectsInWorkspace(workspaceId: string, knex: Knex = db()): Promise<ProjectRow[]> {
	return knex('projects')
		.select(projectColumns)
		.where({ workspace_id: workspaceId })
		.whereNotNull('archived_at')
		.orderBy(projectOrder);
}

/** Where a project sits in the list: its name and id. */
export type ProjectListKey = [name: string, id: string];

/** One page of the workspace's live (or archived) projects, in list order, after `after`. */
export async function listProjectsPage(
	workspaceId: string,
	request: KeysetRequest<ProjectListKey> & { archived?: boolean },
	knex: Knex = db()
): Promise<KeysetPage<ProjectRow, ProjectListKey>> {
	const query = knex('projects').select(projectColumns).where({ workspace_id: workspaceId });
	if (request.archived) query.whereNotNull('archived_at');
	else query.whereNull('archived_at');
	if (request.after) query.whereRaw('(name, id) > (?, ?::uuid)', request.after);
	const rows: ProjectRow[] = await query.orderBy(projectOrder).limit(request.limit + 1);
	return keysetPage(rows, request.limit, (row): ProjectListKey => [row.name, row.id]);
}

/** Any project, archived or not; callers check the workspace membership. */
export async function getProjectById(id: string, knex: Knex = db()): Promise<ProjectRow | undefined> {
	return knex('projects').select(projectColumns).where({ id }).first();
}

/** The project a scenario belongs to, in one query (for access checks on scenario routes). */
export async function getProjectOfScenario(scenarioId: string, knex: Knex = db()): Promise<ProjectRow | undefined> {
	return knex('projects')
		.join('scenarios', 'scenarios.project_id', 'projects.id')
		.select(projectColumns.map((c) => `projects.${c}`))
		.where('scenarios.id', scenarioId)
		.first();
}

/** A data room and the project it belongs to, in one query (the door reads both; routes then need no second read). */
export async function getRoomAndProject(roomId: string, knex: Knex = db()): Promise<{ room: RoomRow; project: ProjectRow } | undefined> {
	const row = await knex('data_rooms')
		.join('projects', 'projects.id', 'data_rooms.project_id')
		.select(projectColumns.map((c) => `projects.${c}`))
		.select(roomColumns.map((c) => `data_rooms.${c} as room_${c}`))
		.where('data_rooms.id', roomId)
		.first();
	if (!row) return undefined;
	const room = Object.fromEntries(roomColumns.map((c) => [c, row[`room_${c}`]])) as unknown as RoomRow;
	const project = Object.fromEntries(projectColumns.map((c) => [c, row[c]])) as unknown as ProjectRow;
	return { room, project };
}

/** The project an upload belongs to, in one query. */
export async function getProjectOfUpload(uploadId: string, knex: Knex = db()): Promise<ProjectRow | undefined> {
	return knex('projects')
		.join('uploads', 'uploads.project_id', 'projects.id')
		.select(projectColumns.map((c) => `projects.${c}`))
		.where('uploads.id', uploadId)
		.first();
}

export interface NewProject {
	workspaceId: string;
	name: string;
	technology: ProjectRow['technology'];
	siteName?: string;
	siteDescription?: string;
	currency?: string;
}

export async function createProject(input: NewProject, knex: Knex = db()): Promise<ProjectRow> {
	const [row] = await knex('projects')
		.insert({
			workspace_id: input.workspaceId,
			name: input.name,
			technology: input.technology,
			site_name: input.siteName ?? '',
			site_description: input.siteDescription ?? '',
			currency: input.currency ?? 'EUR'
		})
		.returning(projectColumns);
	return row;
}

export interface ProjectChanges {
	name?: string;
	siteName?: string;
	siteDescription?: string;
	currency?: string;
}

/** Changes a project's descriptive fields; the technology stays what it was created with. */
export async function updateProject(id: string, changes: ProjectChanges, knex: Knex = db()): Promise<ProjectRow | undefined> {
	const update: Record<string, unknown> = { updated_at: knex.fn.now() };
	if (changes.name !== undefined) update.name = changes.name;
	if (changes.siteName !== undefined) update.site_name = changes.siteName;
	if (changes.siteDescription !== undefined) update.site_description = changes.siteDescription;
	if (changes.currency !== undefined) update.currency = changes.currency;
	const [row] = await knex('projects').where({ id }).update(update).returning(projectColumns);
	return row;
}

/** Archives a project (its scenarios and uploads stay, hidden with it). Archiving twice keeps the first date. */
export async function archiveProject(id: string, knex: Knex = db()): Promise<ProjectRow | undefined> {
	await knex('projects').where({ id }).whereNull('archived_at').update({ archived_at: knex.fn.now(), updated_at: knex.fn.now() });
	return getProjectById(id, knex);
}

export async function restoreProject(id: string, knex: Knex = db()): Promise<ProjectRow | undefined> {
	const [row] = await knex('projects')
		.where({ id })
		.update({ archived_at: null, updated_at: knex.fn.now() })
		.returning(projectColumns);
	return row;
}
