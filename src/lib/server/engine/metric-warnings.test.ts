import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { Decimal } from './decimal';
import { multipleIrrWarning, npvZeroRates, paybackReversal, paybackReversalWarning } from './metric-warnings';
import { signChanges } from './finance/irr';
import { evaluateDetailed } from './evaluate';
import { atbCase } from './testing/fixtures';
import { METRICS } from '../../metrics/catalogue';

const d = (xs: number[]) => xs.map((x) => new Decimal(x));
const atYears = (xs: number[], first = 0) => xs.map((x, i) => ({ t: first + i, amount: new Decimal(x) }));

/*
 * -100, 230, -132 at t = 0, 1, 2 has two IRRs. By hand, with y = 1 + r:
 *     -100 + 230 / y - 132 / y^2 = 0   <=>   100 y^2 - 230 y + 132 = 0
 *     y = (230 +- sqrt(230^2 - 4 x 100 x 132)) / 200 = (230 +- sqrt(52900 - 52800)) / 200 = (230 +- 10) / 200
 * so y = 1.1 or 1.2: IRRs of 10 % and 20 %. Check: at 10 %, -100 + 209.0909 - 109.0909 = 0;
 * at 20 %, -100 + 191.6667 - 91.6667 = 0.
 */
const TWO_ROOTS = [-100, 230, -132];

describe('signChanges', () => {
	it('counts changes of sign, skipping zeros', () => {
		// Descartes' rule of signs counts sign changes of the coefficient sequence, zeros left out
		expect(signChanges(d(TWO_ROOTS))).toBe(2);
		expect(signChanges(d([-100, 0, 50, 60]))).toBe(1);
		expect(signChanges(d([-100, 100, 0, -7]))).toBe(2);
		expect(signChanges(d([0, 0]))).toBe(0);
	});
});

describe('npvZeroRates', () => {
	it('finds both IRRs of -100, 230, -132 (10 % and 20 %, worked by hand above)', () => {
		const rates = npvZeroRates(atYears(TWO_ROOTS));
		expect(rates).toHaveLength(2);
		expect(rates[0]).toBeCloseTo(0.1, 10);
		expect(rates[1]).toBeCloseTo(0.2, 10);
		// the npm financial package (numpy-financial's Newton irr) lands on one or the other by its guess
		expect(financial.irr(TWO_ROOTS, 0.05)).toBeCloseTo(0.1, 8);
		expect(financial.irr(TWO_ROOTS, 0.25)).toBeCloseTo(0.2, 8);
	});

	it('finds the same rates whatever the time origin, and with fractional times', () => {
		// shifting every t by the same amount multiplies the NPV by (1 + r)^shift > 0: the roots stay
		const shifted = npvZeroRates(atYears(TWO_ROOTS, -2));
		expect(shifted[0]).toBeCloseTo(0.1, 10);
		expect(shifted[1]).toBeCloseTo(0.2, 10);
		// half-years: -100 at 0, 230 at 0.5, -132 at 1 solves y^0.5 = 1.1 or 1.2, so r = 0.21 or 0.44
		const half = npvZeroRates(TWO_ROOTS.map((x, i) => ({ t: i / 2, amount: new Decimal(x) })));
		expect(half[0]).toBeCloseTo(0.21, 10);
		expect(half[1]).toBeCloseTo(0.44, 10);
	});

	it('keeps to the searched range', () => {
		// numpy-financial's irr docstring: -100, 100, 0, -7 has roots -8.33 % and -67.89 %; only the first
		// lies between -50 % and +100 %
		expect(npvZeroRates(atYears([-100, 100, 0, -7]), -0.99, 10).map((r) => Number(r.toFixed(6)))).toEqual([-0.678894, -0.0833]);
		expect(npvZeroRates(atYears([-100, 100, 0, -7]), -0.5, 1).map((r) => Number(r.toFixed(4)))).toEqual([-0.0833]);
		expect(npvZeroRates(atYears([0, 0]))).toEqual([]);
	});
});

