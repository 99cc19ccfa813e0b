import { describe, expect, it } from 'vitest';
import { changesBetween, mergeKey, threeWayMerge, valueAtPath } from './three-way-merge';

// The rules of a three-way merge as GNU diffutils' manual states them for diff3 ("Comparing Three
// Versions"): a change made on one side only is taken, the same change made on both sides is taken
// once, different changes to the same part are a conflict. Here a "part" is a field at its path.
const base = {
	name: 'Lender case',
	array: { deviceCount: 4, availability: 0.95, arrayLoss: 0.05 },
	capex: {
		contingency: 0.1,
		lines: [
			{ name: 'Turbines', amount: 4000 },
			{ name: 'Cables', amount: 6_000_000 }
		]
	}
};
type Doc = typeof base & Record<string, unknown>;
const edited = (change: (doc: Doc) => void): Doc => {
	const doc = structuredClone(base) as Doc;
	change(doc);
	return doc;
};

describe('changesBetween', () => {
	it('names each changed field by its path, and nothing else', () => {
		const after = edited((d) => {
			d.array.availability = 0.9;
			d.name = 'Bank case';
		});
		expect(changesBetween(base, after)).toEqual([
			{ path: ['name'], before: 'Lender case', after: 'Bank case' },
			{ path: ['array', 'availability'], before: 0.95, after: 0.9 }
		]);
	});

	it('reads an added or removed field as a change from or to undefined', () => {
		const after = edited((d) => {
			delete (d.array as Partial<Doc['array']>).arrayLoss;
			(d.array as Record<string, unknown>).otherLoss = 0.01;
		});
		expect(changesBetween(base, after)).toEqual([
			{ path: ['array', 'otherLoss'], before: undefined, after: 0.01 },
			{ path: ['array', 'arrayLoss'], before: 0.05, after: undefined }
		]);
	});

	it('does not count the order of keys as a change', () => {
		const reordered = { capex: base.capex, array: { arrayLoss: 0.05, availability: 0.95, deviceCount: 4 }, name: base.name };
		expect(changesBetween(base, reordered)).toEqual([]);
	});

	it('takes an array as one value at its path', () => {
		const after = edited((d) => (d.capex.lines[1].amount = 6_500_000));
		expect(changesBetween(base, after).map((c) => mergeKey(c.path))).toEqual(['capex.lines']);
	});
});

