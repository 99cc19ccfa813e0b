/**
 * Access to projects, scenarios and uploads, built on the workspace role
 * check: anonymous -> 401; missing, or in a workspace the user is not a
 * member of -> 404 (existence stays hidden); role too low -> 403.
 */
import { error, isHttpError, type RequestEvent } from '@sveltejs/kit';
import { isUuid, requireUser, requireWorkspaceRole, type WorkspaceAccess } from '../auth/authorize';
import type { WorkspaceRole } from '../auth/roles';
import { getProjectById, getProjectOfScenario, getProjectOfUpload, type ProjectRow } from '../db/projects';

type AccessEvent = Pick<RequestEvent, 'locals' | 'url'>;

export interface ProjectAccess extends WorkspaceAccess {
	project: ProjectRow;
}

async function requireRoleHidingOthers(
	event: AccessEvent,
	workspaceId: string,
	minimum: WorkspaceRole,
	notFound: string
): Promise<WorkspaceAccess> {
	try {
		return await requireWorkspaceRole(event, workspaceId, minimum);
	} catch (e) {
		if (isHttpError(e, 404)) error(404, notFound);
		throw e;
	}
}

const noSuchProject = 'No such project, or it is not yours.';
const noSuchScenario = 'No such scenario, or it is not yours.';
const noSuchUpload = 'No such upload, or it is not yours.';

export async function requireProjectRole(event: AccessEvent, projectId: string, minimum: WorkspaceRole): Promise<ProjectAccess> {
	requireUser(event);
	const project = isUuid(projectId) ? await getProjectById(projectId) : undefined;
	if (!project) error(404, noSuchProject);
	const access = await requireRoleHidingOthers(event, project.workspace_id, minimum, noSuchProject);
	return { ...access, project };
}

export interface ScenarioAccess extends ProjectAccess {
	scenarioId: string;
}

export async function requireScenarioRole(event: AccessEvent, scenarioId: string, minimum: WorkspaceRole): Promise<ScenarioAccess> {
	requireUser(event);
	const project = isUuid(scenarioId) ? await getProjectOfScenario(scenarioId) : undefined;
	if (!project) error(404, noSuchScenario);
	const access = await requireRoleHidingOthers(event, project.workspace_id, minimum, noSuchScenario);
	return { ...access, project, scenarioId };
}

export interface UploadAccess extends ProjectAccess {
	uploadId: string;
}

export async function requireUploadRole(event: AccessEvent, uploadId: string, minimum: WorkspaceRole): Promise<UploadAccess> {
	requireUser(event);
	const project = isUuid(uploadId) ? await getProjectOfUpload(uploadId) : undefined;
	if (!project) error(404, noSuchUpload);
	const access = await requireRoleHidingOthers(event, project.workspace_id, minimum, noSuchUpload);
	return { ...access, project, uploadId };
}
