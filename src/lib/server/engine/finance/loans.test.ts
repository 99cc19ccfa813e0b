import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ipmt as referenceIpmt, ppmt as referencePpmt } from 'financial';
import { dec, sum, type Decimal, type DecimalInput } from '../decimal';
import { capitalRecoveryFactor, pmt } from './annuity';
import { npv } from './discounting';
import { annuityLoan, loanFromDebtService, sculptedLoan, straightLineLoan, type LoanRow } from './loans';

const closeTo = (actual: Decimal, expected: DecimalInput, tolerance: DecimalInput) =>
	actual.minus(expected).abs().lte(tolerance);

const debtService = (row: LoanRow) => row.interest.plus(row.principal);

/** The balance identities every schedule must satisfy (see loans.ts). */
function isConsistent(rows: readonly LoanRow[], principal: DecimalInput, rate: DecimalInput): boolean {
	let opening = dec(principal);
	return rows.every((row, index) => {
		const ok =
			row.year === index + 1 &&
			row.opening.eq(opening) &&
			row.interest.eq(row.opening.times(rate)) &&
			row.closing.eq(row.opening.minus(row.principal));
		opening = row.closing;
		return ok;
	});
}

const rateArb = fc.integer({ min: 0, max: 1500 }).map((bp) => dec(bp).div(10_000));
const tenorAndGrace = fc
	.integer({ min: 1, max: 30 })
	.chain((tenor) => fc.tuple(fc.constant(tenor), fc.integer({ min: 0, max: Math.min(tenor - 1, 4) })));

describe('annuityLoan', () => {
	it('reproduces the numpy-financial amortisation example', () => {
		// numpy-financial ppmt/ipmt docstring: 2500 at 8.24 %/12 over 12 months, payment -217.7486,
		// period 1 principal -200.58, interest -17.17, balance 2299.42; total interest -112.98
		const rows = annuityLoan(2500, dec('0.0824').div(12), 12);
		expect(closeTo(debtService(rows[0]), '217.7486', '5e-5')).toBe(true);
		expect(rows[0].principal.toDecimalPlaces(2).toString()).toBe('200.58');
		expect(rows[0].interest.toDecimalPlaces(2).toString()).toBe('17.17');
		expect(rows[0].closing.toDecimalPlaces(2).toString()).toBe('2299.42');
		expect(sum(rows.map((row) => row.interest)).toDecimalPlaces(2).toString()).toBe('112.98');
		expect(rows[11].closing.isZero()).toBe(true);
	});

	it('pays a level debt service equal to -pmt and closes at zero', () => {
		// annuity loan schedule: level payment = principal * CRF = -pmt(r, n, principal), interest = balance * rate
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 1_000_000_000 }), rateArb, tenorAndGrace, (principal, rate, [tenor, grace]) => {
				const rows = annuityLoan(principal, rate, tenor, grace);
				const level = pmt(rate, tenor - grace, principal).neg();
				const tolerance = dec(principal).times('1e-24');
				return (
					rows.length === tenor &&
					isConsistent(rows, principal, rate) &&
					rows.slice(0, grace).every((row) => row.principal.isZero()) &&
					rows.slice(grace).every((row) => closeTo(debtService(row), level, tolerance)) &&
					rows[tenor - 1].closing.isZero()
				);
			}),
			{ numRuns: 200 }
		);
	});

	it('agrees with the npm financial package ppmt and ipmt', () => {
		// reference library: npm `financial` ppmt / ipmt (numpy-financial port; negative = paid)
		const rows = annuityLoan(150000, '0.065', 20);
		rows.forEach((row, index) => {
			expect(Math.abs(row.principal.toNumber() + referencePpmt(0.065, index + 1, 20, 150000))).toBeLessThan(1e-8);
			expect(Math.abs(row.interest.toNumber() + referenceIpmt(0.065, index + 1, 20, 150000))).toBeLessThan(1e-8);
		});
	});

	it('is interest only in grace years, then amortises over the rest', () => {
		// hand calculation: 1000 at 10 %, 2 grace years pay 100 interest; then CRF(10 %, 3) * 1000 a year
		const rows = annuityLoan(1000, '0.1', 5, 2);
		expect(rows.slice(0, 2).map((row) => [row.interest.toString(), row.principal.toString()])).toEqual([
			['100', '0'],
			['100', '0']
		]);
		expect(closeTo(debtService(rows[2]), capitalRecoveryFactor('0.1', 3).times(1000), '1e-24')).toBe(true);
	});

	it('repays equal slices at rate 0', () => {
		// CRF at r = 0 is 1/n: 1200 over 4 years repays 300 a year with no interest
		const rows = annuityLoan(1200, 0, 4);
		expect(rows.map((row) => row.principal.toString())).toEqual(['300', '300', '300', '300']);
		expect(rows.every((row) => row.interest.isZero())).toBe(true);
	});

	it('rejects a tenor not longer than the grace period and other bad terms', () => {
		// decided on purpose: no repayment years means the loan cannot be repaid
		expect(() => annuityLoan(1000, '0.05', 3, 3)).toThrow(RangeError);
		expect(() => annuityLoan(1000, '0.05', 2, 3)).toThrow(RangeError);
		expect(() => annuityLoan(1000, '0.05', 0)).toThrow(RangeError);
		expect(() => annuityLoan(1000, '0.05', 2.5)).toThrow(RangeError);
		expect(() => annuityLoan(-1, '0.05', 5)).toThrow(RangeError);
		expect(() => annuityLoan(1000, -1, 5)).toThrow(RangeError);
	});
});

