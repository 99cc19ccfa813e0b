import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal, sum } from './decimal';
import { corporateTax } from './tax';
import { evaluateDetailed } from './evaluate';
import { atbCase } from './testing/fixtures';

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

describe('corporateTax in an evaluation', () => {
	it('applies the carry-forward cap to the losses of a front-loaded depreciation schedule', () => {
		// The fixture: EBITDA 7.198 M a year (30 660 MWh x 300 - 2 M opex), capex 50 M; schedule [1] writes
		// the 50 M off in year 1: taxable -42.802 M, then 7.198 M a year. At 25 %:
		// no cap: year 2 offsets all 7.198 M, tax 0; 60 % cap: offset 0.6 x 7.198 = 4.3188 M,
		// taxable 2.8792 M, tax 719 800 (hand calculation).
		const base = { finance: { taxRate: 0.25, depreciation: { method: 'schedule', schedule: [1] } } };
		const free = evaluateDetailed(atbCase(base), { breakeven: false });
		const capped = evaluateDetailed(atbCase({ finance: { ...base.finance, taxLossCarryForwardCap: 0.6 } }), { breakeven: false });
		expect(free.prep.depreciation[0].toString()).toBe('50000000');
		expect(free.operating.unleveredTax[1].toString()).toBe('0');
		expect(capped.operating.unleveredTax[1].toString()).toBe('719800');
		expect(capped.financing.tax[1].toString()).toBe('719800');
		expect(capped.metrics.npv!.lt(free.metrics.npv!)).toBe(true);
	});

	it('gives the same figures when the base is split into classes with the single rule', () => {
		// linearity of each depreciation rule in its cost (see depreciationByYear)
		const rule = { method: 'declining-balance', lifeYears: 10, decliningBalanceFactor: 2, firstYearConvention: 'half-year' };
		const single = evaluateDetailed(atbCase({ finance: { taxRate: 0.25, depreciation: rule } }), { breakeven: false });
		const split = evaluateDetailed(
			atbCase({ finance: { taxRate: 0.25, depreciation: { assetClasses: [{ name: 'Devices', share: 0.3, ...rule }, { name: 'Cable', ...rule }] } } }),
			{ breakeven: false }
		);
		split.prep.depreciation.forEach((charge, k) => expect(charge.minus(single.prep.depreciation[k]).abs().lt('1e-18')).toBe(true));
		expect(split.metrics.npv!.minus(single.metrics.npv!).abs().lt('1e-12')).toBe(true);
	});
});
