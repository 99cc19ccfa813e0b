/**
 * The one authorization helper every load, action and API route calls.
 * Not signed in: 401 (API) or a redirect to sign-in (pages). A workspace the
 * user does not belong to: 404, so its existence stays hidden. A role too low
 * for the action: 403.
 */
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { getMembership, type WorkspaceMembership } from '../db/memberships';
import { roleAtLeast, type WorkspaceRole } from './roles';
import type { SessionUser } from './session';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function isApiRequest(event: Pick<RequestEvent, 'url'>) {
	return event.url.pathname.startsWith('/api/');
}

export function requireUser(event: Pick<RequestEvent, 'locals' | 'url'>): SessionUser {
	const user = event.locals.user;
	if (user) return user;
	if (isApiRequest(event)) error(401, 'Sign in to use this.');
	const next = event.url.pathname + event.url.search;
	redirect(303, `/signin?next=${encodeURIComponent(next)}`);
}

export interface WorkspaceAccess {
	user: SessionUser;
	membership: WorkspaceMembership;
}

export async function requireWorkspaceRole(
	event: Pick<RequestEvent, 'locals' | 'url'>,
	workspaceId: string,
	minimum: WorkspaceRole
): Promise<WorkspaceAccess> {
	const user = requireUser(event);
	const membership = uuidPattern.test(workspaceId) ? await getMembership(workspaceId, user.id) : undefined;
	if (!membership) error(404, 'No such workspace, or it is not yours.');
	if (!roleAtLeast(membership.role, minimum)) {
		error(403, `This needs the ${minimum} role in ${membership.workspaceName}; you are ${articleFor(membership.role)} ${membership.role}.`);
	}
	return { user, membership };
}

function articleFor(role: WorkspaceRole) {
	return role === 'analyst' || role === 'owner' ? 'an' : 'a';
}

export function isUuid(value: string): boolean {
	return uuidPattern.test(value);
}
