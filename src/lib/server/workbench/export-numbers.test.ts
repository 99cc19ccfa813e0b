import { describe, expect, it } from 'vitest';
import { figureInText, numberFormat, numberInText, roundedText } from './export-numbers';

describe('numberFormat', () => {
	// ECMA-376 Part 1, 18.8.31 (numFmt): "0" a digit always shown, "#" a digit shown when significant, "," thousands grouping.
	it('groups thousands and shows exactly the decimals asked for', () => {
		expect(numberFormat(0)).toBe('#,##0');
		expect(numberFormat(2)).toBe('#,##0.00');
		expect(numberFormat(6)).toBe('#,##0.000000');
	});
});

describe('roundedText', () => {
	it('rounds half to even at the decimals asked, never through floats', () => {
		// Half to even (IEEE 754 roundTiesToEven, as decimal.js ROUND_HALF_EVEN): 2.345 -> 2.34, 2.355 -> 2.36.
		expect(roundedText('2.345', 2)).toBe('2.34');
		expect(roundedText('2.355', 2)).toBe('2.36');
		// Float noise in a value reads as the figure it stands for.
		expect(roundedText('1.3499999999999999', 2)).toBe('1.35');
		expect(roundedText('-9396694.3294256934', 0)).toBe('-9396694');
		expect(roundedText('1250000.5', 2)).toBe('1250000.50');
		expect(roundedText(-1, 0)).toBe('-1');
	});

	it('never writes a negative zero', () => {
		expect(roundedText('-0.0001', 2)).toBe('0.00');
		expect(roundedText('-0', 0)).toBe('0');
	});
});

describe('numberInText', () => {
	it('reads a figure written with grouped digits and a real minus sign', () => {
		expect(numberInText('3,200,000')).toEqual({ value: '3200000', places: 0 });
		expect(numberInText('−1,500.5')).toEqual({ value: '-1500.5', places: 1 });
		expect(numberInText('100.0')).toEqual({ value: '100.0', places: 1 });
		expect(numberInText('0.125')).toEqual({ value: '0.125', places: 3 });
	});

	it('leaves words, figures with units and malformed groups alone', () => {
		for (const text of ['', '-', 'default', '1,200 EUR/kW', '70 % / 30 %', '1,20', '12,3456', 'P90', '1.35×']) expect(numberInText(text), text).toBeNull();
	});
});

describe('figureInText', () => {
	it('splits a figure from the unit written after it', () => {
		expect(figureInText('40,498,975 EUR')).toEqual({ value: '40498975', places: 0, unit: 'EUR' });
		expect(figureInText('67.9 %')).toEqual({ value: '67.9', places: 1, unit: '%' });
	});

	it('leaves words and units with figures in them alone', () => {
		for (const text of ['Yes', 'its own interval', '35 % / 65 %', 't = 0 is the commercial operation date', '1.35×', 'the P50 target DSCR 1.40']) {
			expect(figureInText(text), text).toBeNull();
		}
	});
});
