import { requireUser, visibleWorkspaces } from '$lib/server/auth/access';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const user = requireUser(event);
	const workspaces = await visibleWorkspaces(event);
	return {
		user: { name: user.name, email: user.email, emailVerified: user.emailVerified },
		workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role }))
	};
};
