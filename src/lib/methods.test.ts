import { describe, expect, it } from 'vitest';
import { METHOD_NOTES, isMethodSlug, methodNoteHref } from './methods';

describe('METHOD_NOTES', () => {
	it('has each slug once, in URL-safe form', () => {
		const slugs = METHOD_NOTES.map((n) => n.slug);
		expect(new Set(slugs).size).toBe(slugs.length);
		for (const slug of slugs) expect(slug).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
	});
});

describe('isMethodSlug', () => {
	it('knows the listed slugs and nothing else', () => {
		expect(isMethodSlug('lcoe')).toBe(true);
		expect(isMethodSlug('no-such-note')).toBe(false);
	});
});

describe('methodNoteHref', () => {
	it('puts the slug under the notes index', () => {
		expect(methodNoteHref('dscr')).toBe('/app/methods/dscr');
	});
});
