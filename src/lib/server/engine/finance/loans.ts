/**
 * Senior-debt repayment schedules, one row per year of the loan.
 *
 * Every schedule follows the same balance identity each year:
 *
 *     interest  = opening * rate
 *     closing   = opening - principal
 *     debt service = interest + principal
 *
 * Amounts are positive currency units (money the borrower pays is positive
 * here, unlike the sign convention of annuity.ts); rate is a fraction per
 * year; years count from 1 (the first year after drawdown, the end of which
 * is the first payment). Grace years are interest-only. The last repayment row
 * repays exactly its opening balance, so the loan closes at 0 whatever the
 * decimal rounding of earlier rows.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from '../decimal';
import { capitalRecoveryFactor } from './annuity';

export type LoanRow = { year: number; opening: Decimal; interest: Decimal; principal: Decimal; closing: Decimal };

function checkedPrincipal(principal: DecimalInput): Decimal {
	const p = dec(principal);
	if (!p.isFinite() || p.isNegative()) throw new RangeError(`principal must be >= 0, got ${p.toString()}`);
	return p;
}

function checkedRate(rate: DecimalInput): Decimal {
	const r = dec(rate);
	if (!r.isFinite() || r.lte(-1)) {
		throw new RangeError(`interest rate must be a finite fraction greater than -1, got ${r.toString()}`);
	}
	return r;
}

/** Years of repayment after grace; tenor and grace must be whole years with tenor > grace. */
function repaymentYears(tenorYears: number, graceYears: number): number {
	if (!Number.isInteger(tenorYears) || tenorYears < 1) {
		throw new RangeError(`tenor must be a positive whole number of years, got ${tenorYears}`);
	}
	if (!Number.isInteger(graceYears) || graceYears < 0) {
		throw new RangeError(`grace must be a whole number of years >= 0, got ${graceYears}`);
	}
	if (tenorYears <= graceYears) {
		throw new RangeError(`tenor (${tenorYears} years) must be longer than grace (${graceYears} years)`);
	}
	return tenorYears - graceYears;
}

/**
 * Rows from a rule for each year's principal repayment. `repay(year, opening,
 * interest)` is called for years after grace; the final year repays the
 * opening balance.
 */
function schedule(
	principal: Decimal,
	rate: Decimal,
	tenorYears: number,
	graceYears: number,
	repay: (year: number, opening: Decimal, interest: Decimal) => Decimal
): LoanRow[] {
	const rows: LoanRow[] = [];
	let opening = principal;
	for (let year = 1; year <= tenorYears; year++) {
		const interest = opening.times(rate);
		let repaid: Decimal;
		if (year <= graceYears) repaid = ZERO;
		else if (year === tenorYears) repaid = opening;
		else repaid = repay(year, opening, interest);
		const closing = opening.minus(repaid);
		rows.push({ year, opening, interest, principal: repaid, closing });
		opening = closing;
	}
	return rows;
}

/**
 * Annuity (mortgage-style) loan: interest only in the grace years, then a level
 * debt service over the remaining n = tenor - grace years.
 *
 *     debt service = principal * CRF(rate, n) = principal * rate / (1 - (1 + rate)^-n)
 *     principal_k  = debt service - opening_k * rate
 *
 * At rate 0 the debt service is principal / n. Units: currency per year.
 * Source: standard annuity amortisation (numpy-financial ppmt / ipmt).
 *
 * Example (numpy-financial's amortisation example, monthly: 2500 at 8.24 %/12 over 12 months):
 *
 *     annuityLoan(2500, 0.0824 / 12, 12)[0]
 *     // => { year: 1, opening: 2500, interest: 17.1666..., principal: 200.5819..., closing: 2299.418... }
 *
 * @throws RangeError when principal < 0, rate <= -1, or tenor and grace are not
 *   whole years with tenor > grace >= 0.
 */
export function annuityLoan(
	principal: DecimalInput,
	rate: DecimalInput,
	tenorYears: number,
	graceYears = 0
): LoanRow[] {
	const p = checkedPrincipal(principal);
	const r = checkedRate(rate);
	const n = repaymentYears(tenorYears, graceYears);
	const debtService = p.times(capitalRecoveryFactor(r, n));
	return schedule(p, r, tenorYears, graceYears, (_year, _opening, interest) => debtService.minus(interest));
}

/**
 * Straight-line (equal principal) loan: interest only in the grace years, then
 * equal principal repayments over the remaining n = tenor - grace years, with
 * interest on the declining balance.
 *
 *     principal_k = principal / n,   interest_k = opening_k * rate
 *
 * Units: currency per year. Source: common practice (bullet-free term loans).
 *
 * Example: 1000 at 10 % over 4 years repays 250 a year with interest 100, 75, 50, 25:
 *
 *     straightLineLoan(1000, 0.1, 4).map((row) => row.interest)  // => [100, 75, 50, 25]
 *
 * @throws RangeError as annuityLoan.
 */
