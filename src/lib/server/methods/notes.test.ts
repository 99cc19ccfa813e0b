import { describe, expect, it } from 'vitest';
import { METHOD_NOTES } from '../../methods';
import { METRIC_LIST } from '../../metrics/catalogue';
import { getMethodNote, getMethodNoteSource, listMethodNotes } from './notes';

describe('the bundled method notes', () => {
	it('hold a note for every slug of the catalogue, in its order', () => {
		const bundled = listMethodNotes().map((n) => n.slug);
		expect(bundled.slice(0, METHOD_NOTES.length)).toEqual(METHOD_NOTES.map((n) => n.slug));
	});

	it('give every engine metric a note with a title, a summary and a formula block', () => {
		for (const { key, method: slug } of METRIC_LIST) {
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

	it('give each note its markdown as written, for documents that print it', () => {
		const source = getMethodNoteSource('lcoe');
		expect(source?.title).toBe(getMethodNote('lcoe')!.title);
		expect(source?.markdown.startsWith('# Levelised cost of energy')).toBe(true);
		expect(source?.markdown).toMatch(/## Sources/);
		expect(getMethodNoteSource('no-such-note')).toBeUndefined();
	});
});
