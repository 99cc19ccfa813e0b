import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { irr as referenceIrr } from 'financial';
import { dec, type Decimal, type DecimalInput } from '../decimal';
import { npv } from './discounting';
import { irr, irrTimed, type IrrResult } from './irr';

const closeTo = (actual: Decimal, expected: DecimalInput, tolerance: DecimalInput) =>
	actual.minus(expected).abs().lte(tolerance);

function rateOf(result: IrrResult): Decimal {
	if (result.rate === null) throw new Error(`expected a rate, got: ${result.reason}`);
	return result.rate;
}

/** |NPV at the rate| relative to the size of the discounted flows. */
function relativeNpv(values: readonly number[], rate: Decimal): Decimal {
	const v = dec(1).div(rate.plus(1));
	let scale = dec(0);
	let factor = dec(1);
	for (const value of values) {
		scale = scale.plus(factor.times(Math.abs(value)));
		factor = factor.times(v);
	}
	return npv(rate, values).abs().div(scale);
}

/** An investment followed by returns: exactly one sign change, so exactly one IRR. */
const conventionalFlows = fc
	.tuple(
		fc.integer({ min: 1, max: 3 }).chain((n) => fc.array(fc.integer({ min: 1, max: 50_000_000 }), { minLength: n, maxLength: n })),
		fc.array(fc.integer({ min: 0, max: 20_000_000 }), { minLength: 1, maxLength: 40 })
	)
	.filter(([, returns]) => returns.some((r) => r > 0))
	.map(([outlays, returns]) => [...outlays.map((o) => -o), ...returns]);

describe('irr', () => {
	it('reproduces the spreadsheet IRR documentation examples', () => {
		// spreadsheet IRR function documentation: -70000, 12000, 15000, 18000, 21000 -> -2.1 % (-0.0212448)
		expect(closeTo(rateOf(irr([-70000, 12000, 15000, 18000, 21000])), '-0.0212448', '5e-8')).toBe(true);
		// same plus 26000 -> 8.7 % (0.0866309)
		expect(closeTo(rateOf(irr([-70000, 12000, 15000, 18000, 21000, 26000])), '0.0866309', '5e-8')).toBe(true);
		// -70000, 12000, 15000 with guess -10 % -> -44.4 % (-0.4435069); one sign change, one root
		expect(closeTo(rateOf(irr([-70000, 12000, 15000], -0.1)), '-0.4435069', '5e-8')).toBe(true);
		expect(closeTo(rateOf(irr([-70000, 12000, 15000])), '-0.4435069', '5e-8')).toBe(true);
	});

	it('reproduces the numpy-financial docstring and test values', () => {
		// numpy-financial test suite: 0.5672303344358536
		const big = rateOf(irr([-250000, 100000, 150000, 200000, 250000, 300000]));
		expect(closeTo(big, '0.5672303344358536', '1e-15')).toBe(true);
		// numpy-financial docstring: 0.2809484212
		expect(closeTo(rateOf(irr([-100, 39, 59, 55, 20])), '0.2809484212', '5e-11')).toBe(true);
		// numpy-financial test suite: 0.052432889
		expect(closeTo(rateOf(irr([-150000, 15000, 25000, 35000, 45000, 60000])), '0.052432889', '5e-10')).toBe(true);
	});

	it('returns the root nearest the guess when there are several (default: nearest 0)', () => {
		// numpy-financial test suite: irr([-100, 100, 0, -7]) = -0.0832997; the second root is -0.678894
		expect(closeTo(rateOf(irr([-100, 100, 0, -7])), '-0.0832997', '5e-8')).toBe(true);
		expect(closeTo(rateOf(irr([-100, 100, 0, -7], -0.6)), '-0.678894', '5e-7')).toBe(true);
		// hand calculation: 1 - 3x + 2x^2 = (1 - x)(1 - 2x), roots x = 1 (r = 0) and x = 1/2 (r = 1)
		expect(rateOf(irr([1, -3, 2])).isZero()).toBe(true);
		expect(closeTo(rateOf(irr([1, -3, 2], 0.8)), 1, '1e-25')).toBe(true);
	});

	it('finds a double root', () => {
		// hand calculation: 4 - 12x + 9x^2 = (2 - 3x)^2, root x = 2/3, r = 0.5 twice
		expect(closeTo(rateOf(irr([4, -12, 9])), '0.5', '1e-12')).toBe(true);
	});

	it('is exact for simple hand-checked series', () => {
		// hand calculation: -100 + 110 / 1.1 = 0; -100 + 121 / 1.1^2 = 0
		expect(closeTo(rateOf(irr([-100, 110])), '0.1', '1e-27')).toBe(true);
		expect(closeTo(rateOf(irr([-100, 0, 121])), '0.1', '1e-27')).toBe(true);
		// a very high and a very negative rate: -1 + 1000/(1 + r) = 0 at r = 999; -100 + 1/(1 + r) at r = -0.99
		expect(closeTo(rateOf(irr([-1, 1000])), 999, '1e-22')).toBe(true);
		expect(closeTo(rateOf(irr([-100, 1])), '-0.99', '1e-27')).toBe(true);
	});

	it('ignores leading and trailing zeros', () => {
		// leading zeros scale the NPV by (1 + r)^-k, trailing zeros add nothing: same root as [-100, 110]
		expect(closeTo(rateOf(irr([0, 0, -100, 110, 0])), '0.1', '1e-27')).toBe(true);
	});

	it('is null with a reason when no rate makes the NPV zero', () => {
		// decided on purpose: no sign change means no IRR (numpy-financial returns nan)
		for (const values of [[100, 200], [-1, -2, 0], [0, 0], []]) {
			const result = irr(values);
			expect(result.rate).toBeNull();
			expect(result.reason).toMatch(/IRR|sign|rate/);
		}
		expect(irr([100, 200]).reason).toMatch(/never change sign/);
		// hand calculation: 100 - 300x + 250x^2 has discriminant 90000 - 100000 < 0, so no real root
		const noRoot = irr([100, -300, 250]);
		expect(noRoot.rate).toBeNull();
		expect(noRoot.reason).toMatch(/change sign 2 times/);
	});

	it('rejects a guess that is not a rate above -100 %', () => {
		// decided on purpose: a bad guess is a caller error, not a missing IRR
		expect(() => irr([-1, 2], -1)).toThrow(RangeError);
		expect(() => irr([-1, 2], Number.NaN)).toThrow(RangeError);
	});

	it('makes the NPV zero at the IRR (one sign change)', () => {
		// property: the IRR is by definition the rate at which the NPV vanishes
		fc.assert(
			fc.property(conventionalFlows, (values) => {
				const result = irr(values);
				return result.rate !== null && relativeNpv(values, result.rate).lt('1e-20');
			}),
			{ numRuns: 300 }
		);
	});

	it('makes the NPV zero at the IRR (any flows with a root)', () => {
		// property: any root returned, also among several, makes the NPV vanish
		fc.assert(
			fc.property(fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { minLength: 2, maxLength: 30 }), (values) => {
				const result = irr(values);
				return result.rate === null || relativeNpv(values, result.rate).lt('1e-18');
			}),
			{ numRuns: 300 }
		);
	});

	it('agrees with the npm financial package on conventional cash flows', () => {
		// reference library: npm `financial` irr (numpy-financial port; Newton from 0.1, here to 1e-12)
		fc.assert(
			fc.property(conventionalFlows, (values) => {
				const theirs = referenceIrr(values, 0.1, 1e-12, 1000);
				// Newton may also land on a root below -1 (e.g. -8.65 for [-1, -7, 5]): not an IRR
				fc.pre(Number.isFinite(theirs) && theirs > -1);
				const ours = rateOf(irr(values)).toNumber();
				return Math.abs(ours - theirs) <= 1e-9 * Math.max(1, Math.abs(theirs));
			}),
			{ numRuns: 300 }
		);
	});
});

