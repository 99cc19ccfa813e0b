/**
 * Access for the analysis pages, whose URLs name the workspace, the project
 * and (for sensitivity) the scenario: each must sit inside the one before,
 * or the page answers 404 as if it did not exist.
 */
import { error } from '@sveltejs/kit';
import { requireProjectRole, requireScenarioRole, type ProjectAccess, type ScenarioAccess } from '../workbench/access';
import type { WorkspaceRole } from '../auth/roles';
import type { RequestEvent } from '@sveltejs/kit';

type PageEvent = Pick<RequestEvent, 'locals' | 'url'>;

export async function requireProjectPage(
	event: PageEvent,
	place: { workspaceId: string; projectId: string },
	minimum: WorkspaceRole
): Promise<ProjectAccess> {
	const access = await requireProjectRole(event, place.projectId, minimum);
	if (access.project.workspace_id !== place.workspaceId) error(404, 'No such project, or it is not yours.');
	return access;
}

export async function requireScenarioPage(
	event: PageEvent,
	place: { workspaceId: string; projectId: string; scenarioId: string },
	minimum: WorkspaceRole
): Promise<ScenarioAccess> {
	const access = await requireScenarioRole(event, place.scenarioId, minimum);
	if (access.project.id !== place.projectId || access.project.workspace_id !== place.workspaceId) {
		error(404, 'No such scenario, or it is not yours.');
	}
	return access;
}
