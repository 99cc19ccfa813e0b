/**
 * The operating-period cash waterfall after CFADS: senior debt service on the
 * actual balance, the debt service reserve account (DSRA), the DSCR covenants
 * (lock-up and default), the cash sweep, and what is left for distribution.
 *
 * Each operating year, in order (E. R. Yescombe, Principles of Project
 * Finance, 2002, section 13.5: the cash flow cascade, reserve accounts,
 * controls on distributions, cash sweep):
 *
 *   1. interest on the actual opening balance;
 *   2. the scheduled principal, capped at the balance (a sweep in an earlier
 *      year repays the loan sooner; the schedule is not re-cut);
 *   3. the DSRA is drawn to cover a shortfall of CFADS below that debt service,
 *      then topped up from the cash left towards its target of months / 12 x
 *      next year's debt service, or released down to it when the target falls
 *      (zero once the loan is repaid, so it is released at final maturity);
 *   4. the DSCR (CFADS / debt service) is tested against the lock-up level
 *      (distributions stop, the cash is held) and the default level (flagged);
 *   5. the cash sweep prepays the loan with a share of the cash otherwise
 *      distributable (or of the cash trapped, for a sweep in lock-up);
 *   6. what remains is distributed; cash held in lock-up is released in the
 *      first later year that passes the test, or at final maturity.
 *
 * A shortfall the DSRA cannot cover is met first from cash held in lock-up (it
 * is still the company's), then counts as unpaid debt service: the schedule
 * is kept, the distribution goes negative by that amount (the sponsors pay
 * it) and a warning names the years. Reserves and held cash earn nothing.
 * With no DSRA and no covenants the waterfall reproduces the loan rows and
 * distribution_k = CFADS_k - debt service_k, the model without reserves.
 *
 * Amounts nominal; index k = 0 is operating year 1. Source: DSRA target and
 * funding as in R. Wärnelid, "Debt Service Reserve Account (DSRA)", Mazars
 * financial modelling (2015) and E. Bodmer, "Debt service reserve accounts"
 * (edbodmer.com); covenants and sweep as in E. Bodmer, Corporate and Project
 * Finance Modeling (Wiley 2014), ch. 46; the rest common practice.
 */
import { operatingYearsList } from '../../metrics/cover-shortfalls';
import { dec, Decimal, sum, ZERO, type DecimalInput } from './decimal';
import type { LoanRow } from './finance/loans';
import type { CovenantsSpec, ReservesSpec } from '../../schemas/scenario';

export type DebtServiceReserveSpec = NonNullable<ReservesSpec['debtService']>;

export type WaterfallInputs = {
	/** CFADS per operating year, already net of the cost reserves (./reserves). */
	cfads: readonly Decimal[];
	/** The scheduled loan rows, one per operating year (missing years: no scheduled repayment). */
	loanRows: readonly LoanRow[];
	/** The loan's interest rate per year (fraction). */
	interestRate: DecimalInput;
	/** finance.reserves.debtService; undefined: no DSRA. */
	debtServiceReserve?: DebtServiceReserveSpec;
	/**
	 * DSRA balance at COD. Default: debtServiceReserveAtCod(spec, loanRows)
	 * when funded from funding, 0 when filled from cash flow.
	 */
	dsraAtCod?: Decimal;
	/** finance.covenants; undefined: none. */
	covenants?: CovenantsSpec;
};

export type AccountColumns = { opening: Decimal[]; draw: Decimal[]; contribution: Decimal[]; release: Decimal[]; closing: Decimal[] };

