/**
 * The annual cash-flow model, in three stages so that solvers re-run only what
 * changes:
 *
 *   prepareCase  everything that does not depend on the price (timeline, indices,
 *                energy by year, capex, grants, opex, depreciation);
 *   operate      revenue, opex, EBITDA, unlevered tax and the project cash flows
 *                for a given price path (the breakeven solve re-runs only this);
 *   financeCase  debt sizing, interest, levered tax, CFADS and equity flows.
 *
 * Amounts are nominal currency of each year unless named real. Time convention
 * as in ./timeline: t = 0 is COD, construction at t <= 0, operating year k at t = k.
 */
import { dec, Decimal, numberKind, ONE, roughNumber, sum, withFloat64, ZERO } from './decimal';
import type { Scenario } from '../../schemas/scenario';
import type { EnergyEstimate } from './energy/yield';
import { degradationFactors } from './energy/losses';
import { nominalFromReal } from './finance/rates';
import { depreciationByYear } from './finance/depreciation';
import { buildTimeline, discountFactorsOnTimeline, overConstructionPoints, powersOnTimeline, presentValue, type Timeline, type TimeSeries } from './timeline';
import { capexSchedule, decommissioningCost, opexSchedule, overhaulSchedules, totalOpex, type CapexSchedule, type OpexSchedule, type OverhaulSchedule } from './costs';
import { deliveredEnergy, grantSchedule, revenueByYear, tariffInflationOf } from './revenue';
import { corporateTax } from './tax';
import { structureDebt, type DebtStructure, type DebtTerms } from './debt';
import type { FundingSolution } from './construction-funding';
import { horizonExceedanceFactor } from './energy/uncertainty';
import { costReserves, type CostReserves } from './reserves';
import { runWaterfall, type WaterfallResult } from './waterfall';
import { sculptedLoan } from './finance/loans';
import { AndersonMixer } from './finance/anderson';

export type CasePreparation = {
	scenario: Scenario;
	energy: EnergyEstimate;
	timeline: Timeline;
	inflation: Decimal;
	realDiscountRate: Decimal;
	nominalDiscountRate: Decimal;
	priceIndex: TimeSeries;
	/** Inflation of the tariff and merchant price (revenue.tariffInflation, else the general rate). */
	tariffInflation: Decimal;
	/** (1 + tariff inflation)^k for operating years k: the index a fully indexed COD-year price follows. */
	tariffPriceIndex: Decimal[];
	/** 1 / price index: turns nominal amounts back into COD-year money. */
	priceDeflator: TimeSeries;
	realDiscountFactors: TimeSeries;
	nominalDiscountFactors: TimeSeries;
	/** Year-1 net P50 energy less curtailment (revenue.curtailment), before degradation, MWh. */
	deliveredAepMWh: Decimal;
	/** Net P50 energy delivered in each operating year (after curtailment and degradation), MWh. */
	energyMWh: Decimal[];
	capex: CapexSchedule;
	grants: { realTotal: Decimal; nominal: Decimal[]; capped: boolean };
	/** Nominal capex net of grants at each construction point. */
	fundingNeed: Decimal[];
	/** Their sum: the cost tax depreciation writes off (before the financing costs of construction). */
	depreciableCost: Decimal;
	opex: OpexSchedule;
	/** Periodic overhaul lines' nominal cost per operating year (for the maintenance reserve). */
	overhauls: OverhaulSchedule[];
	/** Nominal decommissioning cost, in the final operating year. */
	decommissioning: Decimal;
	/** Tax depreciation per operating year, of capex net of grants. */
	depreciation: Decimal[];
	warnings: string[];
};

/**
 * A per-year capex schedule spread over the construction points (each year's
 * real spend split by the points' shares), in nominal money of each point:
 * real x (1 + i)^t at the point's own t. `real` and `nominal` then hold one
 * value per construction point.
 */
function capexAtPoints(perYear: CapexSchedule, timeline: Timeline, priceIndex: readonly Decimal[]): CapexSchedule {
	const real = overConstructionPoints(perYear.real, timeline);
	return { ...perYear, real, nominal: real.map((r, p) => r.times(priceIndex[p])) };
}

