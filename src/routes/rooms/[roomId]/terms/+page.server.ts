import { redirect } from '@sveltejs/kit';
import { guestRoom } from '$lib/server/rooms/guest-access';
import { hasAcceptedTerms, recordTermsAcceptance } from '$lib/server/db/rooms';
import { readForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

function nextIn(roomId: string, next: string | null | undefined): string {
	return next && next.startsWith(`/rooms/${roomId}`) && !next.includes('//') ? next : `/rooms/${roomId}`;
}

export const load: PageServerLoad = async (event) => {
	const { guest, room } = await guestRoom(event, event.params.roomId, { termsPage: true });
	return {
		room: { id: room.id, name: room.name, terms: room.terms, termsVersion: room.terms_version },
		accepted: await hasAcceptedTerms(room.id, guest.id, room.terms_version),
		next: nextIn(room.id, event.url.searchParams.get('next'))
	};
};

export const actions: Actions = {
	default: async (event) => {
		const { guest, room } = await guestRoom(event, event.params.roomId, { termsPage: true });
		const fields = await readForm(event.request);
		// The version accepted is the one shown: terms changed in between are shown again.
		if (Number(fields.termsVersion) === room.terms_version) await recordTermsAcceptance(room.id, guest.id, room.terms_version, event.getClientAddress());
		redirect(303, nextIn(room.id, fields.next));
	}
};
