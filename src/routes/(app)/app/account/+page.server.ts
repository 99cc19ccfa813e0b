import { fail, redirect } from '@sveltejs/kit';
import { changePasswordForm, renameForm } from '$lib/schemas/account';
import { requireBrowserSession } from '$lib/server/auth/access';
import { createApiToken, newTokenForm, revokeApiToken, tokenLifetimesDays } from '$lib/server/auth/api-tokens';
import { listTokensOfUser } from '$lib/server/db/api-tokens';
import { listWorkspacesForUser } from '$lib/server/db/memberships';
import { changePassword, resendVerification } from '$lib/server/auth/accounts';
import { deleteSessionCookie, invalidateSession, invalidateUserSessions, listUserSessions } from '$lib/server/auth/session';
import { cookiesAreSecure } from '$lib/server/settings';
import { recordAuditEvent } from '$lib/server/db/audit';
import { updateUserName } from '$lib/server/db/users';
import { fieldErrors, readForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { user } = requireBrowserSession(event);
	const [sessions, tokens, workspaces] = await Promise.all([listUserSessions(user.id), listTokensOfUser(user.id), listWorkspacesForUser(user.id)]);
	const now = Date.now();
	return {
		workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role })),
		tokenLifetimesDays: [...tokenLifetimesDays],
		tokens: tokens.map((t) => ({
			id: t.id,
			name: t.name,
			hint: t.hint,
			access: t.access,
			workspaceName: t.workspaceName,
			createdAt: t.createdAt.toISOString(),
			expiresAt: t.expiresAt.toISOString(),
			lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
			lastUsedIp: t.lastUsedIp,
			state: t.revokedAt ? ('revoked' as const) : t.expiresAt.getTime() <= now ? ('expired' as const) : ('live' as const)
		})),
		account: { name: user.name, email: user.email, emailVerified: user.emailVerified },
		sessions: sessions.map((s) => ({
			// The session id is a hash; show only its first characters as a handle.
			handle: s.id.slice(0, 10),
			current: s.id === event.locals.session?.id,
			userAgent: s.user_agent as string,
			ip: s.ip as string,
			lastSeenAt: new Date(s.last_seen_at).toISOString(),
			createdAt: new Date(s.created_at).toISOString()
		}))
	};
};

export const actions: Actions = {
	rename: async (event) => {
		const { user } = requireBrowserSession(event);
		const fields = await readForm(event.request);
		const parsed = renameForm.safeParse(fields);
		if (!parsed.success) return fail(400, { action: 'rename', errors: fieldErrors(parsed.error), message: null });
		await updateUserName(user.id, parsed.data.name);
		return { action: 'rename', errors: {} as Record<string, string>, message: 'Name saved.' };
	},

	password: async (event) => {
		const { user } = requireBrowserSession(event);
		const parsed = changePasswordForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'password', errors: fieldErrors(parsed.error), message: null });
		const outcome = await changePassword(user.id, user.email, event.locals.session!.id, parsed.data, event.getClientAddress());
		if (!outcome.ok) return fail(400, { action: 'password', errors: outcome.errors as Record<string, string>, message: null });
		return { action: 'password', errors: {} as Record<string, string>, message: 'Password changed. Your other devices are signed out.' };
	},

	endSession: async (event) => {
		const { user } = requireBrowserSession(event);
		const handle = (await readForm(event.request)).handle ?? '';
		const sessions = await listUserSessions(user.id);
		const target = sessions.find((s) => s.id.startsWith(handle) && handle.length === 10);
		if (!target) return fail(404, { action: 'endSession', errors: {} as Record<string, string>, message: 'That session has already ended.' });
		await invalidateSession(target.id);
		if (target.id === event.locals.session?.id) {
			deleteSessionCookie(event.cookies, cookiesAreSecure(event.url));
			redirect(303, '/signin?notice=signed-out');
		}
		return { action: 'endSession', errors: {} as Record<string, string>, message: 'Session ended.' };
	},

	signOutEverywhere: async (event) => {
		const { user } = requireBrowserSession(event);
		await invalidateUserSessions(user.id);
		await recordAuditEvent({ event: 'sign-out-everywhere', actorUserId: user.id, actorEmail: user.email, ip: event.getClientAddress() });
		deleteSessionCookie(event.cookies, cookiesAreSecure(event.url));
		redirect(303, '/signin?notice=signed-out-everywhere');
	},

	createToken: async (event) => {
		const { user } = requireBrowserSession(event);
		const fields = await readForm(event.request);
		const parsed = newTokenForm.safeParse(fields);
		const echo = { name: fields.name ?? '', workspaceId: fields.workspaceId ?? '', access: fields.access ?? 'read', lifetimeDays: fields.lifetimeDays ?? '90' };
		if (!parsed.success) return fail(400, { action: 'createToken', errors: fieldErrors(parsed.error), message: null, echo });
		const outcome = await createApiToken(user.id, parsed.data);
		if (!outcome.ok) return fail(400, { action: 'createToken', errors: { [outcome.field]: outcome.message } as Record<string, string>, message: null, echo });
		await recordAuditEvent({
			event: 'api-token-created',
			workspaceId: parsed.data.workspaceId,
			actorUserId: user.id,
			actorEmail: user.email,
			ip: event.getClientAddress(),
			detail: { token: parsed.data.name, access: parsed.data.access, expiresAt: outcome.expiresAt.toISOString(), tokenId: outcome.id }
		});
		// The token itself is in this one answer only; the database keeps its hash.
		return { action: 'createToken', errors: {} as Record<string, string>, message: 'Token created.', newToken: { name: parsed.data.name, value: outcome.token } };
	},

	revokeToken: async (event) => {
		const { user } = requireBrowserSession(event);
		const tokenId = (await readForm(event.request)).tokenId ?? '';
		const revoked = await revokeApiToken(user.id, tokenId);
		if (!revoked) return fail(404, { action: 'revokeToken', errors: {} as Record<string, string>, message: 'That token is already revoked, or is not yours.' });
		await recordAuditEvent({
			event: 'api-token-revoked',
			workspaceId: revoked.workspaceId,
			actorUserId: user.id,
			actorEmail: user.email,
			ip: event.getClientAddress(),
			detail: { token: revoked.name, tokenId }
		});
		return { action: 'revokeToken', errors: {} as Record<string, string>, message: `Token "${revoked.name}" revoked: scripts using it now get 401.` };
	},

	resendVerification: async (event) => {
		const { user } = requireBrowserSession(event);
		const outcome = await resendVerification(user.id, event.url.origin);
		if (!outcome.ok) return fail(429, { action: 'resendVerification', errors: {} as Record<string, string>, message: outcome.message, refused: true });
		return { action: 'resendVerification', errors: {} as Record<string, string>, message: `A new link is on its way to ${user.email}.` };
	}
};
