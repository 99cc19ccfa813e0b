import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { npv as referenceNpv } from 'financial';
import { dec, type Decimal, type DecimalInput } from '../decimal';
import { discountFactor, npv, npvSpreadsheet, presentValueOfTimed } from './discounting';

const closeTo = (actual: Decimal, expected: DecimalInput, tolerance: DecimalInput) =>
	actual.minus(expected).abs().lte(tolerance);

describe('npv', () => {
	it('matches the numpy-financial docstring example', () => {
		// numpy-financial npv docstring: npv(0.08, [-40_000, 5_000, 8_000, 12_000, 30_000]) = 3065.22267
		expect(closeTo(npv(0.08, [-40000, 5000, 8000, 12000, 30000]), '3065.22267', '5e-6')).toBe(true);
	});

	it('discounts the first value at t = 0', () => {
		// CHECK-VALUES "NPV time origin": 122.894855 at t = 0 for this series at 5 %
		expect(closeTo(npv(0.05, [-15000, 1500, 2500, 3500, 4500, 6000]), '122.894855', '5e-7')).toBe(true);
	});

	it('equals the plain sum at rate 0', () => {
		// definition: (1 + 0)^-t = 1 for every t
		expect(npv(0, [-100, 30, 40, 50]).toString()).toBe('20');
	});

	it('is 0 for an empty series', () => {
		// decided on purpose: the empty sum, as numpy-financial's np.sum of nothing
		expect(npv(0.07, []).isZero()).toBe(true);
	});

	it('rejects rates of -100 % or below', () => {
		// (1 + rate) is a divisor: rate = -1 has no present value
		expect(() => npv(-1, [1, 2])).toThrow(RangeError);
		expect(() => npv(-2, [1, 2])).toThrow(RangeError);
	});

	it('is exact in decimal where float64 is not', () => {
		// hand calculation: 0.1 + 0.2 / 1 at rate 0 is exactly 0.3 in decimal arithmetic
		expect(npv(0, ['0.1', '0.2']).toString()).toBe('0.3');
	});

	it('agrees with the npm financial package on random cash flows', () => {
		// reference library: npm `financial` (numpy-financial port) npv, same t = 0 convention
		fc.assert(
			fc.property(
				fc.double({ min: -0.5, max: 1.5, noNaN: true }),
				fc.array(fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }), { maxLength: 40 }),
				(rate, cents) => {
					const values = cents.map((c) => c / 100);
					const ours = npv(rate, values).toNumber();
					const theirs = referenceNpv(rate, values);
					const scale = values.reduce((acc, v, t) => acc + Math.abs(v) / (1 + rate) ** t, 1);
					return Math.abs(ours - theirs) <= 1e-12 * scale;
				}
			),
			{ numRuns: 300 }
		);
	});
});

describe('npvSpreadsheet', () => {
	it('discounts the first value by one period', () => {
		// CHECK-VALUES "NPV time origin": 117.04 = 122.894855 / 1.05 in the spreadsheet convention
		const value = npvSpreadsheet(0.05, [-15000, 1500, 2500, 3500, 4500, 6000]);
		expect(value.toDecimalPlaces(2).toString()).toBe('117.04');
		expect(closeTo(value, npv(0.05, [-15000, 1500, 2500, 3500, 4500, 6000]).div('1.05'), '1e-24')).toBe(true);
	});

	it('reproduces the spreadsheet documentation examples', () => {
		// spreadsheet NPV function documentation examples (from memory):
		// NPV(10%, -10000, 3000, 4200, 6800) = 1188.44
		expect(npvSpreadsheet(0.1, [-10000, 3000, 4200, 6800]).toDecimalPlaces(2).toString()).toBe('1188.44');
		// NPV(8%, 8000, 9200, 10000, 12000, 14500) + (-40000) = 1922.06
		const invested = npvSpreadsheet(0.08, [8000, 9200, 10000, 12000, 14500]).minus(40000);
		expect(invested.toDecimalPlaces(2).toString()).toBe('1922.06');
	});

	it('is 0 for an empty series', () => {
		// decided on purpose, as npv
		expect(npvSpreadsheet(0.05, []).isZero()).toBe(true);
	});
});

