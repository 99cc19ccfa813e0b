/**
 * Breakeven tariff: the flat price per MWh in COD-year money, paid in every
 * operating year and indexed like a fully indexed tariff (to the tariff
 * inflation), at which the project's post-tax NPV at the discount rate is zero.
 */
import { dec, Decimal, numberKind, ONE, roughNumber, withFloat64, ZERO } from './decimal';
import { solveRoot } from './finance/roots';
import type { CasePreparation } from './cashflow';
import { corporateTax } from './tax';

/**
 * Post-tax project NPV at COD as a function of a flat real tariff p: the
 * numbers of cashflow.operate, with everything that does not move with p
 * computed once.
 *
 *     EBITDA_k(p) = p x E_k x (1 + j)^k x (1 - revenue-share opex) - other opex_k   (j tariff inflation)
 *     NPV(p) = -sum_j F_j DF_j + sum_k DF_k (EBITDA_k(p) - decommissioning_k - tax_k(p))
 */
export function flatTariffNpv(prep: CasePreparation): (pricePerMWh: Decimal) => Decimal {
	return npvOfParts(flatTariffParts(prep), prep);
}

/** What NPV(p) is made of, per operating year, computed once: everything but the tariff's own terms. */
type FlatTariffParts = {
	netRevenuePerUnitPrice: Decimal[];
	cashCosts: Decimal[];
	deductions: Decimal[];
	discountFactors: readonly Decimal[];
	constructionValue: Decimal;
};

function flatTariffParts(prep: CasePreparation): FlatTariffParts {
	const df = prep.nominalDiscountFactors;
	const n = prep.timeline.operatingYears;
	const keep = ONE.minus(prep.opex.revenueShare);
	const netRevenuePerUnitPrice = prep.energyMWh.map((e, k) => e.times(prep.tariffPriceIndex[k]).times(keep));
	const decommissioning = Array.from({ length: n }, (_, k) => (k === n - 1 ? prep.decommissioning : ZERO));
	const cashCosts = prep.opex.revenueIndependent.map((o, k) => o.plus(decommissioning[k]));
	const deductions = cashCosts.map((c, k) => c.plus(prep.depreciation[k]));
	let constructionValue = ZERO;
	prep.fundingNeed.forEach((f, j) => (constructionValue = constructionValue.minus(f.times(df.construction[j]))));
	return { netRevenuePerUnitPrice, cashCosts, deductions, discountFactors: df.operation, constructionValue };
}

/** The parts in the number kind bound now (float64 inside withFloat64). */
function reboundParts(parts: FlatTariffParts): FlatTariffParts {
	const each = (values: readonly Decimal[]) => values.map((v) => new Decimal(roughNumber(v)));
	return {
		netRevenuePerUnitPrice: each(parts.netRevenuePerUnitPrice),
		cashCosts: each(parts.cashCosts),
		deductions: each(parts.deductions),
		discountFactors: each(parts.discountFactors),
		constructionValue: new Decimal(roughNumber(parts.constructionValue))
	};
}

function npvOfParts(parts: FlatTariffParts, prep: CasePreparation): (pricePerMWh: Decimal) => Decimal {
	const { finance } = prep.scenario;
	const { netRevenuePerUnitPrice, cashCosts, deductions, discountFactors, constructionValue } = parts;
	return (price) => {
		const revenue = netRevenuePerUnitPrice.map((u) => u.times(price));
		const tax = corporateTax(
			revenue.map((r, k) => r.minus(deductions[k])),
			finance.taxRate,
			finance.taxLossCarryForward,
			finance.taxLossCarryForwardCap
		).tax;
		let value = constructionValue;
		revenue.forEach((r, k) => (value = value.plus(r.minus(cashCosts[k]).minus(tax[k]).times(discountFactors[k]))));
		return value;
	};
}

export type BreakevenResult = { tariffPerMWh: Decimal; evaluations: number } | { tariffPerMWh: null; evaluations: number; reason: string };

const MAX_SECANT_STEPS = 12;

