import { fail, redirect } from '@sveltejs/kit';
import { readForm } from '$lib/server/forms';
import { cookiesAreSecure } from '$lib/server/settings';
import { setGuestCookie } from '$lib/server/rooms/guest-sessions';
import { enterByLink, viewGuestLink } from '$lib/server/rooms/guest-sign-in';
import type { Actions, PageServerLoad } from './$types';

/** Opening the link only shows the page; the POST spends it (mail scanners that follow links spend nothing). */
export const load: PageServerLoad = async ({ params }) => {
	const view = await viewGuestLink(params.token);
	return {
		status: view.status,
		purpose: view.purpose,
		email: view.guest?.email ?? null,
		name: view.guest?.name ?? '',
		needsPassword: view.guest !== null && !view.guest.hasPassword
	};
};

export const actions: Actions = {
	default: async (event) => {
		const fields = await readForm(event.request);
		const entry = await enterByLink(event.params.token, { password: fields.password, name: fields.name });
		if (!entry.ok) return fail(400, { message: entry.message });
		setGuestCookie(event.cookies, entry.token, entry.expiresAt, cookiesAreSecure(event.url));
		redirect(303, entry.roomId ? `/rooms/${entry.roomId}` : '/rooms');
	}
};