export type WaterfallResult = {
	openingBalance: Decimal[];
	interest: Decimal[];
	/** Scheduled principal actually paid (capped at the balance); negative when interest is added to the loan. */
	principal: Decimal[];
	/** Prepayment by the cash sweep. */
	sweep: Decimal[];
	closingBalance: Decimal[];
	/** interest + principal (the sweep is a prepayment, not debt service). */
	debtService: Decimal[];
	/** CFADS / debt service; null in a year without debt service. */
	dscr: (Decimal | null)[];
	/** DSRA: opening, draw, contribution (top-up), release and closing, plus its target after the year. */
	dsra: AccountColumns & { target: Decimal[] };
	/** Cash held by the lock-up: trapped this year, applied to a shortfall, released, and held at the year's end. */
	lockUp: { trapped: Decimal[]; applied: Decimal[]; released: Decimal[]; held: Decimal[] };
	lockedUp: boolean[];
	belowDefault: boolean[];
	/** Debt service neither CFADS nor the DSRA nor held cash could pay (met by the sponsors). */
	unpaidDebtService: Decimal[];
	/** To equity; negative when the sponsors put money in. */
	distribution: Decimal[];
	yearsInLockUp: number;
	/** 1-based operating years. */
	lockUpYears: number[];
	defaultYears: number[];
	unpaidYears: number[];
	warnings: string[];
};

/**
 * DSRA target at COD: months / 12 x the first operating year's scheduled debt
 * service (interest + principal of loanRows[0], at least 0). The amount the
 * construction funding must provide when the DSRA is funded from funding.
 * Source: Wärnelid (2015), "funded in full on the last day of construction".
 *
 * Example: 6 months of a first-year debt service of 130 is 65.
 */
export function debtServiceReserveAtCod(spec: DebtServiceReserveSpec, loanRows: readonly LoanRow[]): Decimal {
	const first = loanRows[0];
	if (!first) return ZERO;
	return Decimal.max(first.interest.plus(first.principal), ZERO).times(spec.months).div(12);
}


function column(years: number): Decimal[] {
	return Array.from({ length: years }, () => ZERO);
}

/**
 * Run the waterfall over the operating years (see the module comment for the
 * order and the equations).
 *
 *     interest_k  = B_{k-1} r;   principal_k = min(scheduled_k, B_{k-1});   DS_k = interest_k + principal_k
 *     draw_k      = min(DSRA_{k-1}, max(DS_k - max(CFADS_k, 0), 0))
 *     target_k    = months / 12 x DS_{k+1}, on the balance after principal_k (0 once it is repaid)
 *     DSCR_k      = CFADS_k / DS_k;  lock-up when DSCR_k < lockUpDscr;  default when DSCR_k < defaultDscr
 *     sweep_k     = min(share x cash, B_{k-1} - principal_k);   B_k = B_{k-1} - principal_k - sweep_k
 *     distribution_k = CFADS_k - DS_k + draw_k - top-up_k + release_k - sweep_k - trapped_k + released_k
 *
 * @throws RangeError when a DSRA balance at COD is given without a DSRA, or is negative.
 */
