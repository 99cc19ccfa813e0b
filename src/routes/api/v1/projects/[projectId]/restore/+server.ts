import { json } from '@sveltejs/kit';
import { restoreProject } from '$lib/server/db/projects';
import { requireProjectRole } from '$lib/server/workbench/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { projectJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiRoute(async (event) => {
	const { project } = await requireProjectRole(event, event.params.projectId, 'owner');
	const restored = await restoreProject(project.id);
	return json({ project: projectJson(restored!) });
});
