/**
 * Results from the cash flows: LCOE (discounted, real and nominal, and the
 * fixed-charge-rate form), IRRs, payback and debt cover ratios.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from './decimal';
import { capitalRecoveryFactor } from './finance/annuity';
import type { TimeSeries } from './timeline';
import type { CasePreparation } from './cashflow';

/**
 * Share of revenue the revenue-share opex lines take (leases, royalties), and
 * what is left of each unit of price: 1 - s. Such a cost moves with the
 * price, so the LCOE treats it as a deduction from the price rather than as a
 * cost (see discountedLcoe). Null when the lines take all the revenue.
 */
function keptShareOfPrice(prep: CasePreparation): Decimal | null {
	const kept = ONE.minus(prep.opex.revenueShare);
	return kept.gt(0) ? kept : null;
}

const REVENUE_SHARE_TAKES_ALL = 'the revenue-share costs take all of the revenue, so no price covers the other costs';

export type LcoeResult = { real: Decimal; nominal: Decimal } | { real: null; nominal: null; reason: string };

/**
 * Discounted LCOE (IEA/NEA definition): discounted costs over discounted energy.
 *
 *     LCOE_real    = sum_t C_t / (1 + n)^t  /  ((1 - s) sum_k E_k / (1 + r)^k)
 *     LCOE_nominal = sum_t C_t / (1 + n)^t  /  ((1 - s) sum_k E_k / (1 + n)^k)
 *
 * C_t are nominal capex (gross of grants), opex and decommissioning; n is the
 * nominal rate (1 + n) = (1 + r)(1 + i). Discounting nominal costs at n equals
 * discounting real costs at r, so the numerator is the same present value; the
 * real LCOE is a constant-money price, the nominal one a level current-money
 * price. Tax, financing and grants are left out. Energy is discounted too
 * (an undiscounted denominator is the classic mistake).
 *
 * Costs charged as a share s of revenue (percent-of-revenue opex) are not in
 * C_t: they depend on the price actually received, and counting them at the
 * scenario's tariff would make the LCOE move with the tariff. They are a
 * deduction from the price instead. The LCOE is the level price p, before
 * the share, whose discounted revenue net of the share covers the other
 * costs: sum_k p (1 - s) E_k / (1 + r)^k = sum_t C_t / (1 + n)^t, so
 * p = LCOE without the share / (1 - s) (exact here: the share applies to all
 * revenue). Null with the reason when no energy is delivered or s >= 1.
 * Source: IEA/NEA, Projected Costs of Generating Electricity (LCOE method);
 * real versus nominal levelising as in NREL's Manual for the Economic
 * Evaluation of Energy Efficiency and Renewable Energy Technologies (1995);
 * the revenue share as a price deduction: common practice (derived above).
 */
export function discountedLcoe(prep: CasePreparation): LcoeResult {
	const df = prep.nominalDiscountFactors;
	const n = prep.timeline.operatingYears;
	let costs = ZERO;
	prep.capex.nominal.forEach((c, j) => (costs = costs.plus(c.times(df.construction[j]))));
	prep.opex.revenueIndependent.forEach((o, k) => {
		const decommissioning = k === n - 1 ? prep.decommissioning : ZERO;
		costs = costs.plus(o.plus(decommissioning).times(df.operation[k]));
	});
	let energyReal = ZERO;
	let energyNominal = ZERO;
	prep.energyMWh.forEach((e, k) => {
		energyReal = energyReal.plus(e.times(prep.realDiscountFactors.operation[k]));
		energyNominal = energyNominal.plus(e.times(df.operation[k]));
	});
	if (energyReal.isZero()) return { real: null, nominal: null, reason: 'no energy is delivered' };
	const kept = keptShareOfPrice(prep);
	if (kept === null) return { real: null, nominal: null, reason: REVENUE_SHARE_TAKES_ALL };
	return { real: costs.div(energyReal.times(kept)), nominal: costs.div(energyNominal.times(kept)) };
}

