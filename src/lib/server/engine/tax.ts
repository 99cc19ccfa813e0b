/**
 * Corporate tax on operating profits, with or without losses carried forward.
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
 * With carry-forward (unlimited, no expiry): losses accumulate and offset later
 * profits first,
 *
 *     pool_k = max(0, pool_{k-1} - income_k)   taxable_k = max(0, income_k - pool_{k-1})
 *     tax_k  = rate x taxable_k
 *
 * so total tax with carry-forward never exceeds total tax without it. No tax
 * credit is given for losses (a stand-alone project company). Source: common
 * practice (stand-alone corporate tax with unlimited loss carry-forward).
 */
export function corporateTax(taxableIncome: readonly Decimal[], rate: DecimalInput, carryForward: boolean): TaxSchedule {
	const r = dec(rate);
	const tax: Decimal[] = [];
	const lossCarriedForward: Decimal[] = [];
	let pool = ZERO;
	for (const income of taxableIncome) {
		if (!carryForward) {
			tax.push(income.gt(0) ? income.times(r) : ZERO);
			lossCarriedForward.push(ZERO);
			continue;
		}
		const afterLosses = income.minus(pool);
		if (afterLosses.gt(0)) {
			tax.push(afterLosses.times(r));
			pool = ZERO;
		} else {
			tax.push(ZERO);
			pool = afterLosses.neg();
		}
		lossCarriedForward.push(pool);
	}
	return { tax, lossCarriedForward };
}
