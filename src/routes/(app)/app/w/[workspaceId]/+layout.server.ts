import { requireWorkspaceRole } from '$lib/server/auth/authorize';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const { membership } = await requireWorkspaceRole(event, event.params.workspaceId, 'viewer');
	return { workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role } };
};
