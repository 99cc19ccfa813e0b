import { redirect } from '@sveltejs/kit';
import { cookiesAreSecure } from '$lib/server/settings';
import { deleteGuestCookie, endGuestSession } from '$lib/server/rooms/guest-sessions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => redirect(303, '/rooms/signin');

export const actions: Actions = {
	default: async ({ locals, cookies, url }) => {
		if (locals.principal?.kind === 'guest') await endGuestSession(locals.principal.session.id);
		deleteGuestCookie(cookies, cookiesAreSecure(url));
		redirect(303, '/rooms/signin');
	}
};
