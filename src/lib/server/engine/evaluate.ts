/**
 * One evaluation of a scenario: energy, costs, cash flows, financing and the
 * metrics, returned as plain data with decimals as strings.
 *
 * Time convention (./timeline): t = 0 is the commercial operation date (COD);
 * construction spend and draws fall at points within each construction year
 * (mid-year by default); operating year k sits at t = k (end of year). NPVs
 * are valued at COD; the annual table adds each construction year's points up.
 */
import { Decimal, sum, ZERO } from './decimal';
import { byConstructionYear } from './timeline';
import { coverShortfalls, coverShortfallWarnings, type CoverShortfalls } from './cover-shortfalls';
import type { Scenario } from '../../schemas/scenario';
import { estimateEnergy, type EnergyEstimate, type Exceedance } from './energy/yield';
import { financeCase, operate, prepareCase, scaledEnergy, withEnergy, type CasePreparation, type FinancingResult, type OperatingResult } from './cashflow';
import { nominalPricePath } from './revenue';
import { coverOfRatios, coverRatios, discountedLcoe, type CoverRatios, fixedChargeRateLcoe, loanLifeCoverRatio, paybackYears, timedFlows } from './metrics';
import { irrTimedWithRates } from './finance/irr';
import { paybackReversalWarning, severalIrrWarning } from './metric-warnings';
import { solveBreakevenTariff } from './breakeven';
import { decimalString } from './decimal-string';
import { METRIC_KEYS, METRICS, type MetricKey } from '../../metrics/catalogue';

export { METRIC_KEYS, type MetricKey } from '../../metrics/catalogue';

export type Metrics<T> = Record<MetricKey, T | null>;

export type DetailedEvaluation = {
	prep: CasePreparation;
	operating: OperatingResult;
	financing: FinancingResult;
	dscr: (Decimal | null)[];
	/** Years of negative CFADS and of DSCR below 1 within the loan, beside the minimum DSCR. */
	shortfalls: CoverShortfalls;
	metrics: Metrics<Decimal>;
	breakevenEvaluations: number;
	warnings: string[];
};

export type EvaluateOptions = {
	/** Reuse an energy estimate of the same resource, device and array (sensitivity runs). */
	energy?: EnergyEstimate;
	/** Solve the breakeven tariff (a few extra cash-flow passes). Default true. */
	breakeven?: boolean;
	/**
	 * The years deliver this multiple of the estimated net energy, while the debt is sized on the estimate
	 * (a probabilistic draw of the energy uncertainty). Default 1: the years deliver the estimate.
	 */
	energyOutturn?: number;
	/** Look for the warnings that cost extra passes (several IRRs, payback reversing). Default true; draws skip them. */
	extraChecks?: boolean;
};

/** Metrics that need the debt and levered-tax pass. */
const FINANCING_METRICS = new Set<MetricKey>(['equityIrr', 'minDscr', 'avgDscr', 'llcr', 'debtAmount', 'yearsInLockUp']);

type Computed = Omit<DetailedEvaluation, 'financing'> & { financing: FinancingResult | null };

