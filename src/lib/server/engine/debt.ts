/**
 * Senior debt: sizing by gearing or by target DSCRs on one or more energy
 * cases, funding through construction (./construction-funding), and the
 * repayment schedule after COD. Amounts nominal; rates fractions per year.
 */
import { dec, Decimal, ONE, ZERO } from './decimal';
import { annuityLoan, sculptedLoan, straightLineLoan, type LoanRow } from './finance/loans';
import { npv } from './finance/discounting';
import { fundConstruction, type ConstructionFunding, type FundingSolution } from './construction-funding';
import type { Timeline } from './timeline';
import { operatingYearsList } from '../../metrics/cover-shortfalls';
import type { DebtSpec } from '../../schemas/scenario';

export type DebtTerms = Exclude<DebtSpec, { sizing: 'none' }>;
type DscrTerms = Extract<DebtTerms, { sizing: 'target-dscr' }>;

/** An energy case the debt is sized on: P50 at the main target, or a downside (P90, P99) at its own. */
export type SizingCase = {
	label: string;
	/** Exceedance level of its energy (null for P50). */
	exceedancePercent: number | null;
	horizonYears: number | null;
	targetDscr: number;
	/** CFADS under this case's energy, each operating year. */
	cfads: readonly Decimal[];
};

/** What one case allows: the balance at COD its target permits, and what binds it. */
export type CaseCapacity = {
	label: string;
	targetDscr: number;
	balance: Decimal;
	/** repayment: the repayment years' cover; grace: interest-only years' cover; cfads: CFADS not positive. */
	limitedBy: 'repayment' | 'grace' | 'cfads';
};

export type DebtStructure = {
	/** How the amount was set: the gearing, a target DSCR (see governingCase), or the gearing cap on a DSCR-sized loan. */
	sizedBy: 'gearing' | 'target-dscr' | 'gearing-cap';
	/** The case whose target set the debt, when sizedBy is target-dscr. */
	governingCase: string | null;
	/** Each case's capacity on its own, when sized by DSCR. */
	capacities: CaseCapacity[];
	/** Sculpted on several cases: the case whose cover sets each operating year's debt service (empty otherwise). */
	bindingCases: string[];
	/** The construction funding: draws, equity, interest and fees at each construction point. */
	funding: ConstructionFunding;
	/** Debt over the total funding need. */
	gearing: Decimal;
	/** Loan balance at COD, repaid over the tenor (the debt amount). */
	balanceAtCod: Decimal;
	/** One row per operating year (zeros after maturity). */
	rows: LoanRow[];
	debtService: Decimal[];
	warnings: string[];
};

export type DebtInputs = {
	terms: DebtTerms;
	timeline: Timeline;
	/** Construction spend net of grants at each construction point, nominal. */
	spend: readonly Decimal[];
	/** Energy cases, P50 first; gearing sizing reads only the first (for sculpting). */
	cases: readonly SizingCase[];
	/** A debt service reserve funded at COD from the funding, as a share of the loan (months/12 x first service per unit of debt). */
	reserveShareOfDebt?: Decimal;
	operatingYears: number;
	/** A previous round's funding solution to start from. */
	fundingStart?: FundingSolution;
	/**
	 * Whether to size each case on its own for the report (a loan sculpted on
	 * several cases is sized on their combination; each alone is only shown).
	 * Default true; the tax circle's inner rounds skip it.
	 */
	eachCase?: boolean;
};

function scheduleFor(repayment: 'annuity' | 'straight-line', principal: Decimal, terms: DebtTerms): LoanRow[] {
	const build = repayment === 'annuity' ? annuityLoan : straightLineLoan;
	return build(principal, terms.interestRate, terms.tenorYears, terms.graceYears);
}

function padRows(rows: LoanRow[], years: number): LoanRow[] {
	const out = rows.slice(0, years);
	for (let k = out.length; k < years; k++) out.push({ year: k + 1, opening: ZERO, interest: ZERO, principal: ZERO, closing: ZERO });
	return out;
}


/**
 * Largest balance at COD that one case's target DSCR allows over the whole
 * tenor, grace years included.
 *
 * Sculpted: debt service_k = CFADS_k / target over the repayment years, and
 * the balance is its present value at the loan rate (finance/loans
 * sculptedLoan); in grace years only interest is paid, so the balance may not
 * exceed CFADS_k / (target x rate) there either. Annuity or straight line:
 * service is proportional to the balance, so the largest balance is
 * min_k CFADS_k / (target x service_k per unit borrowed), grace years
 * (interest only) included.
 * Source: common practice in project-finance debt sizing.
 */
