import { describe, expect, it } from 'vitest';
import { isStorableText, unstorableTextPaths } from './storable-text';

describe('isStorableText', () => {
	it('refuses NUL and unpaired surrogates, keeps everything else', () => {
		expect(isStorableText('Kestle Narrows, 1.2 km — ébb & flow 🌊')).toBe(true);
		expect(isStorableText('a\u0000b')).toBe(false);
		expect(isStorableText('lone high \uD83C here')).toBe(false);
		expect(isStorableText('lone low \uDF0A here')).toBe(false);
		expect(isStorableText('\uDF0A\uD83C')).toBe(false); // reversed pair is two lone halves
		expect(isStorableText('\uD83C\uDF0A')).toBe(true); // a real pair: 🌊
	});
});

describe('unstorableTextPaths', () => {
	it('names every bad string and key by its path', () => {
		const body = { name: 'ok', notes: 'x\u0000', document: { capex: { lines: [{ name: 'fine' }, { name: '\uD800' }] } }, ['bad\u0000key']: 1 };
		expect(unstorableTextPaths(body)).toEqual(['notes', 'document.capex.lines[1].name', 'bad\u0000key']);
		expect(unstorableTextPaths('\u0000')).toEqual(['(body)']);
		expect(unstorableTextPaths({ a: [1, null, true] })).toEqual([]);
	});
});
