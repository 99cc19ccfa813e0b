import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal, sum } from './decimal';
import { corporateTax } from './tax';

const d = (xs: number[]) => xs.map((x) => new Decimal(x));

describe('corporateTax', () => {
	it('loses losses without carry-forward and offsets them with it', () => {
		// Hand calculation at 25 %: incomes -100, 50, 80.
		// Without: 0, 12.5, 20. With: pool 100 -> 50 left after year 2 -> year 3 taxable 30 -> 7.5.
		expect(corporateTax(d([-100, 50, 80]), 0.25, false).tax.map(String)).toEqual(['0', '12.5', '20']);
		const cf = corporateTax(d([-100, 50, 80]), 0.25, true);
		expect(cf.tax.map(String)).toEqual(['0', '0', '7.5']);
		expect(cf.lossCarriedForward.map(String)).toEqual(['100', '50', '0']);
	});

	it('never charges more tax with carry-forward than without', () => {
		// CHECK-VALUES property: tax with loss carry-forward <= tax without it (year by year and in total).
		fc.assert(
			fc.property(fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { minLength: 1, maxLength: 30 }), fc.double({ min: 0, max: 0.6, noNaN: true }), (incomes, rate) => {
				const income = d(incomes);
				const withCf = corporateTax(income, rate, true).tax;
				const without = corporateTax(income, rate, false).tax;
				return withCf.every((t, k) => t.lte(without[k])) && sum(withCf).lte(sum(without));
			})
		);
	});

	it('lets losses brought forward offset only the capped share of a year\'s profit', () => {
		// Hand calculation at 25 % with a 60 % cap (a "minimum taxation" rule, common practice):
		// year 1: loss 100, pool 100.
		// year 2: profit 50, offset min(100, 0.6 x 50 = 30) = 30, taxable 20, tax 5, pool 70.
		// year 3: profit 80, offset min(70, 0.6 x 80 = 48) = 48, taxable 32, tax 8, pool 22.
		// year 4: loss 10, pool 32.  year 5: profit 100, offset min(32, 60) = 32, taxable 68, tax 17, pool 0.
		const capped = corporateTax(d([-100, 50, 80, -10, 100]), 0.25, true, 0.6);
		expect(capped.tax.map(String)).toEqual(['0', '5', '8', '0', '17']);
		expect(capped.lossCarriedForward.map(String)).toEqual(['100', '70', '22', '32', '0']);
	});

	it('changes nothing with a cap of 1 or no cap, and ignores the cap without carry-forward', () => {
		// definition: a cap of 1 lets losses offset the whole profit, as without a cap
		const incomes = d([-100, 50, 80]);
		expect(corporateTax(incomes, 0.25, true, 1).tax.map(String)).toEqual(['0', '0', '7.5']);
		expect(corporateTax(incomes, 0.25, true, null).tax.map(String)).toEqual(['0', '0', '7.5']);
		expect(corporateTax(incomes, 0.25, false, 0.6).tax.map(String)).toEqual(['0', '12.5', '20']);
		// a cap of 0 keeps the losses forever unused: the same tax as without carry-forward
		expect(corporateTax(incomes, 0.25, true, 0).tax.map(String)).toEqual(['0', '12.5', '20']);
	});

	it('only defers the offset: tax with a cap lies between tax without carry-forward and tax with an uncapped one', () => {
		// CHECK-VALUES property: in total, uncapped <= capped <= no carry-forward; and the pool never goes negative
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { minLength: 1, maxLength: 30 }),
				fc.double({ min: 0, max: 0.6, noNaN: true }),
				fc.double({ min: 0, max: 1, noNaN: true }),
				(incomes, rate, cap) => {
					const income = d(incomes);
					const capped = corporateTax(income, rate, true, cap);
					return (
						sum(corporateTax(income, rate, true).tax).lte(sum(capped.tax)) &&
						sum(capped.tax).lte(sum(corporateTax(income, rate, false).tax)) &&
						capped.lossCarriedForward.every((pool) => !pool.isNegative())
					);
				}
			)
		);
	});

	it('rejects a cap outside 0..1', () => {
		// decided on purpose: the schema bounds it to a fraction
		expect(() => corporateTax(d([1]), 0.25, true, 1.5)).toThrow(RangeError);
		expect(() => corporateTax(d([1]), 0.25, true, -0.1)).toThrow(RangeError);
	});
});
