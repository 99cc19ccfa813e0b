import { describe, expect, it } from 'vitest';
import { entryStep, entryUnit, formatEntry, parseEntry, stepped } from './number-entry';

describe('number entry', () => {
	it('shows fractions as per cent, keeping the rest of the unit', () => {
		expect(entryUnit('fraction')).toEqual({ unit: '%', scale: 100 });
		expect(entryUnit('fraction/yr (nominal)')).toEqual({ unit: '%/yr (nominal)', scale: 100 });
		expect(entryUnit('fraction of P50')).toEqual({ unit: '% of P50', scale: 100 });
		expect(entryUnit('EUR')).toEqual({ unit: 'EUR', scale: 1 });
	});

	it('formats with grouping, per cent without float noise, and a true minus', () => {
		expect(formatEntry(12_000_000, 1)).toBe('12,000,000');
		expect(formatEntry(0.87, 100)).toBe('87');
		expect(formatEntry(0.0815, 100)).toBe('8.15');
		expect(formatEntry(-2500.5, 1)).toBe('−2,500.5');
		expect(formatEntry(undefined, 1)).toBe('');
		// At rest a field shows four decimals at most; typing in it shows them all.
		expect(formatEntry(288.6666666666667, 1, 4)).toBe('288.6667');
		expect(formatEntry(288.6666666666667, 1)).toBe('288.666666667');
	});

	it('reads typed text back, grouped or not', () => {
		expect(parseEntry('12,000,000', 1)).toBe(12_000_000);
		expect(parseEntry(' 87 ', 100)).toBe(0.87);
		expect(parseEntry('8.15', 100)).toBe(0.0815);
		expect(parseEntry('−3.5', 1)).toBe(-3.5);
		expect(parseEntry('', 1)).toBeUndefined();
		expect(parseEntry('12a', 1)).toBeNaN();
		expect(parseEntry('1.2.3', 1)).toBeNaN();
	});

	it('steps by an amount that fits the field', () => {
		// A per cent moves by 0.1, not 1: availability 87 % goes to 87.1 %, never to 100 %.
		expect(entryStep(87, 100, false)).toBe(0.1);
		expect(stepped(87, 1, 0.1, { min: 0, max: 100 })).toBe(87.1);
		expect(stepped(8.13, 1, 0.1, {})).toBe(8.2);
		expect(stepped(0.05, -1, 0.1, { min: 0 })).toBe(0);
		expect(entryStep(12, 1, true)).toBe(1);
		expect(entryStep(12_000_000, 1, false)).toBe(100_000);
		expect(entryStep(3.5, 1, false)).toBe(0.01);
		expect(stepped(12_000_000, 1, 100_000, {})).toBe(12_100_000);
		expect(stepped(99.95, 1, 0.1, { max: 100 })).toBe(100);
	});
});
