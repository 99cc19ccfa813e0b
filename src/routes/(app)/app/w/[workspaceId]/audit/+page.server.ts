import { authorize } from '$lib/server/auth/access';
import { auditEventGroups, listAuditEventsPage } from '$lib/server/db/audit';
import { listMembers } from '$lib/server/db/memberships';
import { nextAuditPageSearch, readAuditLogQuery } from '$lib/server/audit/log-filter';
import type { PageServerLoad } from './$types';

const AUDIT_PAGE_SIZE = 50;

/**
 * The workspace's audit log, newest first, a page at a time: who did what to
 * whom. Filtered in the address by kind of event, member and days
 * (src/lib/server/audit/log-filter.ts).
 */
export const load: PageServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'owner');
	const members = await listMembers(membership.workspaceId);
	const query = readAuditLogQuery(event.url.searchParams, new Set(members.map((m) => m.userId)));
	const page = await listAuditEventsPage(membership.workspaceId, query.filter, { limit: AUDIT_PAGE_SIZE, after: query.after });
	// Lines written before the log kept the names of the members acted on name them as they are now.
	const memberNames = new Map(members.map((m) => [m.userId, { memberName: m.name, memberEmail: m.email }]));
	return {
		fields: query.fields,
		errors: query.errors,
		filtered: Object.keys(query.filter).length > 0,
		continued: query.after !== null,
		groups: Object.keys(auditEventGroups),
		people: members.map((m) => ({ id: m.userId, name: m.name, email: m.email })),
		events: page.items.map((e) => ({
			id: e.id,
			event: e.event,
			actor: { name: e.actorName, email: e.actorEmail },
			ip: e.ip,
			detail: typeof e.detail.memberId === 'string' && !e.detail.memberName ? { ...memberNames.get(e.detail.memberId), ...e.detail } : e.detail,
			at: e.at.toISOString()
		})),
		nextPage: page.nextKey ? nextAuditPageSearch(query.fields, page.nextKey) : null
	};
};