/**
 * The same case on another energy estimate of the same array (a downside
 * case's P90 energy): only the energy delivered and the costs that follow it
 * (per-MWh opex) change; timeline, indices, capex and depreciation are kept.
 */
export function withEnergy(prep: CasePreparation, energy: EnergyEstimate): CasePreparation {
	const { scenario } = prep;
	const deliveredAepMWh = deliveredEnergy(energy.netAepMWh, scenario.revenue.curtailment);
	const energyMWh = degradationFactors(scenario.array.degradationPerYear, prep.timeline.operatingYears).map((f) => f.times(deliveredAepMWh));
	const context = { installedKW: energy.installedCapacityKW, deviceCount: scenario.array.deviceCount, capexRealTotal: prep.capex.realTotal, energyMWh, priceIndex: prep.priceIndex.operation };
	return { ...prep, energy, deliveredAepMWh, energyMWh, opex: opexSchedule(scenario.opex, context) };
}

export function prepareCase(scenario: Scenario, energy: EnergyEstimate): CasePreparation {
	const warnings: string[] = [];
	const { constructionYears, operatingYears } = scenario.timeline;
	const timeline = buildTimeline(constructionYears, operatingYears, scenario.timeline.spendTiming);
	const inflation = dec(scenario.finance.inflation);
	const realDiscountRate = dec(scenario.finance.realDiscountRate);
	const nominalDiscountRate = nominalFromReal(realDiscountRate, inflation);
	const priceIndex = powersOnTimeline(ONE.plus(inflation), timeline);
	const tariffInflation = tariffInflationOf(scenario);
	const deliveredAepMWh = deliveredEnergy(energy.netAepMWh, scenario.revenue.curtailment);
	const energyMWh = degradationFactors(scenario.array.degradationPerYear, operatingYears).map((f) => f.times(deliveredAepMWh));
	const capex = capexAtPoints(
		capexSchedule(scenario.capex, energy.installedCapacityKW, scenario.array.deviceCount, Array.from({ length: constructionYears }, () => ONE)),
		timeline,
		priceIndex.construction
	);
	const grants = grantSchedule(scenario.revenue.grants, capex.realTotal, capex.real, priceIndex.construction);
	if (grants.capped) warnings.push('Grants exceed capex; they were limited to the capex.');
	const fundingNeed = capex.nominal.map((c, j) => c.minus(grants.nominal[j]));
	const costContext = { installedKW: energy.installedCapacityKW, deviceCount: scenario.array.deviceCount, capexRealTotal: capex.realTotal };
	const opex = opexSchedule(scenario.opex, { ...costContext, energyMWh, priceIndex: priceIndex.operation });
	const overhauls = overhaulSchedules(scenario.opex, { ...costContext, energyMWh, priceIndex: priceIndex.operation });
	const decommissioning = decommissioningCost(scenario.decommissioning, {
		...costContext,
		finalPriceIndex: priceIndex.operation[operatingYears - 1]
	});
	const depreciableCost = sum(fundingNeed);
	const depreciation = depreciationByYear(scenario.finance.depreciation, depreciableCost, operatingYears);
	return {
		scenario,
		energy,
		timeline,
		inflation,
		realDiscountRate,
		nominalDiscountRate,
		priceIndex,
		tariffInflation,
		tariffPriceIndex: tariffInflation.eq(inflation) ? priceIndex.operation : powersOnTimeline(ONE.plus(tariffInflation), timeline).operation,
		priceDeflator: powersOnTimeline(ONE.div(ONE.plus(inflation)), timeline),
		realDiscountFactors: discountFactorsOnTimeline(realDiscountRate, timeline),
		nominalDiscountFactors: discountFactorsOnTimeline(nominalDiscountRate, timeline),
		deliveredAepMWh,
		energyMWh,
		capex,
		grants,
		fundingNeed,
		depreciableCost,
		opex,
		overhauls,
		decommissioning,
		depreciation,
		warnings
	};
}

export type OperatingResult = {
	pricePerMWh: Decimal[];
	revenue: Decimal[];
	opex: Decimal[];
	ebitda: Decimal[];
	/** Decommissioning cost per operating year (final year only). */
	decommissioning: Decimal[];
	/** Tax as if the project had no debt, used for project (unlevered) returns. */
	unleveredTax: Decimal[];
	projectPreTax: TimeSeries;
	projectPostTax: TimeSeries;
	/** Post-tax project NPV at the nominal discount rate, valued at COD. */
	npv: Decimal;
};

