import { json } from '@sveltejs/kit';
import { visibleWorkspaces } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import type { RequestHandler } from './$types';

/** The caller's workspaces with their role in each (a token: its own workspace only). */
export const GET: RequestHandler = apiRoute(async (event) => {
	const workspaces = await visibleWorkspaces(event);
	return json({ workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role, plan: w.plan })) });
});
