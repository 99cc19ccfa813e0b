import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { dec } from '../decimal';
import { nominalFromReal, realFromNominal } from './rates';

describe('nominalFromReal', () => {
	it('turns real 5 % at 2 % inflation into 7.1 %', () => {
		// Fisher relation, CHECK-VALUES "Fisher" row (derived): 1.05 * 1.02 - 1 = 0.071
		expect(nominalFromReal(0.05, 0.02).toString()).toBe('0.071');
	});

	it('is exact where the additive approximation is not', () => {
		// Fisher relation, derived by hand: 1.10 * 1.10 - 1 = 0.21, not 0.20
		expect(nominalFromReal('0.1', '0.1').toString()).toBe('0.21');
	});

	it('keeps the real rate when there is no inflation', () => {
		// Fisher relation, derived: (1 + r)(1 + 0) - 1 = r
		expect(nominalFromReal('0.0375', 0).toString()).toBe('0.0375');
	});

	it('accepts deflation down to but not including -100 %', () => {
		// Fisher relation, derived: 1.03 * 0.98 - 1 = 0.0094
		expect(nominalFromReal('0.03', '-0.02').toString()).toBe('0.0094');
		expect(() => nominalFromReal('0.03', -1)).toThrow(RangeError);
		expect(() => nominalFromReal(-1.5, '0.02')).toThrow(RangeError);
	});
});

describe('realFromNominal', () => {
	it('turns nominal 8 % at 2.5 % inflation into 5.365854 %', () => {
		// Fisher relation, CHECK-VALUES "Fisher" row (derived): 1.08 / 1.025 - 1 = 0.05365854
		const real = realFromNominal(0.08, 0.025);
		expect(real.minus(dec('1.08').div('1.025').minus(1)).abs().lt('1e-28')).toBe(true);
		expect(real.toDecimalPlaces(8).toString()).toBe('0.05365854');
	});

	it('rejects inflation of -100 % or below', () => {
		// Fisher relation: 1 + inflation is a divisor and must be positive
		expect(() => realFromNominal('0.08', -1)).toThrow(RangeError);
	});

	it('inverts nominalFromReal for any rates in range', () => {
		// Fisher relation, property: the two forms are inverse maps
		fc.assert(
			fc.property(
				fc.double({ min: -0.5, max: 1, noNaN: true }),
				fc.double({ min: -0.5, max: 1, noNaN: true }),
				(real, inflation) => {
					const back = realFromNominal(nominalFromReal(real, inflation), inflation);
					return back.minus(real).abs().lt('1e-25');
				}
			)
		);
	});
});