export function caseCapacity(
	terms: DscrTerms,
	sizingCase: SizingCase,
	warnings: string[],
	/** CFADS_k / target already worked out (see combinedCase), to divide only once. */
	allowance?: readonly Decimal[]
): CaseCapacity & { sculpted?: { rows: LoanRow[] } } {
	const { label, targetDscr, cfads } = sizingCase;
	const tenorCfads = cfads.slice(0, terms.tenorYears);
	const nonPositive = tenorCfads.flatMap((c, k) => (c.lte(0) ? [k + 1] : []));
	const under = sizingCase.exceedancePercent === null ? '' : ` under the ${label} energy`;
	const rate = dec(terms.interestRate);
	if (terms.repayment === 'sculpted') {
		if (nonPositive.length > 0) warnings.push(`CFADS${under} is not positive in ${operatingYearsList(nonPositive)}: no debt is repaid then.`);
		// max(CFADS, 0) / target = max(CFADS / target, 0): the same debt service from the allowance at cover 1.
		const sculpted = allowance ? sculptedLoan(allowance, 1, rate, terms.tenorYears, terms.graceYears) : sculptedLoan(cfads, targetDscr, rate, terms.tenorYears, terms.graceYears);
		let graceCap: Decimal | null = null;
		if (rate.gt(0)) for (let k = 0; k < terms.graceYears; k++) {
			const cap = Decimal.max(tenorCfads[k], ZERO).div(rate.times(targetDscr));
			if (graceCap === null || cap.lt(graceCap)) graceCap = cap;
		}
		if (graceCap !== null && graceCap.lt(sculpted.principal)) return { label, targetDscr, balance: graceCap, limitedBy: 'grace' };
		return { label, targetDscr, balance: sculpted.principal, limitedBy: 'repayment', sculpted };
	}
	if (nonPositive.length > 0) {
		warnings.push(`Debt cannot be sized to a DSCR${under}: CFADS is not positive in ${operatingYearsList(nonPositive)}.`);
		return { label, targetDscr, balance: ZERO, limitedBy: 'cfads' };
	}
	const unit = scheduleFor(terms.repayment, ONE, terms);
	let best: Decimal | null = null;
	let bindsInGrace = false;
	unit.forEach((row, k) => {
		const service = row.interest.plus(row.principal);
		if (service.lte(0)) return;
		const allowed = tenorCfads[k].div(service.times(targetDscr));
		if (best === null || allowed.lt(best)) {
			best = allowed;
			bindsInGrace = k < terms.graceYears;
		}
	});
	return { label, targetDscr, balance: best ?? ZERO, limitedBy: bindsInGrace ? 'grace' : 'repayment' };
}

/**
 * Several cases on one sculpted loan: in each year the debt service may not
 * exceed CFADS_case / target_case for any case, so the loan is sculpted at
 * cover 1 to min over cases of CFADS_case,k / target_case. Every case then
 * covers at least its target every year, and the case that binds a year
 * covers exactly its target. Source: common practice (sculpting to the
 * lesser of the P50 and P90 debt service each period).
 */
function combinedCase(cases: readonly SizingCase[], tenorYears: number, allowances?: readonly (readonly Decimal[])[]): { sizingCase: SizingCase; binding: string[] } {
	const years = cases[0].cfads.length;
	const binding: string[] = [];
	const cfads = Array.from({ length: years }, (_, k) => {
		let least: Decimal | null = null;
		let label = cases[0].label;
		for (const [i, c] of cases.entries()) {
			const allowed = allowances ? allowances[i][k] : c.cfads[k].div(c.targetDscr);
			if (least === null || allowed.lt(least)) {
				least = allowed;
				label = c.label;
			}
		}
		if (k < tenorYears) binding.push(label);
		return least!;
	});
	return { sizingCase: { label: 'combined', exceedancePercent: null, horizonYears: null, targetDscr: 1, cfads }, binding };
}

function mostFrequent(labels: readonly string[]): string | null {
	const counts = new Map<string, number>();
	for (const l of labels) counts.set(l, (counts.get(l) ?? 0) + 1);
	let best: string | null = null;
	for (const [label, count] of counts) if (best === null || count > counts.get(best)!) best = label;
	return best;
}

/** Repayment rows for a given balance at COD, sculpted to the given CFADS profile when the repayment is sculpted. */
function repaymentRows(terms: DebtTerms, balance: Decimal, cfads: readonly Decimal[], warnings: string[]): LoanRow[] {
	if (balance.isZero()) return [];
	if (terms.repayment !== 'sculpted') return scheduleFor(terms.repayment, balance, terms);
	// Sculpting is linear in CFADS / DSCR. At DSCR 1 the loan would be the present value, at the end of
	// grace, of the repayment years' CFADS; scaling CFADS by balance / that value sculpts exactly this balance.
	const repaymentCfads = cfads.slice(terms.graceYears, terms.tenorYears).map((c) => Decimal.max(c, ZERO));
	const perUnitCover = npv(terms.interestRate, [ZERO, ...repaymentCfads]);
	if (perUnitCover.lte(0)) {
		warnings.push('Repayment cannot be sculpted: CFADS is not positive over the tenor; an annuity is used instead.');
		return scheduleFor('annuity', balance, terms);
	}
	const scale = balance.div(perUnitCover);
	const scaled = cfads.map((c) => c.times(scale));
	return sculptedLoan(scaled, ONE, terms.interestRate, terms.tenorYears, terms.graceYears).rows;
}