/** Revenue, opex, EBITDA and decommissioning for a price path: what a downside sizing case needs of operate. */
function operatingMargin(prep: CasePreparation, pricePerMWh: readonly Decimal[]) {
	const n = prep.timeline.operatingYears;
	const revenue = revenueByYear(prep.energyMWh, pricePerMWh);
	const opex = totalOpex(prep.opex, revenue);
	const ebitda = revenue.map((r, k) => r.minus(opex[k]));
	const decommissioning = Array.from({ length: n }, (_, k) => (k === n - 1 ? prep.decommissioning : ZERO));
	return { revenue, opex, ebitda, decommissioning };
}

/** Revenue, opex, EBITDA, unlevered tax and project cash flows for a price path. */
export function operate(prep: CasePreparation, pricePerMWh: readonly Decimal[]): OperatingResult {
	const { revenue, opex, ebitda, decommissioning } = operatingMargin(prep, pricePerMWh);
	const taxable = ebitda.map((e, k) => e.minus(prep.depreciation[k]).minus(decommissioning[k]));
	const { finance } = prep.scenario;
	const unleveredTax = corporateTax(taxable, finance.taxRate, finance.taxLossCarryForward, finance.taxLossCarryForwardCap).tax;
	const construction = prep.fundingNeed.map((f) => f.neg());
	const operatingPreTax = ebitda.map((e, k) => e.minus(decommissioning[k]));
	const projectPreTax = { construction, operation: operatingPreTax };
	const projectPostTax = { construction, operation: operatingPreTax.map((v, k) => v.minus(unleveredTax[k])) };
	return {
		pricePerMWh: [...pricePerMWh],
		revenue,
		opex,
		ebitda,
		decommissioning,
		unleveredTax,
		projectPreTax,
		projectPostTax,
		npv: presentValue(projectPostTax, prep.nominalDiscountFactors)
	};
}

export type FinancingResult = {
	debt: DebtStructure | null;
	interest: Decimal[];
	principal: Decimal[];
	debtService: Decimal[];
	closingBalance: Decimal[];
	/** Tax depreciation with the financing costs of construction in the depreciable cost. */
	depreciation: Decimal[];
	/** Tax actually paid, with interest deducted. */
	tax: Decimal[];
	taxableIncome: Decimal[];
	lossCarriedForward: Decimal[];
	/** Cash flow available for debt service: after tax and the maintenance and decommissioning reserves' movements. */
	cfads: Decimal[];
	/** CFADS under each downside sizing case's energy (with the same debt), by label. */
	downsideCfads: { label: string; cfads: Decimal[] }[];
	/** Maintenance and decommissioning reserves (before debt). */
	costReserves: CostReserves;
	/** The operating waterfall: DSRA, lock-up, sweep, distributions (null without debt). */
	waterfall: WaterfallResult | null;
	/** Equity flows: paid in at each construction point (negative), distributions each operating year. */
	equity: TimeSeries;
	warnings: string[];
};

const MAX_TAX_ITERATIONS = 40;

/**
 * How close the debt-and-tax circle settles: the largest move of its iterate
 * (interest, the reserve's share in money, the financing costs) below this
 * share of the debt. Far below what any figure shows, so that where the circle
 * starts (the float64 search, or the decimal pass's own start) does not move a
 * reported figure; float64 reaches it, its rounding being some 1e-15.
 */
const SETTLED_SHARE_OF_DEBT = 1e-12;
/** The least absolute move counted as settled (currency units), for very small loans. */
const SETTLED_FLOOR = 1e-6;
/**
 * A circle that never gets below SETTLED_SHARE_OF_DEBT (a kink it keeps
 * stepping across) but moves by less than this share of the debt is reported
 * as settled, at its closest round: the tolerance engines before 3 settled to.
 */
const NEARLY_SETTLED_SHARE_OF_DEBT = 1e-9;

