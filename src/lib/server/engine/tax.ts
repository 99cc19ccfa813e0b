/**
 * Corporate tax on operating profits, with or without losses carried forward
 * (optionally capped at a share of each year's profit).
 * Amounts in nominal currency per operating year.
 */
import { dec, Decimal, ZERO, type DecimalInput } from './decimal';

export type TaxSchedule = {
	tax: Decimal[];
	/** Losses still available at the end of each year (zero without carry-forward). */
	lossCarriedForward: Decimal[];
};

/**
 * Tax per year on taxable income (EBITDA - depreciation - interest - other deductions).
 *
 * Without carry-forward: tax_k = rate x max(0, income_k); losses are lost.
 * With carry-forward (no expiry): losses accumulate and offset later profits
 * first, up to a cap c on the share of a year's profit they may offset
 * (c = 1, no cap, when carryForwardCap is null or absent):
 *
 *     offset_k  = min(pool_{k-1}, c x max(0, income_k))
 *     taxable_k = max(0, income_k) - offset_k
 *     pool_k    = pool_{k-1} - offset_k + max(0, -income_k)
 *     tax_k     = rate x taxable_k
 *
 * so total tax with carry-forward never exceeds total tax without it, and a
 * cap only defers the offset (tax with a cap is never below tax without one).
 * No tax credit is given for losses (a stand-alone project company). The cap
 * has no effect without carry-forward. Source: common practice (stand-alone
 * corporate tax with loss carry-forward); the capped form is the "minimum
 * taxation" rule of regimes that let losses brought forward offset only part
 * of a year's profit (e.g. 60 % above an allowance), without the allowance.
 *
 * Example: incomes -100, 50, 80 at 25 % with a 60 % cap: year 2 offsets 30
 * (tax 5), year 3 offsets the 70 left up to 48 (tax 8); 22 remain.
 *
 * @throws RangeError when carryForwardCap is not a fraction 0..1.
 */
export function corporateTax(
	taxableIncome: readonly Decimal[],
	rate: DecimalInput,
	carryForward: boolean,
	carryForwardCap?: DecimalInput | null
): TaxSchedule {
	const r = dec(rate);
	const cap = carryForwardCap === undefined || carryForwardCap === null ? null : dec(carryForwardCap);
	if (cap && (!cap.isFinite() || cap.isNegative() || cap.gt(1))) {
		throw new RangeError(`tax-loss carry-forward cap must be a fraction 0..1, got ${cap.toString()}`);
	}
	const tax: Decimal[] = [];
	const lossCarriedForward: Decimal[] = [];
	let pool = ZERO;
	for (const income of taxableIncome) {
		if (!carryForward) {
			tax.push(income.gt(0) ? income.times(r) : ZERO);
			lossCarriedForward.push(ZERO);
			continue;
		}
		if (income.lte(0)) {
			tax.push(ZERO);
			pool = pool.minus(income);
		} else if (pool.isZero()) {
			// Nothing to offset (the same numbers as below, without the decimal work).
			tax.push(income.times(r));
		} else {
			const offsettable = cap ? income.times(cap) : income;
			const offset = Decimal.min(pool, offsettable);
			tax.push(income.minus(offset).times(r));
			pool = pool.minus(offset);
		}
		lossCarriedForward.push(pool);
	}
	return { tax, lossCarriedForward };
}
