import { authorize } from '$lib/server/auth/access';
import { listAuditEventsForWorkspace } from '$lib/server/db/audit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'owner');
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