/** Runs the stages the wanted metrics need; metrics not wanted are null without a warning. */
function compute(scenario: Scenario, options: EvaluateOptions, wanted: ReadonlySet<MetricKey>): Computed {
	const estimate = options.energy ?? estimateEnergy(scenario);
	const sizingPrep = prepareCase(scenario, estimate);
	const prices = nominalPricePath(scenario.revenue, sizingPrep.tariffInflation, sizingPrep.timeline.operatingYears);
	const sizingOperating = operate(sizingPrep, prices);
	const outturn = options.energyOutturn ?? 1;
	const energy = outturn === 1 ? estimate : scaledEnergy(estimate, new Decimal(outturn));
	const prep = outturn === 1 ? sizingPrep : withEnergy(sizingPrep, energy);
	const operating = outturn === 1 ? sizingOperating : operate(prep, prices);
	const needsFinancing = [...wanted].some((m) => FINANCING_METRICS.has(m));
	const financing = needsFinancing ? financeCase(sizingPrep, operating, sizingOperating) : null;
	const warnings = [...energy.warnings, ...prep.warnings, ...(financing?.warnings ?? [])];
	const note = (metric: MetricKey, reason: string) => warnings.push(`${METRICS[metric].label} is not available: ${reason}.`);
	const want = (m: MetricKey) => wanted.has(m);
	const extraChecks = options.extraChecks !== false;
	const warnIf = (sentence: () => string | null) => {
		if (!extraChecks) return;
		const text = sentence();
		if (text !== null) warnings.push(text);
	};

	const lcoe = discountedLcoe(prep);
	if (lcoe.real === null && want('lcoeReal')) note('lcoeReal', lcoe.reason);

	const times = prep.timeline.constructionTimes;
	const irrOf = (metric: MetricKey, series: typeof operating.projectPreTax) => {
		if (!want(metric)) return null;
		const { result, changes, rates } = irrTimedWithRates(timedFlows(series, times));
		if (result.rate === null) note(metric, result.reason);
		else warnIf(() => severalIrrWarning(METRICS[metric].label, changes, rates, result.rate));
		return result.rate;
	};

	let payback: Decimal | null = null;
	if (want('paybackYears')) {
		payback = paybackYears(operating.projectPostTax);
		if (payback === null) note('paybackYears', 'the cumulative post-tax cash flow never turns positive');
		else warnIf(() => paybackReversalWarning(METRICS.paybackYears.label, operating.projectPostTax));
	}

	let cover: CoverRatios = { perYear: [], min: null, average: null };
	let llcr: Decimal | null = null;
	let shortfalls: CoverShortfalls = { negativeCfadsYears: [], dscrBelowOneYears: [] };
	const debt = financing?.debt ?? null;
	if (financing) {
		// The waterfall has divided CFADS by debt service already, year by year.
		cover = financing.waterfall ? coverOfRatios(financing.waterfall.dscr) : coverRatios(financing.cfads, financing.debtService);
		const terms = scenario.finance.debt;
		if (debt && terms.sizing !== 'none') llcr = loanLifeCoverRatio(financing.cfads, debt.balanceAtCod, terms.interestRate, terms.tenorYears);
		if (cover.min === null) note('minDscr', 'there is no debt service');
		shortfalls = coverShortfalls(financing.cfads, financing.debtService, cover.perYear);
		warnings.push(...coverShortfallWarnings(shortfalls, cover.perYear));
		if (llcr === null) note('llcr', 'there is no debt');
	}

	let breakevenTariff: Decimal | null = null;
	let breakevenEvaluations = 0;
	if (want('breakevenTariff') && options.breakeven !== false) {
		const solved = solveBreakevenTariff(prep, lcoe.real);
		breakevenEvaluations = solved.evaluations;
		breakevenTariff = solved.tariffPerMWh;
		if (solved.tariffPerMWh === null) note('breakevenTariff', solved.reason);
		else if (solved.tariffPerMWh.lt(0)) warnings.push('The breakeven tariff is negative: the project pays back without any revenue from energy sales.');
	}

	const metrics: Metrics<Decimal> = {
		netAepMWh: energy.netAepMWh,
		p90AepMWh: energy.p90AepMWh,
		capacityFactor: energy.capacityFactor,
		lcoeReal: lcoe.real,
		lcoeNominal: lcoe.nominal,
		lcoeFcr: want('lcoeFcr') ? fixedChargeRateLcoe(prep) : null,
		projectIrrPreTax: irrOf('projectIrrPreTax', operating.projectPreTax),
		projectIrrPostTax: irrOf('projectIrrPostTax', operating.projectPostTax),
		equityIrr: financing ? irrOf('equityIrr', financing.equity) : null,
		npv: operating.npv,
		paybackYears: payback,
		minDscr: cover.min,
		avgDscr: cover.average,
		llcr,
		// Filled by the cash waterfall (./waterfall) once it is wired into the cash-flow model.
		yearsInLockUp: financing?.waterfall && scenario.finance.covenants?.lockUpDscr !== undefined ? new Decimal(financing.waterfall.yearsInLockUp) : null,
		debtAmount: financing ? (debt ? debt.balanceAtCod : new Decimal(0)) : null,
		breakevenTariff
	};
	return { prep, operating, financing, dscr: cover.perYear, shortfalls, metrics, breakevenEvaluations, warnings };
}

const ALL_METRICS: ReadonlySet<MetricKey> = new Set(METRIC_KEYS);

/** The evaluation with decimals, for the engine's own callers (sensitivity, tests). */
export function evaluateDetailed(scenario: Scenario, options: EvaluateOptions = {}): DetailedEvaluation {
	const computed = compute(scenario, options, ALL_METRICS);
	return { ...computed, financing: computed.financing! };
}

