/**
 * Senior debt: drawdowns during construction, interest during construction,
 * sizing by gearing or by a target DSCR, and the repayment schedule after COD.
 * Amounts nominal; rates fractions per year.
 */
import { dec, Decimal, ONE, ZERO } from './decimal';
import { annuityLoan, sculptedLoan, straightLineLoan, type LoanRow } from './finance/loans';
import { npv } from './finance/discounting';
import type { DebtSpec } from '../../schemas/scenario';

export type DebtTerms = Exclude<DebtSpec, { sizing: 'none' }>;

export type DebtStructure = {
	/** How the amount was set: the gearing, the target DSCR, or the gearing cap on a DSCR-sized loan. */
	sizedBy: 'gearing' | 'target-dscr' | 'gearing-cap';
	/** Share of construction spend (capex net of grants) drawn as debt. */
	drawShare: Decimal;
	/** Debt drawn in each construction year. */
	draws: Decimal[];
	/** Interest during construction: capitalised into the balance, or paid by equity. */
	interestDuringConstruction: Decimal;
	/** Interest paid by equity in each construction year (zero when capitalised). */
	interestPaidInConstruction: Decimal[];
	/** Loan balance at COD, repaid over the tenor (the debt amount). */
	balanceAtCod: Decimal;
	/** Upfront fee paid by equity at financial close (first construction year). */
	upfrontFee: Decimal;
	/** One row per operating year (zeros after maturity). */
	rows: LoanRow[];
	debtService: Decimal[];
	warnings: string[];
};

export type DebtInputs = {
	terms: DebtTerms;
	/** Nominal capex net of grants in each construction year. */
	fundingNeed: readonly Decimal[];
	/** Cash flow available for debt service in each operating year. */
	cfads: readonly Decimal[];
	operatingYears: number;
};

/**
 * Growth of one unit drawn in construction year j by COD when interest is
 * capitalised: (1 + r)^(-t_j) = (1 + r)^(C - 1 - j); 1 when interest is paid.
 */
function capitalisationFactors(rate: Decimal, years: number, capitalise: boolean): Decimal[] {
	const factors: Decimal[] = new Array(years);
	let f = ONE;
	const step = ONE.plus(rate);
	for (let j = years - 1; j >= 0; j--) {
		factors[j] = f;
		if (capitalise) f = f.times(step);
	}
	return factors;
}

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
 * Largest balance at COD that the target DSCR allows, with the sculpted rows
 * when the repayment is sculpted (they are the schedule if the cap does not bind).
 *
 * Sculpted: debt service_k = CFADS_k / target over the repayment years, and the
 * balance is its present value at the loan rate (finance/loans sculptedLoan).
 * Annuity or straight line: service is proportional to the balance, so the
 * largest balance is min_k CFADS_k / (target x service_k per unit borrowed).
 * Source: common practice in project-finance debt sizing.
 */
function dscrSizedBalance(
	terms: Extract<DebtTerms, { sizing: 'target-dscr' }>,
	cfads: readonly Decimal[],
	warnings: string[]
): { balance: Decimal; sculptedRows?: LoanRow[] } {
	const tenorCfads = cfads.slice(0, terms.tenorYears);
	const nonPositive = tenorCfads.findIndex((c) => c.lte(0));
	if (terms.repayment === 'sculpted') {
		if (nonPositive >= 0) warnings.push(`CFADS is not positive in operating year ${nonPositive + 1}: no debt is repaid that year.`);
		const sculpted = sculptedLoan(cfads, terms.targetDscr, terms.interestRate, terms.tenorYears, terms.graceYears);
		return { balance: sculpted.principal, sculptedRows: sculpted.rows };
	}
	if (nonPositive >= 0) {
		warnings.push(`Debt cannot be sized to a DSCR: CFADS is not positive in operating year ${nonPositive + 1}.`);
		return { balance: ZERO };
	}
	const unit = scheduleFor(terms.repayment, ONE, terms);
	let best: Decimal | null = null;
	unit.forEach((row, k) => {
		const service = row.interest.plus(row.principal);
		if (service.lte(0)) return;
		const allowed = tenorCfads[k].div(service.times(terms.targetDscr));
		if (best === null || allowed.lt(best)) best = allowed;
	});
	return { balance: best ?? ZERO };
}

/** Repayment rows for a given balance at COD. */
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
 * Size and schedule the loan.
 *
 *     draws_j = s x F_j                         (F_j: capex net of grants, nominal)
 *     B_COD   = sum_j draws_j x (1 + r)^(-t_j)  (interest capitalised; plain sum when paid)
 *     gearing sizing:     s = gearing
 *     target-DSCR sizing: s = min(B*_DSCR / sum_j F_j (1 + r)^(-t_j), max gearing)
 *     upfront fee = fee x B_COD, paid at financial close by equity
 *
 * When interest is not capitalised, equity pays r x (balance drawn before t)
 * at each construction t. Source: common practice in project finance.
 */
export function structureDebt({ terms, fundingNeed, cfads, operatingYears }: DebtInputs): DebtStructure {
	const warnings: string[] = [];
	const rate = dec(terms.interestRate);
	const years = fundingNeed.length;
	const growth = capitalisationFactors(rate, years, terms.capitalizeInterestDuringConstruction);
	let balancePerShare = ZERO;
	fundingNeed.forEach((f, j) => (balancePerShare = balancePerShare.plus(f.times(growth[j]))));

	let drawShare: Decimal;
	let sizedBy: DebtStructure['sizedBy'] = 'gearing';
	let sizedRows: LoanRow[] | undefined;
	if (terms.sizing === 'gearing') drawShare = dec(terms.gearing);
	else {
		const wanted = dscrSizedBalance(terms, cfads, warnings);
		const wantedShare = balancePerShare.isZero() ? ZERO : wanted.balance.div(balancePerShare);
		if (wantedShare.gt(terms.maxGearing)) {
			drawShare = dec(terms.maxGearing);
			sizedBy = 'gearing-cap';
		} else {
			drawShare = wantedShare;
			sizedBy = 'target-dscr';
			sizedRows = wanted.sculptedRows;
		}
	}

	const draws = fundingNeed.map((f) => f.times(drawShare));
	let drawn = ZERO;
	for (const d of draws) drawn = drawn.plus(d);
	const balanceAtCod = sizedRows && sizedRows.length > 0 ? sizedRows[0].opening : balancePerShare.times(drawShare);
	const interestPaidInConstruction: Decimal[] = new Array(years);
	let outstanding = ZERO;
	draws.forEach((d, j) => {
		interestPaidInConstruction[j] = terms.capitalizeInterestDuringConstruction ? ZERO : outstanding.times(rate);
		outstanding = outstanding.plus(d);
	});
	const interestDuringConstruction = terms.capitalizeInterestDuringConstruction
		? balanceAtCod.minus(drawn)
		: interestPaidInConstruction.reduce((a, b) => a.plus(b), ZERO);

	const rows = padRows(sizedRows ?? repaymentRows(terms, balanceAtCod, cfads, warnings), operatingYears);
	return {
		sizedBy,
		drawShare,
		draws,
		interestDuringConstruction,
		interestPaidInConstruction,
		balanceAtCod,
		upfrontFee: balanceAtCod.times(terms.upfrontFee),
		rows,
		debtService: rows.map((r) => r.interest.plus(r.principal)),
		warnings
	};
}