export function straightLineLoan(
	principal: DecimalInput,
	rate: DecimalInput,
	tenorYears: number,
	graceYears = 0
): LoanRow[] {
	const p = checkedPrincipal(principal);
	const r = checkedRate(rate);
	const n = repaymentYears(tenorYears, graceYears);
	const instalment = p.div(n);
	return schedule(p, r, tenorYears, graceYears, () => instalment);
}

/**
 * Loan sculpted to cash flow: the debt service of every repayment year is the
 * cash flow available for debt service divided by the target cover ratio, and
 * the loan is the amount that this debt service repays exactly by maturity.
 *
 *     DS_k = max(CFADS_k, 0) / targetDscr                  for k = grace+1 .. tenor
 *     principal = sum_{j=1}^{n} DS_{grace+j} / (1 + rate)^j,  n = tenor - grace
 *
 * i.e. the present value of the debt service at the loan rate, taken at the end
 * of the grace period (the balance does not change in grace years, whose
 * interest is paid from CFADS; their DSCR is CFADS / interest and is not
 * sculpted). Each repayment year then repays principal_k = DS_k - interest_k,
 * so DSCR_k = CFADS_k / DS_k = targetDscr and the balance reaches 0 at
 * maturity. A year with CFADS <= 0 has no debt service: its interest is added
 * to the balance (principal_k is negative that year).
 *
 * cfads[0] is operating year 1. Units: CFADS and amounts in currency per year,
 * targetDscr dimensionless (e.g. 1.3), rate a fraction per year.
 * Source: common practice in project finance (debt sculpting).
 *
 * Example: CFADS 130 a year and a target of 1.30 give debt service 100 a year,
 * the same loan as an annuity of 100 a year:
 *
 *     sculptedLoan([130, 130, 130].map(dec), 1.3, 0.1, 3).principal  // => 248.685199098422...
 *
 * @throws RangeError when targetDscr <= 0, there are fewer CFADS years than the
 *   tenor, or rate, tenor and grace are invalid as for annuityLoan.
 */
export function sculptedLoan(
	cfads: readonly Decimal[],
	targetDscr: DecimalInput,
	rate: DecimalInput,
	tenorYears: number,
	graceYears = 0
): { principal: Decimal; rows: LoanRow[] } {
	const r = checkedRate(rate);
	const n = repaymentYears(tenorYears, graceYears);
	const target = dec(targetDscr);
	if (!target.isFinite() || target.lte(0)) throw new RangeError(`target DSCR must be positive, got ${target.toString()}`);
	if (cfads.length < tenorYears) {
		throw new RangeError(`sculpting over ${tenorYears} years needs CFADS for each, got ${cfads.length}`);
	}

	const debtService = new Array<Decimal>(tenorYears).fill(ZERO);
	// A target of 1 divides nothing (a loan sculpted to a combined or scaled profile).
	const unit = target.eq(1);
	for (let year = graceYears + 1; year <= tenorYears; year++) {
		const cover = Decimal.max(dec(cfads[year - 1]), ZERO);
		debtService[year - 1] = unit ? cover : cover.div(target);
	}

	// Present value at the end of grace by Horner's rule in v = 1 / (1 + r).
	const v = ONE.div(ONE.plus(r));
	let principal = ZERO;
	for (let j = n; j >= 1; j--) principal = principal.plus(debtService[graceYears + j - 1]).times(v);

	if (principal.lte(0)) {
		principal = ZERO;
		debtService.fill(ZERO);
	}
	// The rows are worked out when first read: sizing often needs only the principal.
	let rows: LoanRow[] | undefined;
	const scheduled = () => schedule(principal, r, tenorYears, graceYears, (year, _opening, interest) => debtService[year - 1].minus(interest));
	return {
		principal,
		get rows() {
			return (rows ??= scheduled());
		}
	};
}

/**
 * Schedule of a loan repaid by given yearly debt service (interest first, the
 * rest reduces the balance).
 *
 *     interest_k = opening_k * rate,  principal_k = DS_k - interest_k,  closing_k = opening_k - principal_k
 *
 * The balance is not forced to 0: the last row's closing balance is what the
 * given debt service leaves unpaid (negative if it overpays). Debt service
 * below the interest adds to the balance. One row per debt-service value.
 * Units: currency per year. Source: standard loan amortisation.
 *
 * Example: 1000 at 10 % repaid by 600 then 550:
 *
 *     loanFromDebtService(1000, 0.1, [dec(600), dec(550)]).map((row) => row.closing)  // => [500, 0]
 *
 * @throws RangeError when principal < 0 or rate <= -1.
 */
export function loanFromDebtService(
	principal: DecimalInput,
	rate: DecimalInput,
	debtService: readonly DecimalInput[]
): LoanRow[] {
	let opening = checkedPrincipal(principal);
	const r = checkedRate(rate);
	return debtService.map((payment, index) => {
		const interest = opening.times(r);
		const repaid = dec(payment).minus(interest);
		const closing = opening.minus(repaid);
		const row = { year: index + 1, opening, interest, principal: repaid, closing };
		opening = closing;
		return row;
	});
}
