import { authorize } from '$lib/server/auth/access';
import { isAuditEventGroup, listAuditEventsForWorkspace } from '$lib/server/db/audit';
import type { PageServerLoad } from './$types';

/** The workspace's security log, newest first; `?group=accounts|members|tokens` narrows it. */
export const load: PageServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'owner');
	const asked = event.url.searchParams.get('group') ?? '';
	const group = isAuditEventGroup(asked) ? asked : undefined;
	const events = await listAuditEventsForWorkspace(membership.workspaceId, { group });
	return {
		group: group ?? 'all',
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