/** First-year debt service per unit borrowed, when it does not depend on CFADS (interest only, annuity, straight line). */
function firstServicePerDebt(terms: DebtTerms): Decimal | null {
	const rate = dec(terms.interestRate);
	if (terms.graceYears > 0) return rate;
	if (terms.repayment === 'annuity') return rate.isZero() ? ONE.div(terms.tenorYears) : rate.div(ONE.minus(ONE.plus(rate).pow(-terms.tenorYears)));
	if (terms.repayment === 'straight-line') return rate.plus(ONE.div(terms.tenorYears));
	return null;
}

/** What a case's CFADS allows in debt service over the loan, at its target: the sum of CFADS_k / target (a cheap ranking of cases). */
function allowed(c: { cfads: readonly Decimal[]; targetDscr: number }): Decimal {
	let total = ZERO;
	for (const x of c.cfads) total = total.plus(Decimal.max(x, ZERO));
	return total.div(c.targetDscr);
}

/**
 * Starting interest for a loan sculpted to a target DSCR, with the tax shield.
 * If every loan year pays tax at rate tau, CFADS_k = A_k + tau I_k (A: CFADS
 * with no interest) and DS_k = CFADS_k / T, so the balance recursion
 * B_{k-1} (1 + r) = DS_k + B_k becomes
 *
 *     B_{k-1} (1 + r (1 - tau / T)) = A_k / T + B_k
 *
 * a sculpted loan on A at the effective rate r (1 - tau / T): its opening
 * balances are the true ones, and r x opening is the interest. Exact in that
 * regime (the iteration then stops at once); a close start otherwise (years
 * with losses have no shield).
 */
function shieldedSculptingGuess(
	cfadsWithoutInterest: readonly Decimal[],
	terms: Extract<Scenario['finance']['debt'], { sizing: 'target-dscr' }>,
	taxRate: number,
	targetDscr: number = terms.targetDscr
): Decimal[] {
	const rate = dec(terms.interestRate);
	const effectiveRate = rate.times(ONE.minus(dec(taxRate).div(targetDscr)));
	const rows = sculptedLoan(cfadsWithoutInterest, targetDscr, effectiveRate, terms.tenorYears, terms.graceYears).rows;
	return rows.map((row) => row.opening.times(rate));
}

/** An energy case of the circle: its EBITDA and decommissioning each operating year, and its sizing target. */
type CircleCase = {
	label: string;
	exceedancePercent: number | null;
	horizonYears: number | null;
	targetDscr: number;
	ebitda: readonly Decimal[];
	decommissioning: readonly Decimal[];
};

/** What the debt-and-tax circle reads; none of it changes from round to round. */
type CircleData = {
	/** The sizing cases, P50 first. */
	cases: CircleCase[];
	/** The years as they turn out (cases[0] unless a draw's energy differs from the estimate the debt is sized on). */
	actual: CircleCase;
	/** Tax depreciation of capex net of grants, before the financing costs of construction. */
	depreciation: Decimal[];
	depreciableCost: Decimal;
	/** Net contributions to the maintenance and decommissioning reserves (./reserves), taken off CFADS. */
	reserveContribution: readonly Decimal[];
	/** Construction spend net of grants at each construction point. */
	fundingNeed: readonly Decimal[];
};

/**
 * The circle's iterate: the interest of the loan's years, the debt service
 * reserve's share of the loan, the financing costs of construction in the
 * depreciable cost, and where the
 * construction funding's solve starts.
 */
type CircleState = { interest: Decimal[]; reserveShare: Decimal; financingCosts: Decimal; fundingStart?: FundingSolution };

/** The circle settled: the debt of its last pass, the iterate that pass ran on, whether it settled, and its last move as a share of the debt. */
type SettledCircle = { debt: DebtStructure; state: CircleState; converged: boolean; eachCase: boolean; move: number };

/** a - b, skipping a zero b (decommissioning, interest and reserve movements are zero in most years): the same value. */
const less = (a: Decimal, b: Decimal) => (b.isZero() ? a : a.minus(b));

