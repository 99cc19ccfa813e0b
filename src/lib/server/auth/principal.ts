/**
 * Who is asking. `hooks.server.ts` resolves one principal per request: a
 * member signed in with the session cookie, a member's personal API token
 * (on /api/v1 only), or nobody. The access module decides what each may do.
 */
import type { Session, SessionMembership, SessionUser } from './session';
import type { TokenAccess } from '../db/api-tokens';

export interface ApiTokenPrincipal {
	kind: 'token';
	user: SessionUser;
	token: { id: string; name: string; access: TokenAccess; workspaceId: string };
}

export interface MemberPrincipal {
	kind: 'member';
	user: SessionUser;
	session: Session;
	/** The member's workspaces as read with the session, for this request's reads (actions read afresh). */
	memberships?: SessionMembership[];
}

/** An investor invited into data rooms: never a workspace member, and only under /rooms. */
export interface GuestPrincipal {
	kind: 'guest';
	guest: { id: string; email: string; name: string };
	session: { id: string; expiresAt: Date };
}

export interface AnonymousPrincipal {
	kind: 'anonymous';
}

export type Principal = AnonymousPrincipal | MemberPrincipal | ApiTokenPrincipal | GuestPrincipal;

export const anonymous: AnonymousPrincipal = { kind: 'anonymous' };
