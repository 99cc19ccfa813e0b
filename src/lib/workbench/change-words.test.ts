import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../tests/fixtures/scenario-documents';
import { NOT_SET, valueDifferences, valueWords } from './change-words';

describe('valueWords', () => {
	const doc = tidalDocument;

	it('reads a fraction as the form shows it, in per cent', () => {
		// 0.95 of the time is 95 % (common practice: availability is quoted in per cent).
		expect(valueWords(0.95, ['array', 'availability'], doc, 'EUR')).toBe('95 %');
	});

	it('gives a money amount the unit of its line’s basis, grouped', () => {
		// Fixture: line 1 is per kW, line 2 a lump sum (tests/fixtures/scenario-documents.ts).
		expect(valueWords(4200, ['capex', 'lines', 0, 'amount'], doc, 'EUR')).toBe('4,200 EUR/kW');
		expect(valueWords(6_500_000, ['capex', 'lines', 1, 'amount'], doc, 'EUR')).toBe('6,500,000 EUR');
	});

	it('says what is missing, empty, yes or no', () => {
		expect(valueWords(undefined, ['finance', 'reserves'], doc, 'EUR')).toBe(NOT_SET);
		expect(valueWords('  ', ['description'], doc, 'EUR')).toBe('empty');
		expect(valueWords(true, ['x'], doc, 'EUR')).toBe('yes');
	});

	it('keeps lists short: numbers with their unit, named rows by name, other rows counted', () => {
		expect(valueWords([90, 75, 50], ['uncertainty', 'exceedanceLevels'], doc, 'EUR')).toBe('90, 75, 50 %');
		expect(valueWords(doc.capex.lines, ['capex', 'lines'], doc, 'EUR')).toBe('Turbines, Cables and grid');
		expect(valueWords(doc.resource.kind === 'speed-histogram' ? doc.resource.bins : [], ['resource', 'bins'], doc, 'EUR')).toBe('5 rows');
		const long = Array.from({ length: 12 }, (_, i) => i);
		expect(valueWords(long, ['capex', 'phasing'], doc, 'EUR')).toMatch(/^0, 1, 2, 3, 4, 5, 6, 7 … \(12 values\)/);
	});

	it('cuts long words', () => {
		const words = valueWords('x'.repeat(200), ['description'], doc, 'EUR');
		expect(words.length).toBe(80);
		expect(words.endsWith('…')).toBe(true);
	});
});

describe('valueDifferences', () => {
	it('takes rows of the same count apart, field by field', () => {
		const before = [
			{ name: 'A', amount: 1 },
			{ name: 'B', amount: 2 }
		];
		const after = [
			{ name: 'A', amount: 1 },
			{ name: 'B', amount: 3 }
		];
		expect(valueDifferences(before, after, ['capex', 'lines'])).toEqual([{ path: ['capex', 'lines', 1, 'amount'], before: 2, after: 3 }]);
	});

	it('keeps a list whose length changed, and a list of numbers, whole', () => {
		expect(valueDifferences([{ a: 1 }], [{ a: 1 }, { a: 2 }], ['l'])).toEqual([{ path: ['l'], before: [{ a: 1 }], after: [{ a: 1 }, { a: 2 }] }]);
		expect(valueDifferences([0.4, 0.6], [0.5, 0.5], ['capex', 'phasing'])).toEqual([{ path: ['capex', 'phasing'], before: [0.4, 0.6], after: [0.5, 0.5] }]);
	});

	it('reads a group added on one side field by field against nothing', () => {
		expect(valueDifferences(undefined, { months: 6 }, ['finance', 'reserves'])).toEqual([{ path: ['finance', 'reserves', 'months'], before: undefined, after: 6 }]);
		expect(valueDifferences({ a: 1 }, { a: 1 }, [])).toEqual([]);
	});
});
