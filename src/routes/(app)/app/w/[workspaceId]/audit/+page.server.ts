import { requireWorkspaceRole } from '$lib/server/auth/authorize';
import { listAuditEventsForWorkspace } from '$lib/server/db/audit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { membership } = await requireWorkspaceRole(event, event.params.workspaceId, 'owner');
	const events = await listAuditEventsForWorkspace(membership.workspaceId);
	return {
		events: events.map((e) => ({
			id: String(e.id),
			event: e.event as string,
			actorEmail: e.actor_email as string,
			ip: e.ip as string,
			detail: e.detail as Record<string, unknown>,
			at: new Date(e.created_at).toISOString()
		}))
	};
};