/**
 * One metric, running only the stages it needs (no debt pass for LCOE, no
 * breakeven solve unless asked): what sensitivity runs call many times.
 */
export function evaluateMetric(scenario: Scenario, metric: MetricKey, energy?: EnergyEstimate): Decimal | null {
	return compute(scenario, { energy }, new Set([metric])).metrics[metric];
}

/** Several metrics, running only the stages they need (the draws of a probabilistic run). */
export function evaluateMetrics<K extends MetricKey>(scenario: Scenario, metrics: readonly K[], options: EvaluateOptions = {}): { metrics: Record<K, Decimal | null>; warnings: string[] } {
	const computed = compute(scenario, options, new Set<MetricKey>(metrics));
	return { metrics: computed.metrics, warnings: computed.warnings };
}

// ---------------------------------------------------------------- plain-data result

export type DecimalString = string;

export type CashFlowRow = {
	/** t: 0 is COD, negative construction years, k the end of operating year k. */
	t: number;
	phase: 'construction' | 'operation';
	energyMWh: DecimalString;
	pricePerMWh: DecimalString;
	revenue: DecimalString;
	opex: DecimalString;
	ebitda: DecimalString;
	capex: DecimalString;
	grants: DecimalString;
	decommissioning: DecimalString;
	depreciation: DecimalString;
	taxableIncome: DecimalString;
	tax: DecimalString;
	cfads: DecimalString;
	debtDrawdown: DecimalString;
	/** Interest in the year; during construction, accrued on the debt drawn (capitalised or paid). */
	interest: DecimalString;
	/** Commitment and upfront fees during construction. */
	financingFees: DecimalString;
	/** Prepayment by the cash sweep. */
	cashSweep: DecimalString;
	/** Reserve balances at the year's end: debt service, maintenance, decommissioning, and cash held by a lock-up. */
	debtServiceReserve: DecimalString;
	maintenanceReserve: DecimalString;
	decommissioningReserve: DecimalString;
	lockedUpCash: DecimalString;
	principal: DecimalString;
	debtService: DecimalString;
	debtBalance: DecimalString;
	dscr: DecimalString | null;
	projectCashFlowPreTax: DecimalString;
	projectCashFlowPostTax: DecimalString;
	cumulativeProjectCashFlow: DecimalString;
	equityCashFlow: DecimalString;
	cumulativeEquityCashFlow: DecimalString;
};

export type EnergyBinRow = {
	speedMPerS?: DecimalString;
	hsM?: DecimalString;
	teS?: DecimalString;
	fluxKWPerM?: DecimalString;
	probability: DecimalString;
	hours: DecimalString;
	devicePowerKW: DecimalString;
	arrayGrossEnergyMWh: DecimalString;
};

export type ExceedanceRow = { label: string; levelPercent: number; aepMWh: DecimalString; shareOfP50: DecimalString };