/** Levered tax and CFADS of an energy case, for given interest and depreciation. */
function caseCash(finance: Scenario['finance'], reserveContribution: readonly Decimal[]) {
	/** Tax with the given interest over the first interest.length years, for one case. */
	const taxFor = (c: Pick<CircleCase, 'ebitda' | 'decommissioning'>, interest: readonly Decimal[], depreciation: readonly Decimal[]) => {
		const taxableIncome = interest.map((i, k) => less(less(c.ebitda[k].minus(depreciation[k]), c.decommissioning[k]), i));
		return { taxableIncome, ...corporateTax(taxableIncome, finance.taxRate, finance.taxLossCarryForward, finance.taxLossCarryForwardCap) };
	};
	/** EBITDA less decommissioning, each case's cash before tax (worked out once). */
	const cashBeforeTax = new Map<object, Decimal[]>();
	const cfadsFor = (c: Pick<CircleCase, 'ebitda' | 'decommissioning'>, tax: readonly Decimal[]) => {
		let cash = cashBeforeTax.get(c);
		if (!cash) {
			cash = c.ebitda.map((e, k) => less(e, c.decommissioning[k]));
			cashBeforeTax.set(c, cash);
		}
		const before = cash;
		return tax.map((t, k) => less(less(before[k], t), reserveContribution[k]));
	};
	return { taxFor, cfadsFor };
}

/**
 * The debt-and-tax circle over one number kind: the data are read in the
 * number kind bound when this is called (see ./decimal: withFloat64), and its
 * functions must run under the same binding.
 */
