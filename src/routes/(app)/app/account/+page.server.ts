import { fail, redirect } from '@sveltejs/kit';
import { changePasswordForm, renameForm } from '$lib/schemas/account';
import { requireUser } from '$lib/server/auth/access';
import { changePassword, resendVerification } from '$lib/server/auth/accounts';
import { deleteSessionCookie, invalidateSession, invalidateUserSessions, listUserSessions } from '$lib/server/auth/session';
import { cookiesAreSecure } from '$lib/server/settings';
import { recordAuditEvent } from '$lib/server/db/audit';
import { updateUserName } from '$lib/server/db/users';
import { fieldErrors, readForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const sessions = await listUserSessions(user.id);
	return {
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
		const user = requireUser(event);
		const fields = await readForm(event.request);
		const parsed = renameForm.safeParse(fields);
		if (!parsed.success) return fail(400, { action: 'rename', errors: fieldErrors(parsed.error), message: null });
		await updateUserName(user.id, parsed.data.name);
		return { action: 'rename', errors: {} as Record<string, string>, message: 'Name saved.' };
	},

	password: async (event) => {
		const user = requireUser(event);
		const parsed = changePasswordForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'password', errors: fieldErrors(parsed.error), message: null });
		const outcome = await changePassword(user.id, user.email, event.locals.session!.id, parsed.data, event.getClientAddress());
		if (!outcome.ok) return fail(400, { action: 'password', errors: outcome.errors as Record<string, string>, message: null });
		return { action: 'password', errors: {} as Record<string, string>, message: 'Password changed. Your other devices are signed out.' };
	},

	endSession: async (event) => {
		const user = requireUser(event);
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
		const user = requireUser(event);
		await invalidateUserSessions(user.id);
		await recordAuditEvent({ event: 'sign-out-everywhere', actorUserId: user.id, actorEmail: user.email, ip: event.getClientAddress() });
		deleteSessionCookie(event.cookies, cookiesAreSecure(event.url));
		redirect(303, '/signin?notice=signed-out-everywhere');
	},

	resendVerification: async (event) => {
		const user = requireUser(event);
		await resendVerification(user.id, event.url.origin);
		return { action: 'resendVerification', errors: {} as Record<string, string>, message: `A new link is on its way to ${user.email}.` };
	}
};
