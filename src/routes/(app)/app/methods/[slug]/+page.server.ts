import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/access';
import { getMethodNote, listMethodNotes } from '$lib/server/methods/notes';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	const note = getMethodNote(event.params.slug);
	if (!note) error(404, 'There is no method note by that name.');
	const notes = listMethodNotes();
	const at = notes.findIndex((n) => n.slug === note.slug);
	const neighbour = (i: number) => (notes[i] ? { slug: notes[i].slug, title: notes[i].title } : null);
	return { note, previous: neighbour(at - 1), next: neighbour(at + 1) };
};
