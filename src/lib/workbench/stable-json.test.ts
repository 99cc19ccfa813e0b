import { describe, expect, it } from 'vitest';
import { stableJson } from './stable-json';

describe('stableJson', () => {
	it('reads two objects with the same fields in another order as the same', () => {
		// Postgres stores jsonb keys sorted by length, then bytes (PostgreSQL docs, 8.14 JSON Types): order is not kept.
		expect(stableJson({ b: 1, a: { d: [1, { y: 2, x: 1 }], c: 0 } })).toBe(stableJson({ a: { c: 0, d: [1, { x: 1, y: 2 }] }, b: 1 }));
	});

	it('keeps array order and drops undefined fields as JSON does', () => {
		expect(stableJson([2, 1])).not.toBe(stableJson([1, 2]));
		expect(stableJson({ a: 1, b: undefined })).toBe(stableJson({ a: 1 }));
	});
});
