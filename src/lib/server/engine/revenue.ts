/**
 * Revenue: the price received per MWh in each operating year, and capital
 * grants. The tariff is given in prices of its indexation base year (COD
 * unless revenue.indexationBaseYearsBeforeCod says otherwise), the merchant
 * price in COD-year prices; both come out nominal.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from './decimal';
import type { Scenario } from '../../schemas/scenario';

/** The inflation the tariff and merchant price follow: revenue.tariffInflation, or the general rate when absent. */
export function tariffInflationOf(scenario: Pick<Scenario, 'revenue' | 'finance'>): Decimal {
	return dec(scenario.revenue.tariffInflation ?? scenario.finance.inflation);
}

/**
 * The tariff's index in operating years k = 1..N, relative to its base year
 * b years before COD (b = indexationBaseYearsBeforeCod), with tariff
 * inflation j and indexed share a (tariffIndexation):
 *
 *     indexed-share:     I_k = a (1 + j)^(b + k) + (1 - a)
 *     scaled-inflation:  I_k = (1 + a j)^(b + k)
 *
 * indexed-share is the usual indexation clause: a share a of the price follows
 * the index, the rest is fixed in money (a feed-in contract indexing 20 % of
 * its price to CPI has a = 0.2). scaled-inflation grows the whole price at
 * a x j (what tariffIndexation meant in document version 2 and before).
 * Both are 1 in every year for a = 0 and (1 + j)^(b + k) for a = 1.
 * Source: common practice for indexed offtake and support contracts; the
 * indexed-share form as in Ontario's Renewable Energy Standard Offer Program
 * (2006), section 5.5, which indexes 20 % of the contract price to CPI.
 */
export function tariffIndexPath(revenue: Scenario['revenue'], tariffInflation: DecimalInput, operatingYears: number): Decimal[] {
	const a = dec(revenue.tariffIndexation);
	const step = revenue.indexationMethod === 'scaled-inflation' ? ONE.plus(dec(tariffInflation).times(a)) : ONE.plus(tariffInflation);
	let growth = ONE;
	for (let y = 0; y < revenue.indexationBaseYearsBeforeCod; y++) growth = growth.times(step);
	const fixedShare = ONE.minus(a);
	return Array.from({ length: operatingYears }, () => {
		growth = growth.times(step);
		return revenue.indexationMethod === 'scaled-inflation' ? growth : a.times(growth).plus(fixedShare);
	});
}

/**
 * Nominal price per MWh in operating years k = 1..N.
 *
 *     k <= support years:  tariff x I_k                       (I_k from tariffIndexPath)
 *     afterwards:          merchant x (1 + j)^k (1 + e)^k     (j tariff inflation, e real escalation)
 *
 * The merchant price is a COD-year price following the same index as the
 * tariff (j), with its own escalation e on top.
 * Source: common practice for indexed support contracts followed by a merchant tail.
 */
export function nominalPricePath(revenue: Scenario['revenue'], tariffInflation: DecimalInput, operatingYears: number): Decimal[] {
	const tariffIndex = tariffIndexPath(revenue, tariffInflation, operatingYears);
	const inflationStep = ONE.plus(tariffInflation);
	const merchantStep = ONE.plus(revenue.merchantEscalation);
	let priceIndex = ONE;
	let merchantExtra = ONE;
	return tariffIndex.map((index, i) => {
		priceIndex = priceIndex.times(inflationStep);
		merchantExtra = merchantExtra.times(merchantStep);
		return i + 1 <= revenue.supportYears
			? index.times(revenue.tariffPerMWh)
			: priceIndex.times(merchantExtra).times(revenue.merchantPricePerMWh);
	});
}

/** A flat real price p in every operating year: p x index_k nominal (the breakeven solve passes the tariff's index). */
export function flatRealPricePath(pricePerMWh: Decimal, priceIndex: readonly Decimal[]): Decimal[] {
	return priceIndex.map((index) => index.times(pricePerMWh));
}

/** Revenue_k = E_k x price_k (currency; energy in MWh, price per MWh). */
export function revenueByYear(energyMWh: readonly Decimal[], pricePerMWh: readonly Decimal[]): Decimal[] {
	return energyMWh.map((e, k) => e.times(pricePerMWh[k]));
}

/**
 * Energy delivered: the net energy less the share the grid curtails, which is
 * neither delivered nor paid for.
 *
 *     E_delivered = E_net x (1 - c)
 *
 * Source: common practice (curtailment without compensation).
 */
export function deliveredEnergy(netEnergyMWh: Decimal, curtailment: DecimalInput): Decimal {
	return netEnergyMWh.times(ONE.minus(curtailment));
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
