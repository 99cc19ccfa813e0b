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
});