describe('threeWayMerge', () => {
	it('keeps a change only they made', () => {
		const theirs = edited((d) => (d.array.availability = 0.9));
		const outcome = threeWayMerge(base as Doc, theirs, structuredClone(base) as Doc);
		expect(outcome.merged.array.availability).toBe(0.9);
		expect(outcome.theirs.map((c) => mergeKey(c.path))).toEqual(['array.availability']);
		expect(outcome.mine).toEqual([]);
		expect(outcome.clashes).toEqual([]);
	});

	it('puts a change only I made on top of theirs', () => {
		const theirs = edited((d) => (d.array.availability = 0.9));
		const mine = edited((d) => (d.capex.contingency = 0.15));
		const outcome = threeWayMerge(base as Doc, theirs, mine);
		expect(outcome.merged.array.availability).toBe(0.9);
		expect(outcome.merged.capex.contingency).toBe(0.15);
		expect(outcome.clashes).toEqual([]);
		expect(outcome.agreed).toEqual([]);
		expect(outcome.clean).toEqual([{ path: ['capex', 'contingency'], before: 0.1, after: 0.15 }]);
	});

	it('takes the same change made on both sides once, with no clash', () => {
		const theirs = edited((d) => (d.array.deviceCount = 6));
		const mine = edited((d) => (d.array.deviceCount = 6));
		const outcome = threeWayMerge(base as Doc, theirs, mine);
		expect(outcome.merged.array.deviceCount).toBe(6);
		expect(outcome.clashes).toEqual([]);
		expect(outcome.agreed).toEqual([{ path: ['array', 'deviceCount'], before: 4, after: 6 }]);
	});

	it('lists different changes to one field as a clash: mine by default, theirs when chosen', () => {
		const theirs = edited((d) => (d.array.availability = 0.9));
		const mine = edited((d) => {
			d.array.availability = 0.93;
			d.capex.contingency = 0.15;
		});
		const outcome = threeWayMerge(base as Doc, theirs, mine);
		expect(outcome.clashes).toEqual([{ path: ['array', 'availability'], base: 0.95, theirs: 0.9, mine: 0.93 }]);
		expect(outcome.merged.array.availability).toBe(0.93);

		const chosen = threeWayMerge(base as Doc, theirs, mine, new Set(['array.availability']));
		expect(chosen.merged.array.availability).toBe(0.9);
		expect(chosen.merged.capex.contingency).toBe(0.15);
	});

	it('settles edits to different rows of one array as one clash over the whole array', () => {
		const theirs = edited((d) => (d.capex.lines[0].amount = 4200));
		const mine = edited((d) => (d.capex.lines[1].amount = 6_500_000));
		const outcome = threeWayMerge(base as Doc, theirs, mine);
		expect(outcome.clashes.map((c) => mergeKey(c.path))).toEqual(['capex.lines']);
		expect(outcome.merged.capex.lines).toEqual(mine.capex.lines);
		expect(threeWayMerge(base as Doc, theirs, mine, new Set(['capex.lines'])).merged.capex.lines).toEqual(theirs.capex.lines);
	});

	it('clashes at the outer path when they removed an object I edited inside', () => {
		const withReserves = { ...structuredClone(base), reserves: { months: 6, fundedFrom: 'cash' } } as Doc;
		const theirs = structuredClone(withReserves);
		delete theirs.reserves;
		const mine = structuredClone(withReserves);
		(mine.reserves as { months: number }).months = 9;
		const outcome = threeWayMerge(withReserves, theirs, mine);
		expect(outcome.clashes).toEqual([{ path: ['reserves'], base: withReserves.reserves, theirs: undefined, mine: mine.reserves }]);
		expect(outcome.merged.reserves).toEqual({ months: 9, fundedFrom: 'cash' });
		expect('reserves' in threeWayMerge(withReserves, theirs, mine, new Set(['reserves'])).merged).toBe(false);
	});

	it('leaves its inputs as they were', () => {
		const theirs = edited((d) => (d.array.availability = 0.9));
		const mine = edited((d) => (d.capex.contingency = 0.15));
		const before = JSON.stringify([base, theirs, mine]);
		threeWayMerge(base as Doc, theirs, mine);
		expect(JSON.stringify([base, theirs, mine])).toBe(before);
	});

	// RFC 7396 (JSON Merge Patch), section 3: its example target and patched result. Merging my edit (target ->
	// result) onto a copy where they changed only "content" must give the RFC's result with their content:
	// nested objects merged key by key, a removed key gone, the tags array replaced whole.
	it('applies my edits as the RFC 7396 example patches its target', () => {
		const target = { title: 'Goodbye!', author: { givenName: 'John', familyName: 'Doe' }, tags: ['example', 'sample'], content: 'This will be unchanged' };
		const result = { title: 'Hello!', author: { givenName: 'John' }, tags: ['example'], content: 'This will be unchanged', phoneNumber: '+01-123-456-7890' };
		const theirs = { ...structuredClone(target), content: 'Edited by them' };
		const outcome = threeWayMerge<Record<string, unknown>>(target, theirs, result);
		expect(outcome.clashes).toEqual([]);
		expect(outcome.merged).toEqual({ ...result, content: 'Edited by them' });
	});
});

describe('valueAtPath', () => {
	it('reads a nested value, and undefined past the end', () => {
		expect(valueAtPath(base, ['array', 'availability'])).toBe(0.95);
		expect(valueAtPath(base, ['array', 'availability', 'x'])).toBeUndefined();
		expect(valueAtPath(base, ['finance'])).toBeUndefined();
	});
});