describe('discountFactor', () => {
	it('is (1 + r)^-t for whole periods', () => {
		// definition, hand calculation: 1 / 1.1^2 = 1 / 1.21
		expect(discountFactor(0.1, 2).eq(dec(1).div('1.21'))).toBe(true);
		expect(discountFactor(0.1, 0).toString()).toBe('1');
	});

	it('compounds forward for negative periods', () => {
		// definition: (1.1)^1 for t = -1, 1.1^3 = 1.331 for t = -3
		expect(discountFactor(0.1, -1).toString()).toBe('1.1');
		expect(discountFactor(0.1, -3).toString()).toBe('1.331');
	});

	it('handles fractional periods', () => {
		// hand calculation: 1.1^-0.5 = 1 / sqrt(1.1)
		expect(closeTo(discountFactor(0.1, 0.5), dec(1).div(dec('1.1').sqrt()), '1e-28')).toBe(true);
	});

	it('is 1 at rate 0 and rejects bad input', () => {
		// definition; (1 + rate) must be positive and t finite
		expect(discountFactor(0, 17).toString()).toBe('1');
		expect(() => discountFactor(-1, 1)).toThrow(RangeError);
		expect(() => discountFactor(0.05, Number.NaN)).toThrow(RangeError);
	});
});

describe('presentValueOfTimed', () => {
	it('equals npv for flows at t = 0, 1, 2, ...', () => {
		// numpy-financial npv docstring example, placed explicitly at t = 0..4
		const values = [-40000, 5000, 8000, 12000, 30000];
		const flows = values.map((amount, t) => ({ t, amount: dec(amount) }));
		expect(closeTo(presentValueOfTimed(0.08, flows), npv(0.08, values), '1e-22')).toBe(true);
	});

	it('compounds construction spending before t = 0 forward to the origin', () => {
		// hand calculation: -100 at t = -1 is -110 at t = 0 at 10 %; 121 at t = 2 is 100
		const flows = [
			{ t: -1, amount: dec(-100) },
			{ t: 0, amount: dec(-50) },
			{ t: 2, amount: dec(121) }
		];
		expect(presentValueOfTimed(0.1, flows).toString()).toBe('-60');
	});

	it('adds flows that share a period, in any order', () => {
		// definition: the sum is order-free
		const flows = [
			{ t: 3, amount: dec(10) },
			{ t: 1, amount: dec(5) },
			{ t: 3, amount: dec(-4) }
		];
		expect(closeTo(presentValueOfTimed(0.05, flows), npv(0.05, [0, 5, 0, 6]), '1e-24')).toBe(true);
	});

	it('reproduces the spreadsheet XNPV example with t = days / 365', () => {
		// spreadsheet XNPV function documentation example: 9 %, these five dated flows -> 2086.6476
		const dated: [string, number][] = [
			['2008-01-01', -10000],
			['2008-03-01', 2750],
			['2008-10-30', 4250],
			['2009-02-15', 3250],
			['2009-04-01', 2750]
		];
		const start = Date.parse(dated[0][0]);
		const flows = dated.map(([day, amount]) => ({
			t: (Date.parse(day) - start) / 86_400_000 / 365,
			amount: dec(amount)
		}));
		expect(closeTo(presentValueOfTimed(0.09, flows), '2086.6476', '5e-5')).toBe(true);
	});

	it('is 0 for no flows and rejects a non-finite period', () => {
		// decided on purpose: the empty sum; a period must be a number of periods
		expect(presentValueOfTimed(0.05, []).isZero()).toBe(true);
		expect(() => presentValueOfTimed(0.05, [{ t: Number.POSITIVE_INFINITY, amount: dec(1) }])).toThrow(
			RangeError
		);
	});
});
