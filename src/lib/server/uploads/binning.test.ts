import { describe, expect, it } from 'vitest';
import { binIndexer, DEFAULT_BIN_WIDTH_M_S } from './binning';

describe('binIndexer', () => {
	it('uses 0.1 m/s bins by default', () => {
		// IEC TS 62600-200 bins tidal power curves by 0.1 m/s (from memory).
		expect(DEFAULT_BIN_WIDTH_M_S).toBe('0.1');
	});

	it('centres bins on whole multiples of the width, lower edge included', () => {
		// Bin k covers [(k - 1/2) w, (k + 1/2) w): with w = 0.1, bin 1.2 holds 1.15 <= v < 1.25
		// (bins centred on multiples of the width as IEC 61400-12-1 does for wind, from memory).
		const bins = binIndexer('0.1');
		expect(bins.indexOf(1.2, '1.2')).toBe(12);
		expect(bins.indexOf(1.15, '1.15')).toBe(12);
		expect(bins.indexOf(1.2499, '1.2499')).toBe(12);
		expect(bins.indexOf(1.25, '1.25')).toBe(13);
		expect(bins.indexOf(0, '0')).toBe(0);
		expect(bins.indexOf(0.049, '0.049')).toBe(0);
		expect(bins.centreOf(12).toString()).toBe('1.2');
	});

	it('puts edge speeds where exact arithmetic puts them, not where float rounding would', () => {
		// In float64 0.15 / 0.1 = 1.4999999999999998, which would floor into bin 1; exactly it is 1.5 -> bin 2.
		expect(0.15 / 0.1 + 0.5).toBeLessThan(2);
		expect(binIndexer('0.1').indexOf(0.15, '0.15')).toBe(2);
		expect(binIndexer('0.1').indexOf(0.35, '0.35')).toBe(4);
	});

	it('takes other widths', () => {
		const half = binIndexer(0.5);
		expect(half.indexOf(0.74, '0.74')).toBe(1);
		expect(half.indexOf(0.75, '0.75')).toBe(2);
		expect(half.centreOf(2).toString()).toBe('1');
	});
});
