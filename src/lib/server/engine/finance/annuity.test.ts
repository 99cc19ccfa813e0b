import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	fv as referenceFv,
	pmt as referencePmt,
	pv as referencePv,
	PaymentDueTime
} from 'financial';
import { dec, type Decimal, type DecimalInput } from '../decimal';
import { capitalRecoveryFactor, fv, pmt, pv, type PaymentTiming } from './annuity';

const closeTo = (actual: Decimal, expected: DecimalInput, tolerance: DecimalInput) =>
	actual.minus(expected).abs().lte(tolerance);

const cents = (value: Decimal) => value.toDecimalPlaces(2).toString();

const referenceTiming = (when: PaymentTiming) => (when === 'begin' ? PaymentDueTime.Begin : PaymentDueTime.End);

/** Relative agreement with a float64 reference, scaled by the size of the inputs. */
const agrees = (ours: Decimal, theirs: number, scale: number) =>
	Math.abs(ours.toNumber() - theirs) <= 1e-9 * Math.max(1, Math.abs(theirs), scale);

// Rates on a 1e-5 grid (0 included): below that the float64 reference itself loses digits to cancellation.
const rateArb = fc.oneof(fc.constant(0), fc.integer({ min: -20_000, max: 50_000 }).map((i) => i / 100_000));
const amountArb = fc.integer({ min: -100_000_000, max: 100_000_000 });
const timingArb = fc.constantFrom<PaymentTiming>('end', 'begin');

describe('pmt', () => {
	it('reproduces the spreadsheet PMT documentation examples', () => {
		// spreadsheet PMT function documentation: 8 %/12, 10 months, 10 000 -> -1,037.03
		expect(cents(pmt(dec(0.08).div(12), 10, 10000))).toBe('-1037.03');
		// same loan paid at the start of each period -> -1,030.16
		expect(cents(pmt(dec(0.08).div(12), 10, 10000, 0, 'begin'))).toBe('-1030.16');
		// saving 50 000 over 18 years at 6 %/12 (pv 0, fv 50 000) -> -129.08
		expect(cents(pmt(dec(0.06).div(12), 216, 0, 50000))).toBe('-129.08');
	});

	it('reproduces the numpy-financial values', () => {
		// numpy-financial pmt docstring: pmt(0.075/12, 12*15, 200000) = -1854.0247200054619
		expect(closeTo(pmt(dec(0.075).div(12), 180, 200000), '-1854.0247200054619', '1e-10')).toBe(true);
		// numpy-financial test suite: pmt(0.08/12, 5*12, 15000) = -304.145914
		expect(closeTo(pmt(dec(0.08).div(12), 60, 15000), '-304.145914', '5e-7')).toBe(true);
		// same, payments at period start: -302.13170297
		expect(closeTo(pmt(dec(0.08).div(12), 60, 15000, 0, 'begin'), '-302.13170297', '5e-9')).toBe(true);
	});

	it('divides evenly at rate 0', () => {
		// numpy-financial test suite: pmt(0, 5*12, 15000) = -250; begin or end makes no difference
		expect(pmt(0, 60, 15000).toString()).toBe('-250');
		expect(pmt(0, 60, 15000, 0, 'begin').toString()).toBe('-250');
		// time-value equation at r = 0: -(fv + pv) / n
		expect(pmt(0, 4, 1000, 200).toString()).toBe('-300');
	});

	it('stays finite at rates too small to tell from 0', () => {
		// decided on purpose: |r n| < 1e-15 uses the r = 0 form, -(fv + pv) / n = -100 here
		expect(closeTo(pmt('1e-40', 12, 1200), -100, '1e-20')).toBe(true);
		expect(closeTo(pmt('1e-17', 12, 1200), -100, '1e-12')).toBe(true);
	});

	it('rejects zero periods and rates of -100 % or below', () => {
		// decided on purpose: no payment exists over no periods; (1 + r) must be positive
		expect(() => pmt(0.05, 0, 1000)).toThrow(RangeError);
		expect(() => pmt(-1, 10, 1000)).toThrow(RangeError);
	});

	it('agrees with the npm financial package on random inputs', () => {
		// reference library: npm `financial` pmt (numpy-financial port)
		fc.assert(
			fc.property(
				rateArb,
				fc.integer({ min: 1, max: 480 }),
				amountArb,
				amountArb,
				timingArb,
				(rate, nper, present, future, when) => {
					const theirs = referencePmt(rate, nper, present, future, referenceTiming(when));
					const scale = (Math.abs(present) + Math.abs(future)) / nper;
					return agrees(pmt(rate, nper, present, future, when), theirs, scale);
				}
			),
			{ numRuns: 300 }
		);
	});
});

