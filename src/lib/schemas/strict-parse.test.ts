import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { safeParseStrict } from './strict-parse';

const line = z.strictObject({ name: z.string(), amount: z.number() });
const body = z.strictObject({
	title: z.string(),
	lines: z.array(line),
	choice: z.discriminatedUnion('kind', [z.strictObject({ kind: z.literal('a'), alpha: z.number() }), z.strictObject({ kind: z.literal('b'), beta: z.number() })]),
	settings: z.object({ loose: z.boolean() }).optional()
});

describe('safeParseStrict', () => {
	it('passes a valid value through as zod parses it', () => {
		const value = { title: 't', lines: [{ name: 'x', amount: 1 }], choice: { kind: 'a', alpha: 1 } };
		expect(safeParseStrict(body, value)).toEqual({ success: true, data: value });
	});

	it('gives each unknown key its own issue at its own path, with the key the object probably meant', () => {
		const result = safeParseStrict(body, {
			title: 't',
			titel: 'u',
			lines: [{ name: 'x', amount: 1 }, { name: 'y', amout: 2, amount: 3, colour: 'red' }],
			choice: { kind: 'b', beta: 1, alpha: 2 }
		});
		expect(result.success).toBe(false);
		if (result.success) return;
		expect(result.issues).toHaveLength(4);
		expect(result.issues).toEqual(
			expect.arrayContaining([
				{ path: ['titel'], message: '"titel" is not a field here; did you mean "title"?' },
				{ path: ['lines', 1, 'amout'], message: '"amout" is not a field here; did you mean "amount"?' },
				{ path: ['lines', 1, 'colour'], message: '"colour" is not a field here; the fields here are name, amount' },
				{ path: ['choice', 'alpha'], message: '"alpha" is not a field here; the fields here are kind, beta' }
			])
		);
	});

	it('keeps the other issues as zod words them, and leaves non-strict objects to strip their extra keys', () => {
		const result = safeParseStrict(body, { title: 5, lines: [], choice: { kind: 'a', alpha: 1 }, settings: { loose: true, extra: 1 } });
		expect(result.success).toBe(false);
		if (result.success) return;
		expect(result.issues).toEqual([{ path: ['title'], message: 'Invalid input: expected string, received number' }]);
	});
});