/**
 * Fixed-charge-rate LCOE for quick comparison.
 *
 *     LCOE_FCR = (FCR x capex + annual opex) / ((1 - s) AEP),   FCR = CRF(r, N) = r / (1 - (1 + r)^-N)
 *
 * with capex the real total (with contingency, gross of grants), annual opex
 * the mean real opex over the operating years without the revenue-share
 * lines, s their share of revenue (a deduction from the price, as in
 * discountedLcoe), AEP the year-1 net P50 energy delivered (after
 * curtailment) and r the real discount rate. Equals the discounted LCOE when
 * capex is spent at COD and opex and energy are level. Null when no energy is
 * delivered or s >= 1. Source: NREL Annual Technology Baseline, LCOE
 * equations (FCR form), without its tax and financing factors.
 */
export function fixedChargeRateLcoe(prep: CasePreparation): Decimal | null {
	const kept = keptShareOfPrice(prep);
	if (prep.deliveredAepMWh.isZero() || kept === null) return null;
	const years = prep.timeline.operatingYears;
	const crf = capitalRecoveryFactor(prep.realDiscountRate, years);
	let realOpex = ZERO;
	prep.opex.revenueIndependent.forEach((o, k) => (realOpex = realOpex.plus(o.times(prep.priceDeflator.operation[k]))));
	const annualOpex = realOpex.div(years);
	return crf.times(prep.capex.realTotal).plus(annualOpex).div(prep.deliveredAepMWh.times(kept));
}

/** Flows of a time series with their t, for the IRR. */
export function timedFlows(series: TimeSeries, constructionTimes: readonly number[]): { t: number; amount: Decimal }[] {
	return [
		...series.construction.map((amount, j) => ({ t: constructionTimes[j], amount })),
		...series.operation.map((amount, k) => ({ t: k + 1, amount }))
	];
}

/**
 * Payback in years from COD: the first time the cumulative (undiscounted)
 * cash flow, summed from the first construction year, stops being negative,
 * interpolated linearly inside the year it turns.
 *
 *     payback = (k - 1) + (-cumulative_{k-1}) / flow_k
 *
 * 0 when the cumulative is never negative by COD. Null when it never turns.
 * Source: common practice (simple payback period).
 */
export function paybackYears(series: TimeSeries): Decimal | null {
	let cumulative = ZERO;
	for (const v of series.construction) cumulative = cumulative.plus(v);
	if (cumulative.gte(0)) return ZERO;
	for (let k = 0; k < series.operation.length; k++) {
		const flow = series.operation[k];
		const next = cumulative.plus(flow);
		if (next.gte(0)) return dec(k).plus(cumulative.neg().div(flow));
		cumulative = next;
	}
	return null;
}

/**
 * DSCR_k = CFADS_k / debt service_k over the years with debt service; the
 * minimum and the (arithmetic) average. Null when there is no debt service.
 * Source: common practice in project finance.
 */
export type CoverRatios = { perYear: (Decimal | null)[]; min: Decimal | null; average: Decimal | null };

export function coverRatios(cfads: readonly Decimal[], debtService: readonly Decimal[]): CoverRatios {
	return coverOfRatios(debtService.map((ds, k) => (ds.gt(0) ? cfads[k].div(ds) : null)));
}

/** The minimum and average of DSCRs already worked out (null in years without debt service), as coverRatios gives them. */
export function coverOfRatios(perYear: (Decimal | null)[]): CoverRatios {
	const present = perYear.filter((d): d is Decimal => d !== null);
	if (present.length === 0) return { perYear, min: null, average: null };
	let total = ZERO;
	for (const d of present) total = total.plus(d);
	return { perYear, min: Decimal.min(...present), average: total.div(present.length) };
}

/**
 * Loan life cover ratio at COD: CFADS over the loan's life, discounted at the
 * loan rate, over the debt outstanding at COD.
 *
 *     LLCR = sum_{k=1}^{tenor} CFADS_k / (1 + r_debt)^k  /  B_COD
 *
 * With a constant DSCR (sculpted, no grace) it equals that DSCR. Null when no
 * debt. Source: common practice in project finance.
 */
export function loanLifeCoverRatio(cfads: readonly Decimal[], balanceAtCod: Decimal, rate: DecimalInput, tenorYears: number): Decimal | null {
	if (balanceAtCod.lte(0)) return null;
	const v = ONE.div(ONE.plus(dec(rate)));
	let factor = ONE;
	let pv = ZERO;
	for (let k = 0; k < tenorYears; k++) {
		factor = factor.times(v);
		pv = pv.plus(cfads[k].times(factor));
	}
	return pv.div(balanceAtCod);
}