export type EngineResult = {
	schemaVersion: 1;
	scenarioName: string;
	technology: Scenario['technology'];
	currency: string;
	timeConvention: string;
	energy: {
		deviceCount: number;
		ratedPowerPerDeviceKW: DecimalString;
		installedCapacityKW: DecimalString;
		meanDevicePowerKW: DecimalString;
		grossAepMWh: DecimalString;
		lossFactor: DecimalString;
		netAepMWh: DecimalString;
		/** Share of the net energy curtailed (revenue.curtailment), and the year-1 energy curtailed and delivered. */
		curtailment: DecimalString;
		curtailedAepMWh: DecimalString;
		deliveredAepMWh: DecimalString;
		combinedSigma: DecimalString;
		/** One-year exceedance levels. */
		exceedances: ExceedanceRow[];
		/** Whether the energy comes from the resource and the device, or is an assessment's given P50. */
		energySource: 'resource-and-device' | 'assessed';
		sigmaLongTerm: DecimalString;
		sigmaInterAnnual: DecimalString;
		/** Exceedance levels of the mean annual energy over one and ten years (the first equals `exceedances`). */
		exceedancesByHorizon: { horizonYears: number; sigma: DecimalString; levels: ExceedanceRow[] }[];
		capacityFactor: DecimalString | null;
		bins: EnergyBinRow[];
	};
	costs: {
		capexRealTotal: DecimalString;
		capexLines: { name: string; realTotal: DecimalString }[];
		grantsRealTotal: DecimalString;
		decommissioningNominal: DecimalString;
	};
	rates: { inflation: DecimalString; tariffInflation: DecimalString; realDiscountRate: DecimalString; nominalDiscountRate: DecimalString };
	financing: null | {
		sizedBy: 'gearing' | 'target-dscr' | 'gearing-cap';
		/** The energy case whose target DSCR set the debt (P50, P90...), when sizedBy is target-dscr. */
		governingCase: string | null;
		/** Debt over the total funding need. */
		gearing: DecimalString;
		debtAmount: DecimalString;
		debtDrawn: DecimalString;
		interestDuringConstruction: DecimalString;
		commitmentFees: DecimalString;
		upfrontFee: DecimalString;
		/** Spend net of grants, financing costs during construction and reserves funded at COD. */
		totalFundingNeed: DecimalString;
		equityInvested: DecimalString;
		fundingOrder: 'equity-first' | 'pro-rata';
		/** Each sizing case: what its target allows, what binds it, and the DSCR each year under its energy. */
		sizingCases: {
			label: string;
			targetDscr: number;
			debtCapacity: DecimalString;
			limitedBy: 'repayment' | 'grace' | 'cfads';
			/** Sculpted on several cases: the loan years whose debt service this case's cover sets. */
			bindsInYears: number[];
			minDscr: DecimalString | null;
			dscr: (DecimalString | null)[];
		}[];
	};
	cashFlow: CashFlowRow[];
	metrics: Metrics<DecimalString>;
	/** Operating years of the loan with negative CFADS, and with a DSCR below 1: shown wherever the minimum DSCR is. */
	coverShortfalls: CoverShortfalls;
	warnings: string[];
};

export { decimalString };
const maybe = (d: Decimal | null | undefined) => (d === null || d === undefined ? null : decimalString(d));

const SPEND_WORDS = {
	'mid-year': 'in the middle of each construction year',
	quarterly: 'in the middle of each quarter of each construction year',
	monthly: 'in the middle of each month of each construction year',
	'year-end': 'at the end of each construction year'
} as const;

function timeConvention(spendTiming: keyof typeof SPEND_WORDS): string {
	return [
		't = 0 is the commercial operation date (COD); construction year rows end at t = -1, -2, ... and 0;',
		`construction spend and debt draws fall ${SPEND_WORDS[spendTiming]}, interest running to COD;`,
		'operating year k is at t = k (end of year). Amounts are nominal; NPV and IRR use each flow at its own time; NPV is valued at COD.'
	].join(' ');
}

