/**
 * Revenue: the price received per MWh in each operating year, and capital
 * grants. Prices are given in real money of the COD year and come out nominal.
 */
import { dec, Decimal, ONE, ZERO } from './decimal';
import type { Scenario } from '../../schemas/scenario';

/**
 * Nominal price per MWh in operating years k = 1..N.
 *
 *     k <= support years:  tariff x (1 + s i)^k      (s = share of inflation indexed)
 *     afterwards:          merchant x (1 + i)^k (1 + e)^k
 *
 * With s = 1 the tariff is constant in real terms; with s = 0 it is constant in
 * nominal terms. Source: common practice for indexed support contracts (e.g.
 * CPI-indexed strike prices) followed by a merchant tail.
 */
export function nominalPricePath(revenue: Scenario['revenue'], inflation: number, priceIndex: readonly Decimal[]): Decimal[] {
	const tariffStep = ONE.plus(dec(inflation).times(revenue.tariffIndexation));
	const merchantStep = ONE.plus(revenue.merchantEscalation);
	let tariffIndex = ONE;
	let merchantExtra = ONE;
	return priceIndex.map((index, i) => {
		tariffIndex = tariffIndex.times(tariffStep);
		merchantExtra = merchantExtra.times(merchantStep);
		const year = i + 1;
		return year <= revenue.supportYears
			? tariffIndex.times(revenue.tariffPerMWh)
			: index.times(merchantExtra).times(revenue.merchantPricePerMWh);
	});
}

/** A flat real price p in every operating year: p x (1 + i)^k nominal (used by the breakeven solve). */
export function flatRealPricePath(pricePerMWh: Decimal, priceIndex: readonly Decimal[]): Decimal[] {
	return priceIndex.map((index) => index.times(pricePerMWh));
}

/** Revenue_k = E_k x price_k (currency; energy in MWh, price per MWh). */
export function revenueByYear(energyMWh: readonly Decimal[], pricePerMWh: readonly Decimal[]): Decimal[] {
	return energyMWh.map((e, k) => e.times(pricePerMWh[k]));
}

/**
 * Capital grants, nominal, per construction year: the real grant total
 * (lump sums plus shares of capex) received in step with the capex spend,
 * never more than the capex of that year. Source: common practice (grants paid
 * against certified spend).
 */
export function grantSchedule(
	grants: Scenario['revenue']['grants'],
	capexRealTotal: Decimal,
	capexRealByYear: readonly Decimal[],
	priceIndex: readonly Decimal[]
): { realTotal: Decimal; nominal: Decimal[]; capped: boolean } {
	let realTotal = ZERO;
	for (const g of grants) realTotal = realTotal.plus(g.basis === 'lump-sum' ? dec(g.amount) : capexRealTotal.times(g.fraction));
	const capped = realTotal.gt(capexRealTotal);
	if (capped) realTotal = capexRealTotal;
	if (capexRealTotal.isZero()) return { realTotal: ZERO, nominal: capexRealByYear.map(() => ZERO), capped };
	const share = realTotal.div(capexRealTotal);
	return { realTotal, nominal: capexRealByYear.map((c, j) => c.times(share).times(priceIndex[j])), capped };
}
