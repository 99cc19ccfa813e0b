import { describe, expect, it } from 'vitest';
import { driverRangeText, mix } from './charts';

describe('driverRangeText', () => {
	it('writes multipliers of the base, and values with their unit once', () => {
		expect(driverRangeText({ unit: 'x base', lowInput: 0.8, highInput: 1.2 })).toBe('0.8× to 1.2× base');
		expect(driverRangeText({ unit: 'fraction/yr', lowInput: 0.04, highInput: 0.08 })).toBe('4 to 8 %/yr');
		expect(driverRangeText({ unit: 'years', lowInput: 20, highInput: 30 })).toBe('20 to 30 years');
		expect(driverRangeText({ unit: 'fraction', lowInput: 0.88, highInput: 0.96 })).toBe('88 to 96 %');
	});
});

describe('mix', () => {
	it('blends two colours channel by channel', () => {
		expect(mix('#000000', '#ffffff', 0)).toBe('#000000');
		expect(mix('#000000', '#ffffff', 1)).toBe('#ffffff');
		expect(mix('#000000', '#ffffff', 0.5)).toBe('#808080');
		expect(mix('#102030', '#102030', 0.3)).toBe('#102030');
	});
});
