import { requireWorkspaceRole } from '$lib/server/auth/authorize';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireWorkspaceRole(event, event.params.workspaceId, 'viewer');
	return { welcome: event.url.searchParams.has('welcome') };
};