function debtCircle(prep: CasePreparation, data: CircleData) {
	const { finance } = prep.scenario;
	const terms = finance.debt as DebtTerms;
	const n = prep.timeline.operatingYears;
	const span = terms.tenorYears;
	const dsraSpec = finance.reserves?.debtService;
	const sweeps = finance.covenants?.cashSweep !== undefined && finance.covenants.cashSweep.share > 0;
	// A reserve funded at COD holds months/12 of the first year's debt service; as a share of the loan that is
	// exact for interest-only first years and annuities, and settles with the tax circle otherwise.
	const reserveMonths = dsraSpec?.funding === 'from-funding' ? dec(dsraSpec.months).div(12) : ZERO;

	/** Depreciation with the financing costs of construction capitalised into the depreciable cost (every method is linear in it). */
	const depreciationWith = (costs: Decimal) => {
		if (costs.isZero() || !data.depreciableCost.gt(0)) return data.depreciation;
		const scale = ONE.plus(costs.div(data.depreciableCost));
		return data.depreciation.map((d) => d.times(scale));
	};
	const { taxFor, cfadsFor } = caseCash(finance, data.reserveContribution);
	const casesWith = (interest: readonly Decimal[], depreciation: readonly Decimal[]) =>
		data.cases.map((c) => ({ ...c, cfads: cfadsFor(c, taxFor(c, interest, depreciation).tax) }));
	const overLife = (values: readonly Decimal[]) => Array.from({ length: n }, (_, k) => values[k] ?? ZERO);

	/** Size, fund and schedule the debt on the CFADS the iterate gives; the funding solution is kept for the next pass. */
	const structure = (state: CircleState, eachCase: boolean) => {
		const structured = structureDebt({
			terms,
			timeline: prep.timeline,
			spend: data.fundingNeed,
			cases: casesWith(state.interest, depreciationWith(state.financingCosts)),
			reserveShareOfDebt: state.reserveShare,
			operatingYears: n,
			fundingStart: state.fundingStart,
			eachCase
		});
		state.fundingStart = structured.funding.solution;
		return structured;
	};
	/** CFADS of the years as they turn out, with the given interest. */
	const actualCfads = (interest: readonly Decimal[], depreciation: readonly Decimal[]) => cfadsFor(data.actual, taxFor(data.actual, overLife(interest), depreciation).tax);
	/** The waterfall on a CFADS: with a cash sweep, the interest it charges is what tax sees next. */
	const flow = (debt: DebtStructure, cfads: readonly Decimal[]) =>
		runWaterfall({
			cfads,
			loanRows: debt.rows,
			interestRate: terms.interestRate,
			debtServiceReserve: dsraSpec,
			dsraAtCod: dsraSpec ? debt.funding.reserveAtCod : undefined,
			covenants: finance.covenants
		});
	const shareFrom = (debt: DebtStructure) =>
		debt.balanceAtCod.gt(0) ? reserveMonths.times(Decimal.max(debt.debtService[0], ZERO)).div(debt.balanceAtCod) : ZERO;
	/** Gearing-sized annuity or straight-line debt without a sweep does not depend on CFADS (and a reserve funded at COD is then an exact share of it): the first pass is the answer. */
	const independentOfCfads = terms.sizing === 'gearing' && terms.repayment !== 'sculpted' && !sweeps;

	/** No interest (or, for a sculpted loan, the tax-shielded guess) and the reserve's share for a loan whose first service is proportional to it. */
	const defaultStart = (): CircleState => {
		let interest: Decimal[] = Array.from({ length: span }, () => ZERO);
		if (terms.sizing === 'target-dscr' && terms.repayment === 'sculpted' && finance.taxRate > 0) {
			// Start from the case that allows the least debt without interest: it usually sets every year.
			const start = casesWith(interest, data.depreciation);
			const least = start.reduce((a, b) => (b.cfads[0] !== undefined && allowed(b).lt(allowed(a)) ? b : a));
			interest = shieldedSculptingGuess(least.cfads, terms, finance.taxRate, least.targetDscr);
		}
		return { interest, reserveShare: reserveMonths.times(firstServicePerDebt(terms) ?? ZERO), financingCosts: ZERO };
	};

	/**
	 * Fixed-point iteration with Anderson acceleration (finance/anderson) from
	 * the start until the iterate moves by less than SETTLED_SHARE_OF_DEBT of
	 * the debt. eachCaseFirst sizes each case on its own in the first pass
	 * already (for a start expected to be settled: the report then needs no
	 * further pass).
	 */
	const settle = (start: CircleState, eachCaseFirst = false): SettledCircle => {
		let state: CircleState = { ...start, interest: [...start.interest] };
		let eachCase = eachCaseFirst;
		let debt = structure(state, eachCase);
		if (independentOfCfads) return { debt, state, converged: true, eachCase, move: 0 };
		let closest: SettledCircle | null = null;
		const mixer = new AndersonMixer(2);
		// The reserve's share is iterated in money (x the first debt amount), on the scale of the other unknowns.
		const shareScale = Decimal.max(debt.balanceAtCod, ONE);
		for (let round = 0; round < MAX_TAX_ITERATIONS; round++) {
			const costs = state.financingCosts;
			const nextShare = shareFrom(debt);
			const nextCosts = debt.funding.financingCosts;
			// Only a cash sweep makes the interest paid differ from the loan's rows (it repays early).
			const implied = (sweeps ? flow(debt, actualCfads(state.interest, depreciationWith(costs))).interest : debt.rows.map((r) => r.interest)).slice(0, span);
			let move = Decimal.max(nextShare.minus(state.reserveShare).times(debt.balanceAtCod).abs(), nextCosts.minus(costs).abs());
			implied.forEach((v, k) => (move = Decimal.max(move, v.minus(state.interest[k]).abs())));
			const share = roughNumber(move) / Math.max(roughNumber(debt.balanceAtCod), 1);
			if (move.lt(Decimal.max(SETTLED_FLOOR, debt.balanceAtCod.times(SETTLED_SHARE_OF_DEBT)))) return { debt, state, converged: true, eachCase, move: share };
			if (closest === null || share < closest.move) closest = { debt, state, converged: share < NEARLY_SETTLED_SHARE_OF_DEBT, eachCase, move: share };
			const mixed = mixer.next(
				[...state.interest, state.reserveShare.times(shareScale), costs],
				[...implied, nextShare.times(shareScale), nextCosts]
			);
			state = {
				interest: mixed.slice(0, span),
				reserveShare: Decimal.max(mixed[span].div(shareScale), ZERO),
				financingCosts: Decimal.max(mixed[span + 1], ZERO),
				fundingStart: state.fundingStart
			};
			eachCase = false;
			debt = structure(state, eachCase);
		}
		return closest ?? { debt, state, converged: false, eachCase, move: Infinity };
	};

	return { taxFor, cfadsFor, actualCfads, flow, overLife, depreciationWith, structure, defaultStart, settle, independentOfCfads, sweeps };
}