/**
 * NPV(p) is affine in the flat real tariff p (revenue and revenue-share opex are
 * linear in p) except where tax switches on or losses are carried forward,
 * which makes it piecewise linear and increasing. So: two evaluations near
 * the guess (the real LCOE, which is the answer when there is no tax or grant
 * and the tariff follows general inflation) give the
 * line, its root is checked, and secant steps (each landing on the next
 * linear piece) finish it; Brent's method (finance/roots)
 * is the fallback on a bracket. Tolerance: |NPV| below 1e-6 currency units or
 * the tariff pinned to 1e-9 per MWh. The search runs in float64 first; the
 * decimal NPV at its answer and one step along its last secant's slope then
 * settle the tariff to the same tolerance (one decimal pass), or, if they do
 * not, the search is made again in decimals.
 * Source: definition of the breakeven price; Brent (1973) for the fallback.
 */
export function solveBreakevenTariff(prep: CasePreparation, guessPerMWh: Decimal | null = null): BreakevenResult {
	if (prep.deliveredAepMWh.isZero()) return { tariffPerMWh: null, evaluations: 0, reason: 'no energy is delivered, so no tariff can pay for the project' };
	const parts = flatTariffParts(prep);
	if (numberKind() === 'decimal') {
		// The search in float64 (some twenty times faster); the decimal NPV there and one step along the piece's
		// slope then settle it, as the secant steps below would from a start that close.
		const found = withFloat64(() => {
			const search = searchBreakeven(npvOfParts(reboundParts(parts), prep), guessPerMWh === null ? null : new Decimal(guessPerMWh.toNumber()));
			return search.tariffPerMWh === null ? null : { tariff: search.tariffPerMWh.toNumber(), slope: search.slope };
		});
		if (found !== null && Number.isFinite(found.tariff) && found.slope > 0) {
			const npv = npvOfParts(parts, prep);
			const start = new Decimal(found.tariff);
			const value = npv(start);
			if (value.abs().lt(1e-6)) return { tariffPerMWh: start, evaluations: 1 };
			const next = start.minus(value.div(found.slope));
			if (next.minus(start).abs().lt(1e-9)) return { tariffPerMWh: next, evaluations: 1 };
		}
	}
	const searched = searchBreakeven(npvOfParts(parts, prep), guessPerMWh);
	return searched.tariffPerMWh === null
		? { tariffPerMWh: null, evaluations: searched.evaluations, reason: searched.reason }
		: { tariffPerMWh: searched.tariffPerMWh, evaluations: searched.evaluations };
}

/**
 * The secant search of solveBreakevenTariff (see there) on an NPV function, with the slope of the last
 * secant (NaN when Brent's method finished it).
 */
function searchBreakeven(npv: (price: Decimal) => Decimal, guessPerMWh: Decimal | null): BreakevenResult & { slope: number } {
	let evaluations = 0;
	const npvAt = (p: Decimal) => {
		evaluations++;
		return npv(p);
	};

	// Start near the answer (the real LCOE is the breakeven without tax), so the first line is the right piece.
	let a = guessPerMWh && guessPerMWh.gt(0) ? guessPerMWh : dec(100);
	let fa = npvAt(a);
	let b = a.times(1.05);
	let fb = npvAt(b);
	if (fb.lte(fa)) return { tariffPerMWh: null, evaluations, reason: 'the NPV does not rise with the tariff', slope: NaN };
	for (let step = 0; step < MAX_SECANT_STEPS; step++) {
		const slope = fb.minus(fa).div(b.minus(a));
		const next = b.minus(fb.times(b.minus(a)).div(fb.minus(fa)));
		const fNext = npvAt(next);
		if (fNext.abs().lt(1e-6) || next.minus(b).abs().lt(1e-9)) return { tariffPerMWh: next, evaluations, slope: slope.toNumber() };
		a = b;
		fa = fb;
		b = next;
		fb = fNext;
		if (fb.eq(fa)) break;
	}
	// Fallback: bracket the root around the last estimate and let Brent finish.
	const guess = b.toNumber();
	const f = (p: number) => npvAt(new Decimal(p)).toNumber();
	let lo = guess - Math.max(1, Math.abs(guess));
	let hi = guess + Math.max(1, Math.abs(guess));
	for (let widen = 0; widen < 20 && Math.sign(f(lo)) === Math.sign(f(hi)); widen++) {
		lo -= hi - lo;
		hi += hi - lo;
	}
	const root = solveRoot(f, lo, hi, { xTolerance: 1e-9 });
	if (!root) return { tariffPerMWh: null, evaluations, reason: 'the breakeven search did not converge', slope: NaN };
	return { tariffPerMWh: new Decimal(root.x), evaluations, slope: NaN };
}
