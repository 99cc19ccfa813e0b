import { authorize } from '$lib/server/auth/access';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	return { workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role } };
};