describe('capitalRecoveryFactor', () => {
	it('matches r / (1 - (1 + r)^-n) at the NREL ATB check points', () => {
		// NREL Annual Technology Baseline CRF, CHECK-VALUES (derived): 8 %/20, 10 %/25, 7 %/25, 5 %/20
		const cases: [number, number, string][] = [
			[0.08, 20, '0.1018522088'],
			[0.1, 25, '0.1101680722'],
			[0.07, 25, '0.0858105172'],
			[0.05, 20, '0.0802425872']
		];
		for (const [rate, years, expected] of cases) {
			const r = dec(rate);
			const handFormula = r.div(dec(1).minus(dec(1).plus(r).pow(-years)));
			const crf = capitalRecoveryFactor(rate, years);
			expect(closeTo(crf, expected, '5e-11')).toBe(true);
			expect(closeTo(crf, handFormula, '1e-27')).toBe(true);
		}
	});

	it('is 1/n at rate 0', () => {
		// limit of r / (1 - (1 + r)^-n) as r -> 0
		expect(capitalRecoveryFactor(0, 20).toString()).toBe('0.05');
		expect(closeTo(capitalRecoveryFactor('1e-12', 20), '0.05', '1e-11')).toBe(true);
	});

	it('is the payment per unit borrowed', () => {
		// definition: CRF(r, n) = -pmt(r, n, 1)
		expect(closeTo(capitalRecoveryFactor(0.065, 18), pmt(0.065, 18, 1).neg(), '1e-28')).toBe(true);
	});

	it('rejects a non-positive number of years', () => {
		// decided on purpose: nothing is recovered over no years
		expect(() => capitalRecoveryFactor(0.08, 0)).toThrow(RangeError);
	});
});

describe('fv', () => {
	it('reproduces the numpy-financial values', () => {
		// numpy-financial test suite: fv(0.075, 20, -2000, 0, 0) = 86609.362673042924
		expect(closeTo(fv(0.075, 20, -2000, 0), '86609.362673042924', '1e-9')).toBe(true);
		// numpy-financial fv docstring (from memory): fv(0.05/12, 10*12, -100, -100) = 15692.928894335748
		expect(closeTo(fv(dec(0.05).div(12), 120, -100, -100), '15692.928894335748', '1e-6')).toBe(true);
	});

	it('grows by one period more when paid in advance', () => {
		// time-value equation: begin-of-period payments earn (1 + r) more than end-of-period ones
		const arrears = fv(0.075, 20, -2000);
		const advance = fv(0.075, 20, -2000, 0, 'begin');
		expect(closeTo(advance, arrears.times('1.075'), '1e-22')).toBe(true);
	});

	it('adds up at rate 0 and is -pv after no periods', () => {
		// time-value equation at r = 0: -(pv + pmt n); n = 0 leaves -pv
		expect(fv(0, 10, -100, -1000).toString()).toBe('2000');
		expect(fv(0.05, 0, -100, -1000).toString()).toBe('1000');
	});

	it('agrees with the npm financial package on random inputs', () => {
		// reference library: npm `financial` fv (numpy-financial port)
		fc.assert(
			fc.property(
				rateArb,
				fc.integer({ min: 0, max: 120 }),
				amountArb,
				amountArb,
				timingArb,
				(rate, nper, payment, present, when) => {
					const theirs = referenceFv(rate, nper, payment, present, referenceTiming(when));
					const scale = (Math.abs(present) + Math.abs(payment) * nper) * (1 + Math.abs(rate)) ** nper;
					return agrees(fv(rate, nper, payment, present, when), theirs, scale);
				}
			),
			{ numRuns: 300 }
		);
	});
});

describe('pv', () => {
	it('reproduces the numpy-financial values', () => {
		// numpy-financial test suite: pv(0.07, 20, 12000, 0) = -127128.1709461939
		expect(closeTo(pv(0.07, 20, 12000), '-127128.1709461939', '1e-9')).toBe(true);
		// numpy-financial pv docstring (from memory): pv(0.05/12, 10*12, -100, 15692.93) = -100.00067131625819
		expect(closeTo(pv(dec(0.05).div(12), 120, -100, '15692.93'), '-100.00067131625819', '1e-6')).toBe(true);
	});

	it('inverts pmt', () => {
		// time-value equation: the present value of a loan's payments is the loan
		fc.assert(
			fc.property(rateArb, fc.integer({ min: 1, max: 360 }), amountArb, timingArb, (rate, nper, loan, when) => {
				const payment = pmt(rate, nper, loan, 0, when);
				return closeTo(pv(rate, nper, payment, 0, when), loan, '1e-15');
			}),
			{ numRuns: 100 }
		);
	});

	it('adds up at rate 0', () => {
		// time-value equation at r = 0: -(fv + pmt n)
		expect(pv(0, 12, -50, 100).toString()).toBe('500');
	});

	it('agrees with the npm financial package on random inputs', () => {
		// reference library: npm `financial` pv (numpy-financial port)
		fc.assert(
			fc.property(
				rateArb,
				fc.integer({ min: 0, max: 120 }),
				amountArb,
				amountArb,
				timingArb,
				(rate, nper, payment, future, when) => {
					const theirs = referencePv(rate, nper, payment, future, referenceTiming(when));
					const scale = Math.abs(future) + Math.abs(payment) * nper * (1 + Math.abs(rate));
					return agrees(pv(rate, nper, payment, future, when), theirs, scale);
				}
			),
			{ numRuns: 300 }
		);
	});
});
