import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize } from '$lib/server/auth/access';
import { createProject, listProjectsPage } from '$lib/server/db/projects';
import { createProjectBody } from '$lib/schemas/workbench';
import { withRoomForProject } from '$lib/server/billing/gates';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { nextCursor, readPageRequest } from '$lib/server/workbench/paging';
import { projectJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

const projectKey = z.tuple([z.string(), z.uuid()]);

/** The workspace's projects by name, a page at a time (`?limit=`, `?cursor=`); `?archived=1` lists the archived ones instead. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	const archived = event.url.searchParams.get('archived') === '1';
	const page = await listProjectsPage(membership.workspaceId, { archived, ...readPageRequest(event.url, 'projects', projectKey) });
	return json({
		workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role },
		projects: page.items.map(projectJson),
		nextCursor: nextCursor('projects', page.nextKey)
	});
});

export const POST: RequestHandler = apiRoute(async (event) => {
	const { membership } = await authorize(event, event.params, 'analyst');
	const body = validateBody(createProjectBody, await readJsonBody(event.request));
	const project = await withRoomForProject(membership.workspaceId, (trx) => createProject({ workspaceId: membership.workspaceId, ...body }, trx));
	return json({ project: projectJson(project) }, { status: 201 });
});