describe('straightLineLoan', () => {
	it('repays equal principal with interest on the declining balance', () => {
		// hand calculation: 1000 at 10 % over 4 years: principal 250 a year, interest 100, 75, 50, 25
		const rows = straightLineLoan(1000, '0.1', 4);
		expect(rows.map((row) => row.principal.toString())).toEqual(['250', '250', '250', '250']);
		expect(rows.map((row) => row.interest.toString())).toEqual(['100', '75', '50', '25']);
		expect(rows[3].closing.isZero()).toBe(true);
	});

	it('has equal principal every repayment year and closes at zero', () => {
		// property: principal / (tenor - grace) each repayment year, interest = balance * rate
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 1_000_000_000 }), rateArb, tenorAndGrace, (principal, rate, [tenor, grace]) => {
				const rows = straightLineLoan(principal, rate, tenor, grace);
				const instalment = dec(principal).div(tenor - grace);
				const tolerance = dec(principal).times('1e-25');
				return (
					isConsistent(rows, principal, rate) &&
					rows.slice(0, grace).every((row) => row.principal.isZero()) &&
					rows.slice(grace).every((row) => closeTo(row.principal, instalment, tolerance)) &&
					rows[tenor - 1].closing.isZero()
				);
			}),
			{ numRuns: 200 }
		);
	});

	it('rejects a tenor not longer than the grace period', () => {
		// decided on purpose, as annuityLoan
		expect(() => straightLineLoan(1000, '0.05', 2, 2)).toThrow(RangeError);
	});
});