describe('multipleIrrWarning', () => {
	it('names the metric and both rates when the flows change sign twice', () => {
		// the two IRRs worked by hand above
		const warning = multipleIrrWarning('Project IRR post-tax', atYears(TWO_ROOTS), new Decimal(0.1));
		expect(warning).toBe(
			"Project IRR post-tax: the cash flows change sign 2 times, so more than one rate can make their NPV zero (Descartes' rule of signs); between -10 % and 100 % two rates do: 10.00 % and 20.00 %. The figure shown is 10.00 %; the NPV is the safer guide."
		);
	});

	it('says nothing when only one rate in the range makes the NPV zero', () => {
		// -100, 50, 60, -0.001: two sign changes. With y = 1 + r the NPV times y^3 is
		// -100 y^3 + 50 y^2 + 60 y - 0.001, whose positive roots are y = 1.063935 (6.39 %) and y = 0.0000167
		// (-99.998 %, far below the searched range): NPV(-10 %) > 0, NPV(0) = 9.999 > 0 and it turns negative
		// only after 6.39 % (roots of the cubic, checked by hand at these points).
		expect(npvZeroRates(atYears([-100, 50, 60, -0.001])).map((r) => Number(r.toFixed(4)))).toEqual([0.0639]);
		expect(multipleIrrWarning('Equity IRR', atYears([-100, 50, 60, -0.001]), new Decimal('0.0639'))).toBeNull();
	});

	it('says nothing with a single sign change', () => {
		// one sign change: exactly one IRR (Descartes' rule of signs)
		expect(multipleIrrWarning('Project IRR pre-tax', atYears([-100, 39, 59, 55, 20]), new Decimal('0.2809'))).toBeNull();
	});
});

describe('paybackReversal', () => {
	it('finds the year the cumulative cash flow turns negative again after payback', () => {
		// hand calculation: -100 | 60, 60, -30: cumulative -40, 20 (paid back in year 2), -10 in year 3
		expect(paybackReversal({ construction: d([-100]), operation: d([60, 60, -30]) })).toEqual({ year: 3, negativeAtEnd: true });
		// -100 | 60, 60, -30, 40: negative in year 3 (-10), positive again at the end (30)
		expect(paybackReversal({ construction: d([-100]), operation: d([60, 60, -30, 40]) })).toEqual({ year: 3, negativeAtEnd: false });
	});

	it('is null without payback or without a later fall below zero', () => {
		// never paid back: -100 | 10, 10; paid back and staying there: -100 | 60, 60, -10 (cumulative 10)
		expect(paybackReversal({ construction: d([-100]), operation: d([10, 10]) })).toBeNull();
		expect(paybackReversal({ construction: d([-100]), operation: d([60, 60, -10]) })).toBeNull();
	});

	it('counts a payback at COD (grants covering the capex) as paid back', () => {
		// cumulative 0 at COD, then -5 in year 1
		expect(paybackReversal({ construction: d([0]), operation: d([-5, 10]) })).toEqual({ year: 1, negativeAtEnd: false });
	});
});

describe('paybackReversalWarning', () => {
	it('says in which year and whether it recovers', () => {
		expect(paybackReversalWarning('Payback', { construction: d([-100]), operation: d([60, 60, -30]) })).toBe(
			'Payback: the cumulative post-tax project cash flow pays back but turns negative again in operating year 3 and stays negative to the end of the life; the payback figure does not show this.'
		);
		expect(paybackReversalWarning('Payback', { construction: d([-100]), operation: d([60, 60]) })).toBeNull();
	});
});

describe('the warnings in an evaluation', () => {
	it('warns of two IRRs and of a payback undone by a large decommissioning cost', () => {
		// The fixture: 50 M capex at COD, EBITDA 30 660 MWh x 300 - 4 % x 50 M = 7.198 M a year for 20 years.
		// With 100 M decommissioning in year 20 the post-tax (no tax) flows are -50, 7.198 x 19, -92.802 M:
		// two sign changes. Hand evaluation of the NPV: -6.04 M at 0 %, +0.40 M at 2 %, -0.78 M at 8 %, so
		// one IRR lies between 0 % and 2 % and another between 2 % and 8 %. Cumulative: 86.762 M after
		// year 19, 86.762 + 7.198 - 100 = -6.04 M in year 20 (paid back in year 7).
		const result = evaluateDetailed(atbCase({ decommissioning: { basis: 'lump-sum', amount: 100_000_000 } }), { breakeven: false });
		const irrWarning = result.warnings.find((w) => w.startsWith(`${METRICS.projectIrrPostTax.label}: the cash flows change sign 2 times`));
		expect(irrWarning).toMatch(/two rates do: (\d+\.\d\d) % and (\d+\.\d\d) %/);
		const [, low, high] = irrWarning!.match(/two rates do: (\d+\.\d\d) % and (\d+\.\d\d) %/)!.map(Number);
		expect(low).toBeGreaterThan(0);
		expect(low).toBeLessThan(2);
		expect(high).toBeGreaterThan(2);
		expect(high).toBeLessThan(8);
		expect(result.warnings).toContain(
			`${METRICS.paybackYears.label}: the cumulative post-tax project cash flow pays back but turns negative again in operating year 20 and stays negative to the end of the life; the payback figure does not show this.`
		);
	});

	it('says nothing of either without the decommissioning cost', () => {
		// the plain fixture: one sign change, cumulative rising to the end
		const result = evaluateDetailed(atbCase(), { breakeven: false });
		expect(result.warnings.filter((w) => w.includes('change sign') || w.includes('negative again'))).toEqual([]);
	});
});