function cashFlowRows(d: DetailedEvaluation): CashFlowRow[] {
	const { prep, operating: op, financing: fin } = d;
	const zero = '0';
	const rows: CashFlowRow[] = [];
	let project = new Decimal(0);
	let equity = new Decimal(0);
	const timeline = prep.timeline;
	const funding = fin.debt?.funding ?? null;
	const yearly = (values: readonly Decimal[] | undefined) =>
		values ? byConstructionYear(values, timeline) : timeline.constructionYearEnds.map(() => ZERO);
	const capex = yearly(prep.capex.nominal);
	const grants = yearly(prep.grants.nominal);
	const projectPreTax = yearly(op.projectPreTax.construction);
	const projectPostTax = yearly(op.projectPostTax.construction);
	const equityFlows = yearly(fin.equity.construction);
	const draws = yearly(funding?.draws);
	const interest = yearly(funding?.interest);
	const interestPaid = yearly(funding?.interestPaid);
	const fees = yearly(funding ? funding.commitmentFees.map((c, p) => (p === 0 ? c.plus(funding.upfrontFee) : c)) : undefined);
	const capitalise = fin.debt ? prep.scenario.finance.debt.sizing !== 'none' && prep.scenario.finance.debt.capitalizeInterestDuringConstruction : false;
	let balance = ZERO;
	const w = fin.waterfall;
	timeline.constructionYearEnds.forEach((t, j) => {
		project = project.plus(projectPreTax[j]);
		equity = equity.plus(equityFlows[j]);
		balance = balance.plus(draws[j]).plus(capitalise ? interest[j] : ZERO);
		rows.push({
			t,
			phase: 'construction',
			energyMWh: zero,
			pricePerMWh: zero,
			revenue: zero,
			opex: zero,
			ebitda: zero,
			capex: decimalString(capex[j]),
			grants: decimalString(grants[j]),
			decommissioning: zero,
			depreciation: zero,
			taxableIncome: zero,
			tax: zero,
			cfads: zero,
			debtDrawdown: decimalString(draws[j]),
			interest: decimalString(interest[j]),
			financingFees: decimalString(fees[j]),
			cashSweep: zero,
			debtServiceReserve: decimalString(w && j === timeline.constructionYears - 1 ? w.dsra.opening[0] : ZERO),
			maintenanceReserve: zero,
			decommissioningReserve: zero,
			lockedUpCash: zero,
			principal: zero,
			debtService: decimalString(interestPaid[j]),
			debtBalance: decimalString(balance),
			dscr: null,
			projectCashFlowPreTax: decimalString(projectPreTax[j]),
			projectCashFlowPostTax: decimalString(projectPostTax[j]),
			cumulativeProjectCashFlow: decimalString(project),
			equityCashFlow: decimalString(equityFlows[j]),
			cumulativeEquityCashFlow: decimalString(equity)
		});
	});
	if (fin.debt && rows.length > 0) rows[rows.length - 1].debtBalance = decimalString(fin.debt.balanceAtCod);
	prep.timeline.operatingTimes.forEach((t, k) => {
		project = project.plus(op.projectPostTax.operation[k]);
		equity = equity.plus(fin.equity.operation[k]);
		rows.push({
			t,
			phase: 'operation',
			energyMWh: decimalString(prep.energyMWh[k]),
			pricePerMWh: decimalString(op.pricePerMWh[k]),
			revenue: decimalString(op.revenue[k]),
			opex: decimalString(op.opex[k]),
			ebitda: decimalString(op.ebitda[k]),
			capex: zero,
			grants: zero,
			decommissioning: decimalString(op.decommissioning[k]),
			depreciation: decimalString(fin.depreciation[k]),
			taxableIncome: decimalString(fin.taxableIncome[k]),
			tax: decimalString(fin.tax[k]),
			cfads: decimalString(fin.cfads[k]),
			debtDrawdown: zero,
			interest: decimalString(fin.interest[k]),
			financingFees: zero,
			cashSweep: decimalString(w ? w.sweep[k] : ZERO),
			debtServiceReserve: decimalString(w ? w.dsra.closing[k] : ZERO),
			maintenanceReserve: decimalString(fin.costReserves.maintenance.balance[k]),
			decommissioningReserve: decimalString(fin.costReserves.decommissioning.balance[k]),
			lockedUpCash: decimalString(w ? w.lockUp.held[k] : ZERO),
			principal: decimalString(fin.principal[k]),
			debtService: decimalString(fin.debtService[k]),
			debtBalance: decimalString(fin.closingBalance[k]),
			dscr: maybe(d.dscr[k]),
			projectCashFlowPreTax: decimalString(op.projectPreTax.operation[k]),
			projectCashFlowPostTax: decimalString(op.projectPostTax.operation[k]),
			cumulativeProjectCashFlow: decimalString(project),
			equityCashFlow: decimalString(fin.equity.operation[k]),
			cumulativeEquityCashFlow: decimalString(equity)
		});
	});
	return rows;
}

function exceedanceRow(e: Exceedance): ExceedanceRow {
	return { label: `P${e.levelPercent}`, levelPercent: e.levelPercent, aepMWh: decimalString(e.aepMWh), shareOfP50: decimalString(e.factor) };
}

function financingSummary(d: DetailedEvaluation): NonNullable<EngineResult['financing']> {
	const debt = d.financing.debt!;
	const funding = debt.funding;
	const debtSpec = d.prep.scenario.finance.debt;
	const profiles = [{ label: 'P50', cfads: d.financing.cfads }, ...d.financing.downsideCfads];
	const sizingCases = debt.capacities.map((c) => {
		const cover = c.label === 'P50' ? coverOfRatios(d.dscr) : coverRatios(profiles.find((p) => p.label === c.label)?.cfads ?? [], d.financing.debtService);
		return {
			label: c.label,
			targetDscr: c.targetDscr,
			debtCapacity: decimalString(c.balance),
			limitedBy: c.limitedBy,
			bindsInYears: debt.bindingCases.flatMap((label, k) => (label === c.label ? [k + 1] : [])),
			minDscr: maybe(cover.min),
			dscr: cover.perYear.map(maybe)
		};
	});
	return {
		sizedBy: debt.sizedBy,
		governingCase: debt.governingCase,
		gearing: decimalString(debt.gearing),
		debtAmount: decimalString(debt.balanceAtCod),
		debtDrawn: decimalString(sum(funding.draws)),
		interestDuringConstruction: decimalString(funding.interestDuringConstruction),
		commitmentFees: decimalString(sum(funding.commitmentFees)),
		upfrontFee: decimalString(funding.upfrontFee),
		totalFundingNeed: decimalString(funding.totalFundingNeed),
		equityInvested: decimalString(sum(funding.equity)),
		fundingOrder: debtSpec.sizing === 'none' ? 'equity-first' : debtSpec.fundingOrder,
		sizingCases
	};
}