/**
 * Size, fund and schedule the loan.
 *
 *     gearing sizing:     D = gearing x U
 *     target-DSCR sizing: D = min(min over cases of D*_case, max gearing x U)
 *
 * U is the total funding need (spend net of grants, interest and fees during
 * construction, a reserve funded at COD), D the balance at COD; the two are
 * solved together by fundConstruction. Each case's D*_case is caseCapacity at
 * its own target on its own CFADS; the least governs, and a sculpted loan is
 * sculpted to the governing case's CFADS, so that case's DSCR equals its
 * target in every repayment year (when neither grace years nor the cap bind).
 * Source: common practice in project finance (lenders size on P50 and on P90
 * or P99 energy, each with its own cover, and take the lesser).
 */
export function structureDebt({ terms, timeline, spend, cases, reserveShareOfDebt = ZERO, operatingYears, fundingStart, eachCase = true }: DebtInputs): DebtStructure {
	const warnings: string[] = [];
	let capacities: (CaseCapacity & { sculpted?: { rows: LoanRow[] } })[] = [];
	let governing: (CaseCapacity & { sculpted?: { rows: LoanRow[] } }) | null = null;
	let dscrLimit: Decimal | null = null;
	let profile: readonly Decimal[] = cases[0]?.cfads ?? [];
	let bindingCases: string[] = [];
	if (terms.sizing === 'target-dscr') {
		const combine = terms.repayment === 'sculpted' && cases.length > 1;
		// Sized on their combination and each alone: CFADS / target divided once for both.
		const allowances = combine && eachCase ? cases.map((c) => c.cfads.map((x) => x.div(c.targetDscr))) : undefined;
		if (eachCase || !combine) capacities = cases.map((c, i) => caseCapacity(terms, c, warnings, allowances?.[i]));
		for (const c of capacities) if (governing === null || c.balance.lt(governing.balance)) governing = c;
		if (combine) {
			// Sculpted on several cases: each year's service is the least any case's cover allows that year.
			const combined = combinedCase(cases, terms.tenorYears, allowances);
			bindingCases = combined.binding;
			governing = { ...caseCapacity(terms, combined.sizingCase, eachCase ? [] : warnings), label: mostFrequent(combined.binding.slice(terms.graceYears)) ?? cases[0].label };
			profile = combined.sizingCase.cfads;
		} else if (governing) {
			profile = cases.find((c) => c.label === governing!.label)!.cfads;
		}
		dscrLimit = governing ? governing.balance : ZERO;
	}
	const share = dec(terms.sizing === 'gearing' ? terms.gearing : terms.maxGearing);
	const debtFor = (need: Decimal) => (dscrLimit === null ? need.times(share) : Decimal.min(dscrLimit, need.times(share)));
	const funding = fundConstruction({
		times: timeline.constructionTimes,
		financialClose: timeline.financialClose,
		spend,
		reserveAtCod: ZERO,
		reserveShareOfDebt,
		rate: dec(terms.interestRate),
		commitmentFee: dec(terms.commitmentFee),
		upfrontFee: dec(terms.upfrontFee),
		capitaliseInterest: terms.capitalizeInterestDuringConstruction,
		order: terms.fundingOrder,
		debtFor,
		start: fundingStart
	});
	if (!funding.settled) warnings.push('The construction funding did not settle; the debt amount may be slightly off.');
	const balanceAtCod = funding.balanceAtCod;
	const capped = dscrLimit !== null && funding.totalFundingNeed.times(share).lt(dscrLimit);
	const sizedBy: DebtStructure['sizedBy'] = terms.sizing === 'gearing' ? 'gearing' : capped ? 'gearing-cap' : 'target-dscr';
	const sculptedRows = sizedBy === 'target-dscr' ? governing?.sculpted?.rows : undefined;
	const exact = sculptedRows && sculptedRows.length > 0 ? sculptedRows : null;
	const rows = padRows(exact ?? repaymentRows(terms, balanceAtCod, profile, warnings), operatingYears);
	return {
		sizedBy,
		governingCase: sizedBy === 'target-dscr' ? (governing?.label ?? null) : null,
		capacities: capacities.map(({ label, targetDscr, balance, limitedBy }) => ({ label, targetDscr, balance, limitedBy })),
		bindingCases,
		funding,
		gearing: funding.gearing,
		balanceAtCod: exact ? exact[0].opening : balanceAtCod,
		rows,
		debtService: rows.map((r) => r.interest.plus(r.principal)),
		warnings
	};
}