describe('sculptedLoan', () => {
	it('equals an annuity loan when CFADS is flat', () => {
		// annuity loan schedule: CFADS 130 at target 1.30 is debt service 100 a year, principal 100 / CRF(10 %, 3)
		const { principal, rows } = sculptedLoan([130, 130, 130].map(dec), '1.3', '0.1', 3);
		expect(closeTo(principal, dec(100).div(capitalRecoveryFactor('0.1', 3)), '1e-25')).toBe(true);
		const annuity = annuityLoan(principal, '0.1', 3);
		rows.forEach((row, index) => expect(closeTo(row.principal, annuity[index].principal, '1e-24')).toBe(true));
	});

	it('reaches zero at maturity with DSCR at the target every repayment year', () => {
		// property (CHECK-VALUES): a sculpted loan's balance reaches zero at maturity and its DSCR equals the target
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 1, max: 100_000_000 }), { minLength: 30, maxLength: 30 }),
				fc.integer({ min: 100, max: 250 }).map((hundredths) => dec(hundredths).div(100)),
				rateArb,
				tenorAndGrace,
				(cfadsValues, target, rate, [tenor, grace]) => {
					const cfads = cfadsValues.map(dec);
					const { principal, rows } = sculptedLoan(cfads, target, rate, tenor, grace);
					const repaying = rows.slice(grace);
					return (
						rows.length === tenor &&
						isConsistent(rows, principal, rate) &&
						rows[tenor - 1].closing.isZero() &&
						rows.slice(0, grace).every((row) => row.principal.isZero()) &&
						repaying.every((row) => closeTo(cfads[row.year - 1].div(debtService(row)), target, '1e-18'))
					);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('sizes the principal as the present value of the debt service', () => {
		// sculpting: principal = PV at the loan rate of all debt service, grace interest included
		const cfads = [50, 80, 120, 125, 130, 90, 140].map(dec);
		const { principal, rows } = sculptedLoan(cfads, '1.35', '0.07', 7, 2);
		const presentValue = npv('0.07', [0, ...rows.map(debtService)]);
		expect(closeTo(presentValue, principal, '1e-20')).toBe(true);
		// the grace years pay interest only on the full principal
		expect(rows[0].interest.eq(principal.times('0.07'))).toBe(true);
	});

	it('capitalises interest in a year without positive CFADS', () => {
		// decided on purpose: no debt service when CFADS <= 0; the balance grows by the interest
		const { rows } = sculptedLoan([100, -20, 100].map(dec), '1.25', '0.08', 3);
		expect(debtService(rows[1]).isZero()).toBe(true);
		expect(rows[1].closing.eq(rows[1].opening.times('1.08'))).toBe(true);
		expect(rows[2].closing.isZero()).toBe(true);
	});

	it('sizes no debt when no repayment year has positive CFADS', () => {
		// decided on purpose: debt that cannot be serviced is zero, not negative
		const { principal, rows } = sculptedLoan([100, 0, -5].map(dec), '1.3', '0.05', 3, 1);
		expect(principal.isZero()).toBe(true);
		expect(rows.every((row) => row.opening.isZero() && row.principal.isZero() && row.interest.isZero())).toBe(true);
	});

	it('rejects a bad target, too few CFADS years and tenor <= grace', () => {
		// decided on purpose: input errors
		const cfads = [100, 100, 100].map(dec);
		expect(() => sculptedLoan(cfads, 0, '0.05', 3)).toThrow(RangeError);
		expect(() => sculptedLoan(cfads, '1.3', '0.05', 4)).toThrow(RangeError);
		expect(() => sculptedLoan(cfads, '1.3', '0.05', 2, 2)).toThrow(RangeError);
	});
});

describe('loanFromDebtService', () => {
	it('pays interest first and reduces the balance with the rest', () => {
		// hand calculation: 1000 at 10 %: 600 pays 100 interest + 500 principal; 550 pays 50 + 500
		const rows = loanFromDebtService(1000, '0.1', [600, 550]);
		expect(rows.map((row) => [row.interest.toString(), row.principal.toString(), row.closing.toString()])).toEqual([
			['100', '500', '500'],
			['50', '500', '0']
		]);
	});

	it('leaves what the debt service does not repay', () => {
		// standard amortisation: 100 at 10 % with one payment of 60 leaves 110 - 60 = 50; no payment adds interest
		expect(loanFromDebtService(100, '0.1', [60])[0].closing.toString()).toBe('50');
		expect(loanFromDebtService(100, '0.1', [0])[0].closing.toString()).toBe('110');
		expect(loanFromDebtService(100, '0.1', [])).toEqual([]);
	});

	it('reproduces an annuity loan from its level payment', () => {
		// annuity loan schedule: the level payment -pmt(r, n, P) repays P over n years
		const payment = pmt('0.06', 10, 5000).neg();
		const rows = loanFromDebtService(5000, '0.06', new Array(10).fill(payment));
		expect(isConsistent(rows, 5000, '0.06')).toBe(true);
		expect(rows[9].closing.abs().lt('1e-22')).toBe(true);
	});
});
