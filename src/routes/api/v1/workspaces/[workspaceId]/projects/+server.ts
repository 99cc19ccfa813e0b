import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { createProject, listArchivedProjectsInWorkspace, listProjectsInWorkspace } from '$lib/server/db/projects';
import { createProjectBody } from '$lib/schemas/workbench';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { projectJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

/** The workspace's projects; `?archived=1` lists the archived ones instead. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	const archived = event.url.searchParams.get('archived') === '1';
	const rows = archived ? await listArchivedProjectsInWorkspace(membership.workspaceId) : await listProjectsInWorkspace(membership.workspaceId);
	return json({ workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role }, projects: rows.map(projectJson) });
});

export const POST: RequestHandler = apiRoute(async (event) => {
	const { membership } = await authorize(event, event.params, 'analyst');
	const body = validateBody(createProjectBody, await readJsonBody(event.request));
	const project = await createProject({ workspaceId: membership.workspaceId, ...body });
	return json({ project: projectJson(project) }, { status: 201 });
});
