import { requireUser } from '$lib/server/auth/access';
import { listWorkspacesForUser } from '$lib/server/db/memberships';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const user = requireUser(event);
	const workspaces = await listWorkspacesForUser(user.id);
	return {
		user: { name: user.name, email: user.email, emailVerified: user.emailVerified },
		workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role }))
	};
};
