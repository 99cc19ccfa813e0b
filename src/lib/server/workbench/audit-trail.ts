/**
 * One line in the workspace's audit log for work done in it: who (the member,
 * and the token when a script did it), from where, and what was acted on by
 * name (`detail`), so the log still reads after a rename or a deletion.
 */
import type { RequestEvent } from '@sveltejs/kit';
import type { WorkspaceAccess } from '../auth/access';
import { recordAuditEvent, type AuditEventName } from '../db/audit';

export interface Actor {
	access: Pick<WorkspaceAccess, 'principal' | 'user' | 'membership'>;
	ip: string;
}

export function actorOf<A extends Actor['access']>(event: Pick<RequestEvent, 'getClientAddress'>, access: A): Actor & { access: A } {
	return { access, ip: event.getClientAddress() };
}

/** The project and scenario an event concerns, as `detail` names them. */
export function scenarioDetail(project: { id: string; name: string }, scenario: { id: string; name: string }): Record<string, string> {
	return { project: project.name, projectId: project.id, scenario: scenario.name, scenarioId: scenario.id };
}

export async function recordWorkspaceEvent(actor: Actor, event: AuditEventName, detail: Record<string, unknown>): Promise<void> {
	const { principal, user, membership } = actor.access;
	await recordAuditEvent({
		event,
		workspaceId: membership.workspaceId,
		actorUserId: user.id,
		actorEmail: user.email,
		ip: actor.ip,
		detail: principal.kind === 'token' ? { ...detail, token: principal.token.name } : detail
	});
}
