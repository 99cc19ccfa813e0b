import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { projectJson } from '$lib/server/workbench/serialize';
import { actorOf } from '$lib/server/workbench/audit-trail';
import { restoreProjectAs } from '$lib/server/workbench/project-lifecycle';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'owner');
	// A live project is restored as it is; bringing an archived one back takes a place under the plan's limit.
	const restored = await restoreProjectAs(actorOf(event, access), access.project);
	return json({ project: projectJson(restored) });
});
