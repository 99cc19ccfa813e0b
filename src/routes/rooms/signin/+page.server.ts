import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { readForm, safeNextPath } from '$lib/server/forms';
import { cookiesAreSecure } from '$lib/server/settings';
import { setGuestCookie } from '$lib/server/rooms/guest-sessions';
import { requestSignInLink, signInGuest } from '$lib/server/rooms/guest-sign-in';
import type { Actions, PageServerLoad } from './$types';

const email = z.email({ message: 'Enter the e-mail address the invitation was sent to.' });

/** A room guest's next page: only a path under /rooms (never a workspace page). */
function nextRoomsPath(next: string | null | undefined, origin: string): string {
	const path = safeNextPath(next, origin, '/rooms');
	return path === '/rooms' || path.startsWith('/rooms/') ? path : '/rooms';
}

export const load: PageServerLoad = async ({ locals, url }) => {
	const next = nextRoomsPath(url.searchParams.get('next'), url.origin);
	if (locals.principal?.kind === 'guest') redirect(303, next);
	return { next };
};

export const actions: Actions = {
	password: async (event) => {
		const fields = await readForm(event.request);
		const next = nextRoomsPath(fields.next, event.url.origin);
		const parsed = email.safeParse(fields.email ?? '');
		if (!parsed.success) return fail(400, { email: fields.email ?? '', next, message: parsed.error.issues[0].message, linkNote: null });
		const entry = await signInGuest({ email: parsed.data, password: fields.password ?? '', ip: event.getClientAddress() });
		if (!entry.ok) return fail(400, { email: parsed.data, next, message: entry.message, linkNote: null });
		setGuestCookie(event.cookies, entry.token, entry.expiresAt, cookiesAreSecure(event.url));
		redirect(303, next !== '/rooms' ? next : entry.roomId ? `/rooms/${entry.roomId}` : '/rooms');
	},
	link: async (event) => {
		const fields = await readForm(event.request);
		const parsed = email.safeParse(fields.email ?? '');
		if (!parsed.success) return fail(400, { email: fields.email ?? '', next: '/rooms', message: parsed.error.issues[0].message, linkNote: null });
		const { message } = await requestSignInLink({ email: parsed.data, origin: event.url.origin });
		return { email: parsed.data, next: '/rooms', message: null, linkNote: message };
	}
};
