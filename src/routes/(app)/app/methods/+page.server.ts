import { requireUser } from '$lib/server/auth/access';
import { listMethodNotes } from '$lib/server/methods/notes';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	return { notes: listMethodNotes() };
};
