import { redirect } from '@sveltejs/kit';
import { deleteSessionCookie, invalidateSession } from '$lib/server/auth/session';
import { cookiesAreSecure } from '$lib/server/settings';
import { recordAuditEvent } from '$lib/server/db/audit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	redirect(303, '/signin');
};

export const actions: Actions = {
	default: async (event) => {
		const { session, user } = event.locals;
		if (session && user) {
			await invalidateSession(session.id);
			await recordAuditEvent({ event: 'sign-out', actorUserId: user.id, actorEmail: user.email, ip: event.getClientAddress() });
		}
		deleteSessionCookie(event.cookies, cookiesAreSecure(event.url));
		redirect(303, '/signin?notice=signed-out');
	}
};
