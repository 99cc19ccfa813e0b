import { json } from '@sveltejs/kit';
import { requireWorkspaceRole } from '$lib/server/auth/authorize';
import { listProjectsInWorkspace } from '$lib/server/db/projects';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const { membership } = await requireWorkspaceRole(event, event.params.workspaceId, 'viewer');
	const projects = await listProjectsInWorkspace(membership.workspaceId);
	return json({
		workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role },
		projects: projects.map((p) => ({
			id: p.id,
			name: p.name,
			technology: p.technology,
			siteName: p.site_name,
			siteDescription: p.site_description,
			currency: p.currency
		}))
	});
};
