/**
 * Level-payment annuities in numpy-financial's sign convention: money paid out
 * is negative, money received positive, so a loan received (pv > 0) is repaid
 * by negative payments. Rates are fractions per period, nper a number of
 * periods, amounts in currency units.
 *
 * All four functions solve the same time-value equation
 *
 *     fv + pv (1 + r)^n + pmt (1 + r w) ((1 + r)^n - 1) / r = 0
 *     fv + pv + pmt n = 0                                  (r = 0)
 *
 * with w = 0 for payments at the end of each period and w = 1 at its start.
 * Source: numpy-financial `pmt`, `fv`, `pv`; the spreadsheet PMT/FV/PV functions.
 *
 * A rate so small that |r n| < 1e-15 is treated as 0: (1 + r)^n - 1 would lose
 * every digit to cancellation, while the r = 0 form is off by only r n / 2.
 */
import { dec, Decimal, ONE, type DecimalInput } from '../decimal';

/** When payments fall in each period: 'end' (arrears, the default) or 'begin' (advance). */
export type PaymentTiming = 'end' | 'begin';

function checkedRate(rate: DecimalInput): Decimal {
	const r = dec(rate);
	if (!r.isFinite() || r.lte(-1)) {
		throw new RangeError(`rate must be a finite fraction greater than -1, got ${r.toString()}`);
	}
	return r;
}

function checkedPeriods(nper: number, allowZero: boolean): number {
	if (!Number.isFinite(nper) || nper < 0 || (!allowZero && nper === 0)) {
		throw new RangeError(`number of periods must be ${allowZero ? 'non-negative' : 'positive'}, got ${nper}`);
	}
	return nper;
}

/** Below this |r n| the r = 0 form is closer than the general one (see the module comment). */
const NEGLIGIBLE_RATE_TIMES_PERIODS = new Decimal('1e-15');

function isNegligible(r: Decimal, n: number): boolean {
	return r.times(n).abs().lt(NEGLIGIBLE_RATE_TIMES_PERIODS);
}

/** (1 + r w): the one-period shift of payments made in advance. */
function timingFactor(r: Decimal, when: PaymentTiming): Decimal {
	return when === 'begin' ? ONE.plus(r) : ONE;
}

/**
 * Level payment per period that pays off `pv` (and leaves `fv`) over nper periods.
 *
 *     pmt = -(fv + pv (1 + r)^n) r / ((1 + r w) ((1 + r)^n - 1))
 *     pmt = -(fv + pv) / n                                   (r = 0)
 *
 * Units: currency per period, negative for a payment out. Source: numpy-financial `pmt`.
 *
 * Example (numpy-financial docstring): 200 000 borrowed at 7.5 % a year over
 * 15 years of monthly payments:
 *
 *     pmt(0.075 / 12, 180, 200000)  // => -1854.0247200054762... (numpy float64: -1854.0247200054619)
 *
 * @throws RangeError when rate <= -1 or nper <= 0.
 */
export function pmt(
	rate: DecimalInput,
	nper: number,
	pv: DecimalInput,
	fv: DecimalInput = 0,
	when: PaymentTiming = 'end'
): Decimal {
	const r = checkedRate(rate);
	const n = checkedPeriods(nper, false);
	const present = dec(pv);
	const future = dec(fv);
	if (isNegligible(r, n)) return future.plus(present).div(n).neg();
	const growth = ONE.plus(r).pow(n);
	return future
		.plus(present.times(growth))
		.times(r)
		.div(timingFactor(r, when).times(growth.minus(ONE)))
		.neg();
}

/**
 * Capital recovery factor: the level end-of-year payment, per unit borrowed,
 * that repays principal and interest over n years.
 *
 *     CRF = r / (1 - (1 + r)^-n)  =  r (1 + r)^n / ((1 + r)^n - 1)
 *     CRF = 1 / n                                            (r = 0)
 *
 * Units: 1/year (a fraction of the capital per year). It equals -pmt(r, n, 1).
 * Source: NREL Annual Technology Baseline equations (fixed charge rate).
 *
 * Example:
 *
 *     capitalRecoveryFactor(0.08, 20)  // => 0.10185220882315...
 *
 * @throws RangeError when rate <= -1 or years <= 0.
 */
export function capitalRecoveryFactor(rate: DecimalInput, years: number): Decimal {
	const r = checkedRate(rate);
	const n = checkedPeriods(years, false);
	if (isNegligible(r, n)) return ONE.div(n);
	const growth = ONE.plus(r).pow(n);
	return r.times(growth).div(growth.minus(ONE));
}

/**
 * Future value after nper periods of a present amount and level payments.
 *
 *     fv = -(pv (1 + r)^n + pmt (1 + r w) ((1 + r)^n - 1) / r)
 *     fv = -(pv + pmt n)                                     (r = 0)
 *
 * Units: currency at the end of period n. Source: numpy-financial `fv`.
 *
 * Example (numpy-financial test suite): saving 2000 a year for 20 years at 7.5 %:
 *
 *     fv(0.075, 20, -2000, 0)  // => 86609.3626730430... (numpy float64: 86609.362673042924)
 *
 * @throws RangeError when rate <= -1 or nper < 0.
 */
export function fv(
	rate: DecimalInput,
	nper: number,
	payment: DecimalInput,
	pv: DecimalInput = 0,
	when: PaymentTiming = 'end'
): Decimal {
	const r = checkedRate(rate);
	const n = checkedPeriods(nper, true);
	const present = dec(pv);
	const level = dec(payment);
	if (isNegligible(r, n)) return present.plus(level.times(n)).neg();
	const growth = ONE.plus(r).pow(n);
	const annuity = level.times(timingFactor(r, when)).times(growth.minus(ONE)).div(r);
	return present.times(growth).plus(annuity).neg();
}

/**
 * Present value of level payments over nper periods and a final amount.
 *
 *     pv = -(fv + pmt (1 + r w) ((1 + r)^n - 1) / r) / (1 + r)^n
 *     pv = -(fv + pmt n)                                     (r = 0)
 *
 * Units: currency at t = 0. Source: numpy-financial `pv`.
 *
 * Example (numpy-financial test suite): 12 000 a year for 20 years at 7 %:
 *
 *     pv(0.07, 20, 12000)  // => -127128.170946193...
 *
 * @throws RangeError when rate <= -1 or nper < 0.
 */
export function pv(
	rate: DecimalInput,
	nper: number,
	payment: DecimalInput,
	fv: DecimalInput = 0,
	when: PaymentTiming = 'end'
): Decimal {
	const r = checkedRate(rate);
	const n = checkedPeriods(nper, true);
	const future = dec(fv);
	const level = dec(payment);
	if (isNegligible(r, n)) return future.plus(level.times(n)).neg();
	const growth = ONE.plus(r).pow(n);
	const annuity = level.times(timingFactor(r, when)).times(growth.minus(ONE)).div(r);
	return future.plus(annuity).div(growth).neg();
}
