import { json } from '@sveltejs/kit';
import { restoreProject } from '$lib/server/db/projects';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { projectJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiRoute(async (event) => {
	const { project } = await authorize(event, event.params, 'owner');
	const restored = await restoreProject(project.id);
	return json({ project: projectJson(restored!) });
});
