import { describe, expect, it } from 'vitest';
import { METRIC_KEYS } from './server/engine/evaluate';
import { METHOD_NOTES, METRIC_METHODS, methodHref, isMethodSlug } from './methods';

describe('methodHref', () => {
	it('leads every engine metric to a listed note', () => {
		for (const key of METRIC_KEYS) {
			const href = methodHref(key);
			const slug = href.replace('/app/methods/', '');
			expect(isMethodSlug(slug), `${key} -> ${href}`).toBe(true);
		}
	});

	it('maps no key the engine does not have', () => {
		expect(Object.keys(METRIC_METHODS).sort()).toEqual([...METRIC_KEYS].sort());
	});

	it('leads an unknown key to the index', () => {
		expect(methodHref('noSuchMetric')).toBe('/app/methods');
	});
});

describe('METHOD_NOTES', () => {
	it('has each slug once, in URL-safe form', () => {
		const slugs = METHOD_NOTES.map((n) => n.slug);
		expect(new Set(slugs).size).toBe(slugs.length);
		for (const slug of slugs) expect(slug).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
	});
});
