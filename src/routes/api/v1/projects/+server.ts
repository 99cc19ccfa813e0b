import { json } from '@sveltejs/kit';
import { listProjectsInWorkspace } from '$lib/server/db/projects';
import { getWorkspaceBySlug } from '$lib/server/db/workspaces';
import { apiError } from '$lib/server/api';
import { demoWorkspace } from '../../../../../seeds/01_demo_workspace';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async () => {
	const workspace = await getWorkspaceBySlug(demoWorkspace.slug);
	if (!workspace) return apiError(404, 'The demo workspace does not exist.');
	const projects = await listProjectsInWorkspace(workspace.id);
	return json({
		workspace: { id: workspace.id, name: workspace.name },
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
