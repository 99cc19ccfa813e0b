/**
 * The method notes of docs/methods/*.md, bundled into the server build with
 * Vite's `?raw` import so the built app never reads the docs folder at run
 * time. Listed in the catalogue's order (src/lib/methods.ts); a note on disk
 * that the catalogue does not name follows, by title.
 */
import { METHOD_NOTES } from '../../methods';
import { parseNote, type ParsedNote } from './parse-note';

const files = import.meta.glob('/docs/methods/*.md', { query: '?raw', import: 'default', eager: true }) as Record<string, string>;

function slugOfPath(path: string): string {
	return path.slice(path.lastIndexOf('/') + 1).replace(/\.md$/, '');
}

const catalogueTitles = new Map<string, string>(METHOD_NOTES.map((n) => [n.slug, n.title]));
const catalogueOrder = new Map<string, number>(METHOD_NOTES.map((n, i) => [n.slug, i]));

let parsed: ParsedNote[] | undefined;

function allNotes(): ParsedNote[] {
	parsed ??= Object.entries(files)
		.map(([path, raw]) => {
			const slug = slugOfPath(path);
			return parseNote(slug, raw, catalogueTitles.get(slug) ?? slug);
		})
		.sort((a, b) => {
			const ia = catalogueOrder.get(a.slug) ?? Infinity;
			const ib = catalogueOrder.get(b.slug) ?? Infinity;
			return ia !== ib ? ia - ib : a.title.localeCompare(b.title);
		});
	return parsed;
}

export function listMethodNotes(): Omit<ParsedNote, 'html'>[] {
	return allNotes().map(({ slug, title, summary }) => ({ slug, title, summary }));
}

export function getMethodNote(slug: string): ParsedNote | undefined {
	return allNotes().find((note) => note.slug === slug);
}

/** A note's markdown as written (its "# " title line included), for documents that print the notes themselves (the PDF summary). */
export function getMethodNoteSource(slug: string): { slug: string; title: string; markdown: string } | undefined {
	const note = getMethodNote(slug);
	const markdown = Object.entries(files).find(([path]) => slugOfPath(path) === slug)?.[1];
	return note && markdown !== undefined ? { slug, title: note.title, markdown } : undefined;
}
