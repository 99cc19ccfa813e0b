import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/access';
import { getMembership, listWorkspacesForUser } from '$lib/server/db/memberships';
import { setSessionWorkspace } from '$lib/server/auth/session';
import type { Actions, PageServerLoad } from './$types';

/** /app opens the workspace used last in this session, else the first one the user belongs to. */
export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const workspaces = await listWorkspacesForUser(user.id);
	const remembered = workspaces.find((w) => w.workspaceId === event.locals.session?.workspaceId);
	const target = remembered ?? workspaces[0];
	if (target) redirect(303, `/app/w/${target.workspaceId}${event.url.searchParams.has('welcome') ? '?welcome=1' : ''}`);
	return {};
};

export const actions: Actions = {
	switch: async (event) => {
		const user = requireUser(event);
		const workspaceId = String((await event.request.formData()).get('workspaceId') ?? '');
		const membership = await getMembership(workspaceId, user.id).catch(() => undefined);
		if (!membership) return fail(404, { message: 'No such workspace, or it is not yours.' });
		await setSessionWorkspace(event.locals.session!.id, workspaceId);
		redirect(303, `/app/w/${workspaceId}`);
	}
};