/** The circle's data in the number kind bound now (float64 inside withFloat64). */
function rebound(data: CircleData): CircleData {
	const each = (values: readonly Decimal[]) => values.map((v) => new Decimal(roughNumber(v)));
	const rebind = (c: CircleCase): CircleCase => ({ ...c, ebitda: each(c.ebitda), decommissioning: each(c.decommissioning) });
	const cases = data.cases.map(rebind);
	return {
		cases,
		actual: data.actual === data.cases[0] ? cases[0] : rebind(data.actual),
		depreciation: each(data.depreciation),
		depreciableCost: new Decimal(roughNumber(data.depreciableCost)),
		reserveContribution: each(data.reserveContribution),
		fundingNeed: each(data.fundingNeed)
	};
}

/** A circle iterate found in float64, as decimals. */
function decimalState(state: CircleState): CircleState {
	const d = (v: Decimal) => new Decimal(v.toNumber());
	return {
		interest: state.interest.map(d),
		reserveShare: d(state.reserveShare),
		financingCosts: d(state.financingCosts),
		fundingStart: state.fundingStart
	};
}

/**
 * Debt, levered tax, CFADS and equity cash flows.
 *
 *     taxable_k = EBITDA_k - depreciation'_k - decommissioning_k - interest_k
 *     CFADS_k   = EBITDA_k - decommissioning_k - tax_k
 *     equity_p  = -(equity paid in at construction point p)        (./construction-funding)
 *     equity_k  = CFADS_k - debt service_k                          (t = k)
 *
 * depreciation' is the depreciation of capex net of grants scaled up by the
 * financing costs of construction (interest, commitment and upfront fees),
 * which are capitalised into the depreciable cost (every method is linear in
 * the cost, so scaling is exact).
 *
 * Interest lowers tax, which raises CFADS, which (for DSCR sizing or sculpting)
 * changes the debt: the circle is closed by fixed-point iteration with
 * Anderson acceleration (finance/anderson), until the iterate moves by less
 * than 1e-12 of the debt amount (it contracts by roughly tax rate x interest
 * rate per round). The search runs in float64 first (some twenty times
 * faster); the decimal pass starts where it settled and, finding it settled
 * there too, takes one round; otherwise it iterates on in decimals. Only the
 * loan's years take part: tax losses carry forward, never back, so later
 * years cannot change the debt. Downside sizing cases (P90, P99 energy) run
 * the same tax with the same interest on their own EBITDA. Source: common
 * practice.
 *
 * sizedOn is the operation the debt is sized on, op the one the years bring:
 * the same but for a probabilistic draw, whose debt is sized at financial
 * close on the estimate and then lives with the energy drawn.
 */
