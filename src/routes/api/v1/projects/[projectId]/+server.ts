import { json } from '@sveltejs/kit';
import { updateProjectBody } from '$lib/schemas/workbench';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { projectJson } from '$lib/server/workbench/serialize';
import { actorOf } from '$lib/server/workbench/audit-trail';
import { archiveProjectAs, updateProjectAs } from '$lib/server/workbench/project-lifecycle';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';

export const GET: RequestHandler = apiRoute(async (event) => {
	const { project, membership } = await authorize(event, event.params, 'viewer');
	return json({ project: projectJson(project), role: membership.role });
});

export const PATCH: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'analyst');
	requireLiveProject(access.project);
	const changes = validateBody(updateProjectBody, await readJsonBody(event.request));
	const updated = await updateProjectAs(actorOf(event, access), access.project, changes);
	return json({ project: projectJson(updated) });
});

/** Archives the project (its scenarios and uploads are kept); POST .../restore brings it back. */
export const DELETE: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'owner');
	const archived = await archiveProjectAs(actorOf(event, access), access.project);
	return json({ project: projectJson(archived) });
});