describe('irrTimed', () => {
	it('shifts construction years before t = 0', () => {
		// hand calculation: -100 at t = -1 grows to -110 at t = 0; 121 at t = 1 is 110 at t = 0 at 10 %
		const result = irrTimed([
			{ t: -1, amount: dec(-100) },
			{ t: 1, amount: dec(121) }
		]);
		expect(closeTo(rateOf(result), '0.1', '1e-27')).toBe(true);
	});

	it('equals irr of the same flows laid out from their first period', () => {
		// numpy-financial docstring series, moved to start at t = -2; shifting does not move the root
		const values = [-100, 39, 59, 55, 20];
		const timed = values.map((amount, i) => ({ t: i - 2, amount: dec(amount) })).reverse();
		expect(closeTo(rateOf(irrTimed(timed)), rateOf(irr(values)), '1e-25')).toBe(true);
	});

	it('adds amounts that share a period', () => {
		// hand calculation: -60 and -40 at t = 0 are -100; with 110 at t = 1 the IRR is 10 %
		const result = irrTimed([
			{ t: 0, amount: dec(-60) },
			{ t: 1, amount: dec(110) },
			{ t: 0, amount: dec(-40) }
		]);
		expect(closeTo(rateOf(result), '0.1', '1e-27')).toBe(true);
	});

	it('takes flows in the middle of a year or a month, compounding the rate to a year', () => {
		// Hand calculation: -100 at t = -0.5 and 121 at t = 1.5 are two years apart: 100 x 1.1^2 = 121, so 10 %.
		const midYear = irrTimed([
			{ t: -0.5, amount: dec(-100) },
			{ t: 1.5, amount: dec(121) }
		]);
		expect(midYear.rate!.minus(0.1).abs().toNumber()).toBeLessThan(1e-20);
		// -100 at the middle of month 1 and 110 a year later (t = 1/24 and 25/24): 10 % a year.
		const monthly = irrTimed([
			{ t: 1 / 24, amount: dec(-100) },
			{ t: 25 / 24, amount: dec(110) }
		]);
		expect(monthly.rate!.minus(0.1).abs().toNumber()).toBeLessThan(1e-20);
	});

	it('is null with a reason for no flows or no sign change, and rejects periods off the 1/24 grid', () => {
		// decided on purpose, as irr; times between the middles of months are not construction points
		expect(irrTimed([]).rate).toBeNull();
		expect(irrTimed([{ t: 3, amount: dec(5) }]).reason).toMatch(/never change sign/);
		expect(() => irrTimed([{ t: 0.3, amount: dec(5) }])).toThrow(RangeError);
	});
});
