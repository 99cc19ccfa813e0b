import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/access';
import { listWorkspacesForUser } from '$lib/server/db/memberships';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const workspaces = await listWorkspacesForUser(user.id);
	return json({ workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role })) });
};