export function runWaterfall(inputs: WaterfallInputs): WaterfallResult {
	const { cfads, loanRows, debtServiceReserve: reserveSpec, covenants } = inputs;
	const n = cfads.length;
	const rate = dec(inputs.interestRate);
	if (inputs.dsraAtCod !== undefined && !reserveSpec && !inputs.dsraAtCod.isZero()) {
		throw new RangeError('a DSRA balance at COD needs a debt service reserve (finance.reserves.debtService)');
	}
	if (inputs.dsraAtCod?.isNegative()) throw new RangeError(`the DSRA balance at COD must be >= 0, got ${inputs.dsraAtCod.toString()}`);
	const reserveMonths = reserveSpec ? dec(reserveSpec.months).div(12) : ZERO;
	const lockUpDscr = covenants?.lockUpDscr;
	const defaultDscr = covenants?.defaultDscr;
	const sweepSpec = covenants?.cashSweep;

	/** Scheduled principal of year k on an actual opening balance: capped at it; a negative one (interest added) keeps debt service >= 0. */
	const scheduledPrincipal = (k: number, opening: Decimal, interest: Decimal): Decimal => {
		const row = loanRows[k];
		if (!row) return ZERO;
		if (row.principal.isNegative()) return Decimal.max(row.principal, interest.neg());
		return Decimal.min(row.principal, Decimal.max(opening, ZERO));
	};
	// Next year's interest on a balance, kept: without a sweep that balance opens next year and its interest is the same.
	let known: { balance: Decimal; interest: Decimal } | null = null;
	const interestOn = (balance: Decimal): Decimal => {
		if (known?.balance !== balance) known = { balance, interest: balance.times(rate) };
		return known.interest;
	};
	const debtServiceNextYear = (k: number, balance: Decimal): Decimal => {
		if (k + 1 >= n || balance.lte(0)) return ZERO;
		const interest = interestOn(balance);
		return Decimal.max(interest.plus(scheduledPrincipal(k + 1, balance, interest)), ZERO);
	};
	/** a + b and a - b, skipping the many zeros of the accounts (the same values, without decimal work). */
	const more = (a: Decimal, b: Decimal) => (b.isZero() ? a : a.isZero() ? b : a.plus(b));
	const less = (a: Decimal, b: Decimal) => (b.isZero() ? a : a.minus(b));

	const out: WaterfallResult = {
		openingBalance: column(n),
		interest: column(n),
		principal: column(n),
		sweep: column(n),
		closingBalance: column(n),
		debtService: column(n),
		dscr: Array.from({ length: n }, () => null),
		dsra: { opening: column(n), draw: column(n), contribution: column(n), release: column(n), closing: column(n), target: column(n) },
		lockUp: { trapped: column(n), applied: column(n), released: column(n), held: column(n) },
		lockedUp: Array.from({ length: n }, () => false),
		belowDefault: Array.from({ length: n }, () => false),
		unpaidDebtService: column(n),
		distribution: column(n),
		yearsInLockUp: 0,
		lockUpYears: [],
		defaultYears: [],
		unpaidYears: [],
		warnings: []
	};

	let balance = loanRows[0]?.opening ?? ZERO;
	let reserve = reserveSpec ? (inputs.dsraAtCod ?? (reserveSpec.funding === 'from-funding' ? debtServiceReserveAtCod(reserveSpec, loanRows) : ZERO)) : ZERO;
	let held = ZERO;

	// Without a reserve or covenants the waterfall is the loan schedule and CFADS less debt service: the same
	// numbers as the full pass below, with most of its decimal work left out (it runs in every evaluation).
	const plain = !reserveSpec && !covenants;
	for (let k = 0; k < n; k++) {
		const cf = cfads[k];
		const opening = balance;
		const interest = interestOn(opening);
		const principal = scheduledPrincipal(k, opening, interest);
		const debtService = interest.plus(principal);
		const afterScheduled = opening.minus(principal);
		if (plain) {
			const cash = cf.minus(debtService);
			const unpaid = cash.isNegative() ? Decimal.min(Decimal.max(debtService, ZERO), cash.neg()) : ZERO;
			balance = afterScheduled;
			out.openingBalance[k] = opening;
			out.interest[k] = interest;
			out.principal[k] = principal;
			out.closingBalance[k] = afterScheduled;
			out.debtService[k] = debtService;
			out.dscr[k] = debtService.gt(0) ? cf.div(debtService) : null;
			out.unpaidDebtService[k] = unpaid;
			out.distribution[k] = cash;
			if (unpaid.gt(0)) out.unpaidYears.push(k + 1);
			continue;
		}

		// Cover the debt service: DSRA first, then cash held in lock-up.
		const dsraOpening = reserve;
		const shortfall = debtService.gt(0) ? Decimal.max(debtService.minus(Decimal.max(cf, ZERO)), ZERO) : ZERO;
		const draw = reserve.isZero() || shortfall.isZero() ? ZERO : Decimal.min(reserve, shortfall);
		reserve = less(reserve, draw);
		let cash = more(cf.minus(debtService), draw);
		const applied = cash.isNegative() && !held.isZero() ? Decimal.min(held, cash.neg()) : ZERO;
		held = less(held, applied);
		cash = more(cash, applied);
		const unpaid = cash.isNegative() ? Decimal.min(Decimal.max(debtService, ZERO), cash.neg()) : ZERO;

		// Top up towards the target, or release down to it.
		const target = reserveSpec ? reserveMonths.times(debtServiceNextYear(k, afterScheduled)) : ZERO;
		const contribution = cash.gt(0) ? Decimal.min(Decimal.max(target.minus(reserve), ZERO), cash) : ZERO;
		let release = Decimal.max(reserve.minus(target), ZERO);
		reserve = less(more(reserve, contribution), release);
		cash = more(less(cash, contribution), release);

		// Covenants on this year's DSCR.
		const dscr = debtService.gt(0) ? cf.div(debtService) : null;
		const lockedUp = lockUpDscr !== undefined && dscr !== null && dscr.lt(lockUpDscr);
		const belowDefault = defaultDscr !== undefined && dscr !== null && dscr.lt(defaultDscr);

		// Sweep, then hold what lock-up traps.
		const free = Decimal.max(cash, ZERO);
		const sweepBase = sweepSpec && (sweepSpec.when === 'always' || lockedUp) ? free : ZERO;
		const sweep = sweepSpec ? Decimal.min(sweepBase.times(sweepSpec.share), Decimal.max(afterScheduled, ZERO)) : ZERO;
		cash = less(cash, sweep);
		const closing = less(afterScheduled, sweep);
		const finalMaturity = (opening.gt(0) && closing.lte(0)) || k === n - 1;
		const trapped = lockedUp && !finalMaturity ? Decimal.max(cash, ZERO) : ZERO;
		cash = less(cash, trapped);
		held = more(held, trapped);
		let released = ZERO;
		if (finalMaturity || !lockedUp) {
			released = held;
			held = ZERO;
		}
		if (finalMaturity && reserve.gt(0)) {
			release = more(release, reserve);
			cash = more(cash, reserve);
			reserve = ZERO;
		}
		cash = more(cash, released);
		balance = closing;

		out.openingBalance[k] = opening;
		out.interest[k] = interest;
		out.principal[k] = principal;
		out.sweep[k] = sweep;
		out.closingBalance[k] = closing;
		out.debtService[k] = debtService;
		out.dscr[k] = dscr;
		out.dsra.opening[k] = dsraOpening;
		out.dsra.draw[k] = draw;
		out.dsra.contribution[k] = contribution;
		out.dsra.release[k] = release;
		out.dsra.closing[k] = reserve;
		out.dsra.target[k] = finalMaturity ? ZERO : target;
		out.lockUp.trapped[k] = trapped;
		out.lockUp.applied[k] = applied;
		out.lockUp.released[k] = released;
		out.lockUp.held[k] = held;
		out.lockedUp[k] = lockedUp;
		out.belowDefault[k] = belowDefault;
		out.unpaidDebtService[k] = unpaid;
		out.distribution[k] = cash;
		if (lockedUp) out.lockUpYears.push(k + 1);
		if (belowDefault) out.defaultYears.push(k + 1);
		if (unpaid.gt(0)) out.unpaidYears.push(k + 1);
	}

	out.yearsInLockUp = out.lockUpYears.length;
	if (out.defaultYears.length > 0) {
		out.warnings.push(`The DSCR is below the default covenant (${defaultDscr}) in ${operatingYearsList(out.defaultYears)}: an event of default under the loan.`);
	}
	if (out.unpaidYears.length > 0) {
		const total = sum(out.unpaidDebtService);
		out.warnings.push(
			`CFADS and the reserves do not cover the debt service in ${operatingYearsList(out.unpaidYears)} (${total.toFixed(0)} short in all); the sponsors are taken to pay it, which lenders would treat as a payment default.`
		);
	}
	return out;
}
