import { json } from '@sveltejs/kit';
import { restoreProject } from '$lib/server/db/projects';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { withRoomForProject } from '$lib/server/billing/gates';
import { projectJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiRoute(async (event) => {
	const { project } = await authorize(event, event.params, 'owner');
	// A live project is restored as it is; bringing an archived one back takes a place under the plan's limit.
	const restored = project.archived_at === null ? project : await withRoomForProject(project.workspace_id, (trx) => restoreProject(project.id, trx));
	return json({ project: projectJson(restored!) });
});
