import { describe, expect, it } from 'vitest';
import { METHOD_NOTES, methodHref } from '../../methods';
import { METRIC_KEYS } from '../engine/evaluate';
import { getMethodNote, listMethodNotes } from './notes';

describe('the bundled method notes', () => {
	it('hold a note for every slug of the catalogue, in its order', () => {
		const bundled = listMethodNotes().map((n) => n.slug);
		expect(bundled.slice(0, METHOD_NOTES.length)).toEqual(METHOD_NOTES.map((n) => n.slug));
	});

	it('give every engine metric a note with a title, a summary and a formula block', () => {
		for (const key of METRIC_KEYS) {
			const slug = methodHref(key).replace('/app/methods/', '');
			const note = getMethodNote(slug);
			expect(note, `${key} -> ${slug}`).toBeDefined();
			expect(note!.title.length).toBeGreaterThan(0);
			expect(note!.summary.length).toBeGreaterThan(0);
			expect(note!.html, `${slug} shows its formula`).toContain('<pre><code>');
		}
	});

	it('name a source in every note', () => {
		for (const { slug } of listMethodNotes()) {
			expect(getMethodNote(slug)!.html, slug).toMatch(/<h2>Sources?<\/h2>/);
		}
	});
});