export function financeCase(prep: CasePreparation, op: OperatingResult, sizedOn: OperatingResult = op): FinancingResult {
	const { finance } = prep.scenario;
	const n = prep.timeline.operatingYears;
	const warnings: string[] = [];
	const terms = finance.debt;
	const cases: CircleCase[] = [{ label: 'P50', exceedancePercent: null, horizonYears: null, targetDscr: terms.sizing === 'target-dscr' ? terms.targetDscr : 0, ebitda: sizedOn.ebitda, decommissioning: sizedOn.decommissioning }];
	// The years as they turn out: the sized case unless the debt was sized on another estimate (a probabilistic draw).
	const actual: CircleCase = sizedOn === op ? cases[0] : { ...cases[0], ebitda: op.ebitda, decommissioning: op.decommissioning };
	if (terms.sizing === 'target-dscr' && terms.downsideCases.length > 0) {
		// EBITDA is affine in the energy delivered (revenue, revenue-share and per-MWh opex scale with it, the rest
		// does not): a case with f x the energy has EBITDA_k - (1 - f) x (revenue_k (1 - revenue share) - per-MWh opex_k).
		const energyMargin = sizedOn.revenue.map((r, k) => r.times(ONE.minus(prep.opex.revenueShare)).minus(prep.opex.energyDriven[k]));
		for (const downside of terms.downsideCases) {
			const shortfall = ONE.minus(horizonExceedanceFactor(downside.exceedancePercent, downside.horizonYears, prep.energy.uncertaintySplit));
			const downsideOp = { ebitda: sizedOn.ebitda.map((e, k) => e.minus(shortfall.times(energyMargin[k]))), decommissioning: sizedOn.decommissioning };
			const horizon = downside.horizonYears === 1 ? '' : ` (${downside.horizonYears}-year)`;
			cases.push({
				label: `P${downside.exceedancePercent}${horizon}`,
				exceedancePercent: downside.exceedancePercent,
				horizonYears: downside.horizonYears,
				targetDscr: downside.targetDscr,
				ebitda: downsideOp.ebitda,
				decommissioning: downsideOp.decommissioning
			});
		}
	}
	const reserves = costReserves({ overhauls: prep.overhauls, decommissioning: op.decommissioning, spec: finance.reserves });
	const data: CircleData = { cases, actual, depreciation: prep.depreciation, depreciableCost: prep.depreciableCost, reserveContribution: reserves.netContribution, fundingNeed: prep.fundingNeed };

	if (terms.sizing === 'none') {
		const zeros = op.ebitda.map(() => ZERO);
		const { taxFor, cfadsFor } = caseCash(finance, reserves.netContribution);
		const taxed = taxFor(actual, zeros, prep.depreciation);
		const cfads = cfadsFor(actual, taxed.tax);
		return {
			debt: null,
			interest: zeros,
			principal: zeros,
			debtService: zeros,
			closingBalance: zeros,
			depreciation: prep.depreciation,
			...taxed,
			cfads,
			downsideCfads: [],
			costReserves: reserves,
			waterfall: null,
			equity: { construction: prep.fundingNeed.map((f) => f.neg()), operation: cfads },
			warnings
		};
	}

	const circle = debtCircle(prep, data);
	// A loan sculpted on several cases is sized on their combination; the report also sizes each case alone.
	const eachCaseReport = terms.sizing === 'target-dscr' && terms.repayment === 'sculpted' && cases.length > 1;
	let start: CircleState | null = null;
	if (numberKind() === 'decimal' && !circle.independentOfCfads) {
		// The search in float64; the decimal pass below then normally confirms it in one round.
		const found = withFloat64(() => {
			const fast = debtCircle(prep, rebound(data));
			return fast.settle(fast.defaultStart());
		});
		// A search that did not quite settle still starts the decimal pass far closer than the usual start.
		if (found.converged || found.move < 1e-6) start = decimalState(found.state);
	}
	const settled = start ? circle.settle(start, eachCaseReport) : circle.settle(circle.defaultStart());
	let { debt } = settled;
	// The settled debt once more, with each case sized on its own for the report.
	if (eachCaseReport && !settled.eachCase) debt = circle.structure(settled.state, true);
	const depreciation = circle.depreciationWith(debt.funding.financingCosts);
	// Tax on the waterfall's own interest, then the waterfall on that CFADS: without a sweep the interest is the
	// loan's and the ledger closes exactly; with one, the two interest vectors agree to the tolerance above.
	const interest = circle.overLife(circle.sweeps ? circle.flow(debt, circle.actualCfads(settled.state.interest, depreciation)).interest : debt.rows.map((r) => r.interest));
	const taxed = circle.taxFor(actual, interest, depreciation);
	const cfads = circle.cfadsFor(actual, taxed.tax);
	const waterfall = circle.flow(debt, cfads);
	if (!settled.converged) warnings.push('The debt and tax calculation did not settle; debt figures may be slightly off.');
	warnings.push(...debt.warnings, ...waterfall.warnings);
	return {
		debt,
		interest: waterfall.interest,
		principal: waterfall.principal.map((p, k) => p.plus(waterfall.sweep[k])),
		debtService: waterfall.debtService,
		closingBalance: waterfall.closingBalance,
		depreciation,
		...taxed,
		cfads,
		downsideCfads: cases.slice(1).map((c) => ({ label: c.label, cfads: circle.cfadsFor(c, circle.taxFor(c, interest, depreciation).tax) })),
		costReserves: reserves,
		waterfall,
		equity: { construction: debt.funding.equity.map((e) => e.neg()), operation: waterfall.distribution },
		warnings
	};
}

/** The same energy estimate with its net energy scaled (a downside case's P90 or P99 energy, a draw's outturn). */
export function scaledEnergy(energy: EnergyEstimate, factor: Decimal): EnergyEstimate {
	return { ...energy, netAepMWh: energy.netAepMWh.times(factor) };
}