/** Turn a detailed evaluation into the plain-data result. */
export function toEngineResult(d: DetailedEvaluation): EngineResult {
	const { prep } = d;
	const { scenario, energy } = prep;
	const metrics = Object.fromEntries(METRIC_KEYS.map((k) => [k, maybe(d.metrics[k])])) as Metrics<DecimalString>;
	const debt = d.financing.debt;
	return {
		schemaVersion: 1,
		scenarioName: scenario.name,
		technology: scenario.technology,
		currency: scenario.currency,
		timeConvention: timeConvention(prep.timeline.spendTiming),
		energy: {
			deviceCount: scenario.array.deviceCount,
			ratedPowerPerDeviceKW: decimalString(energy.ratedPowerPerDeviceKW),
			installedCapacityKW: decimalString(energy.installedCapacityKW),
			meanDevicePowerKW: decimalString(energy.meanDevicePowerKW),
			grossAepMWh: decimalString(energy.grossAepMWh),
			lossFactor: decimalString(energy.lossFactor),
			netAepMWh: decimalString(energy.netAepMWh),
			curtailment: decimalString(new Decimal(scenario.revenue.curtailment)),
			curtailedAepMWh: decimalString(energy.netAepMWh.minus(prep.deliveredAepMWh)),
			deliveredAepMWh: decimalString(prep.deliveredAepMWh),
			combinedSigma: decimalString(energy.combinedSigma),
			exceedances: energy.exceedances.map(exceedanceRow),
			energySource: energy.energySource,
			sigmaLongTerm: decimalString(energy.uncertaintySplit.longTerm),
			sigmaInterAnnual: decimalString(energy.uncertaintySplit.interAnnual),
			exceedancesByHorizon: energy.exceedancesByHorizon.map((h) => ({
				horizonYears: h.horizonYears,
				sigma: decimalString(h.sigma),
				levels: h.levels.map(exceedanceRow)
			})),
			capacityFactor: maybe(energy.capacityFactor),
			bins: energy.bins.map((b) => ({
				...(b.speedMPerS ? { speedMPerS: decimalString(b.speedMPerS) } : {}),
				...(b.hsM ? { hsM: decimalString(b.hsM) } : {}),
				...(b.teS ? { teS: decimalString(b.teS) } : {}),
				...(b.fluxKWPerM ? { fluxKWPerM: decimalString(b.fluxKWPerM) } : {}),
				probability: decimalString(b.probability),
				hours: decimalString(b.hours),
				devicePowerKW: decimalString(b.devicePowerKW),
				arrayGrossEnergyMWh: decimalString(b.arrayGrossEnergyMWh)
			}))
		},
		costs: {
			capexRealTotal: decimalString(prep.capex.realTotal),
			capexLines: prep.capex.lines.map((l) => ({ name: l.name, realTotal: decimalString(l.realTotal) })),
			grantsRealTotal: decimalString(prep.grants.realTotal),
			decommissioningNominal: decimalString(prep.decommissioning)
		},
		rates: {
			inflation: decimalString(prep.inflation),
			tariffInflation: decimalString(prep.tariffInflation),
			realDiscountRate: decimalString(prep.realDiscountRate),
			nominalDiscountRate: decimalString(prep.nominalDiscountRate)
		},
		financing: debt ? financingSummary(d) : null,
		cashFlow: cashFlowRows(d),
		metrics,
		coverShortfalls: d.shortfalls,
		warnings: d.warnings
	};
}

/** Evaluate a validated scenario (see parseScenario) into plain data. */
export function evaluateScenario(scenario: Scenario): EngineResult {
	return toEngineResult(evaluateDetailed(scenario));
}
