/**
 * An archived project is read-only until an owner restores it: every write
 * to the project, its scenarios or its uploads asks this one check right
 * after `authorize`, before it reads a body or writes anything.
 */
import type { ProjectRow } from '../db/projects';
import { ApiProblem } from './api-route';

export const ARCHIVED_PROJECT_MESSAGE = 'This project is archived: restore it first.';

export function isArchivedProject(project: Pick<ProjectRow, 'archived_at'>): boolean {
	return project.archived_at !== null;
}

/** Refuses (409, nothing written) any change to an archived project or to what it holds. */
export function requireLiveProject(project: Pick<ProjectRow, 'archived_at'>): void {
	if (isArchivedProject(project)) {
		throw new ApiProblem(409, ARCHIVED_PROJECT_MESSAGE, [], { archivedAt: project.archived_at!.toISOString() });
	}
}
