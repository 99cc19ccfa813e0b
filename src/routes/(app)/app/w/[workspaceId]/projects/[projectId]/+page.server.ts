import { roleAtLeast } from '$lib/server/auth/roles';
import { authorize } from '$lib/server/auth/access';
import { listLiveScenariosWithStoredMetrics } from '$lib/server/db/scenarios';
import { listUploadsInProject } from '$lib/server/db/uploads';
import { projectJson, scenarioSummaryJson, uploadSummaryJson } from '$lib/server/workbench/serialize';
import { keyFiguresOf } from '$lib/server/workbench/stored-results';
import { ENGINE_VERSION } from '$lib/server/engine/version';
import { isArchivedProject } from '$lib/server/workbench/live-project';
import { asJson, type ProjectJson, type ScenarioSummaryJson, type UploadSummaryJson } from '$lib/workbench/api-types';
import type { PageServerLoad } from './$types';

/**
 * The project, its live scenarios with their stored key figures, and its
 * uploads; changes go through the API and the page refetches from it. An
 * archived project is shown read only, with a restore button for owners.
 */
export const load: PageServerLoad = async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	// The scenarios with their stored key figures in one query, the uploads beside it.
	const [scenarios, uploads] = await Promise.all([listLiveScenariosWithStoredMetrics(project.id, ENGINE_VERSION), listUploadsInProject(project.id)]);
	return {
		project: asJson<ProjectJson>(projectJson(project)),
		scenarios: asJson<ScenarioSummaryJson[]>(scenarios.map((s) => ({ ...scenarioSummaryJson(s), keyFigures: keyFiguresOf(s.stored) }))),
		uploads: asJson<UploadSummaryJson[]>(uploads.map(uploadSummaryJson)),
		role: membership.role,
		canEdit: roleAtLeast(membership.role, 'analyst') && !isArchivedProject(project),
		canRestore: isArchivedProject(project) && roleAtLeast(membership.role, 'owner')
	};
};
