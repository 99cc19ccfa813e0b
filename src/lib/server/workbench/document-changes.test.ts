import { describe, expect, it } from 'vitest';
import { canonicalJson, changedSections, describeEdit } from './document-changes';

describe('canonicalJson', () => {
	it('ignores object key order but keeps array order', () => {
		expect(canonicalJson({ b: 1, a: { d: 2, c: 3 } })).toBe(canonicalJson({ a: { c: 3, d: 2 }, b: 1 }));
		expect(canonicalJson([1, 2])).not.toBe(canonicalJson([2, 1]));
	});
});

describe('changedSections', () => {
	it('lists every section of a new document', () => {
		expect(changedSections(null, { capex: {}, array: {} })).toEqual(['array', 'capex']);
	});

	it('lists changed, added and removed top-level sections only', () => {
		const before = { capex: { lines: [{ amount: 1 }] }, opex: { lines: [] }, name: 'A', description: 'x' };
		const after = { capex: { lines: [{ amount: 2 }] }, opex: { lines: [] }, name: 'A', revenue: {} };
		expect(changedSections(before, after)).toEqual(['capex', 'description', 'revenue']);
	});

	it('finds nothing when only key order differs', () => {
		expect(changedSections({ a: { x: 1, y: 2 } }, { a: { y: 2, x: 1 } })).toEqual([]);
	});
});

describe('describeEdit', () => {
	it('joins sections in plain words', () => {
		expect(describeEdit([])).toBe('No changes');
		expect(describeEdit(['capex'])).toBe('Edited capex');
		expect(describeEdit(['capex', 'opex', 'revenue'])).toBe('Edited capex, opex and revenue');
	});
});
