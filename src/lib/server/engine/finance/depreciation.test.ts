import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { dec, Decimal, sum } from '../decimal';
import {
	assetClassShares,
	decliningBalance,
	decliningBalanceYear,
	depreciationByYear,
	depreciationSchedule,
	ruleDepreciation,
	scheduledDepreciation,
	straightLine,
	type FirstYearConvention
} from './depreciation';

const asStrings = (values: readonly { toString(): string }[]) => values.map((v) => v.toString());

describe('straightLine', () => {
	it('reproduces the spreadsheet SLN documentation example', () => {
		// spreadsheet SLN function documentation: cost 30 000, salvage 7 500, life 10 -> 2,250
		expect(straightLine(30000, 7500, 10).toString()).toBe('2250');
	});

	it('divides the depreciable amount evenly', () => {
		// definition (cost - salvage) / life, hand calculation: (1000 - 100) / 3 = 300
		expect(straightLine(1000, 100, 3).toString()).toBe('300');
		// a fractional life is a plain division, as SLN: 900 / 2.5 = 360
		expect(straightLine(1000, 100, '2.5').toString()).toBe('360');
	});

	it('rejects a life that is not positive', () => {
		// decided on purpose: no period to spread the cost over
		expect(() => straightLine(1000, 0, 0)).toThrow(RangeError);
		expect(() => straightLine(1000, 0, -5)).toThrow(RangeError);
	});
});

describe('decliningBalance', () => {
	it('reproduces the spreadsheet DDB documentation examples', () => {
		// spreadsheet DDB function documentation (from memory): cost 2400, salvage 300, life 10
		// year 1: 2400 * 2/10 = 480.00
		expect(decliningBalance(2400, 300, 10, 1).toString()).toBe('480');
		// year 2 with factor 1.5: (2400 - 360) * 0.15 = 306.00
		expect(decliningBalance(2400, 300, 10, 2, 1.5).toString()).toBe('306');
		// year 10: book 2400 * 0.8^9 = 322.12 would give 64.42, capped at the 22.12 left above salvage
		expect(decliningBalance(2400, 300, 10, 10).toDecimalPlaces(2).toString()).toBe('22.12');
		// first month of a 120-month life: 2400 * 2 / 120 = 40.00
		expect(decliningBalance(2400, 300, 120, 1).toString()).toBe('40');
	});

	it('never takes the book value below salvage', () => {
		// DDB semantics: sum of all charges <= cost - salvage, and every charge >= 0
		fc.assert(
			fc.property(
				fc.integer({ min: 0, max: 10_000_000 }),
				fc.integer({ min: 0, max: 100 }),
				fc.integer({ min: 1, max: 40 }),
				fc.double({ min: 0.5, max: 3, noNaN: true }),
				(cost, salvagePercent, life, factor) => {
					const salvage = dec(cost).times(salvagePercent).div(100);
					let total = dec(0);
					for (let period = 1; period <= life; period++) {
						const charge = decliningBalance(cost, salvage, life, period, factor);
						if (charge.isNegative()) return false;
						total = total.plus(charge);
					}
					return total.lte(dec(cost).minus(salvage).plus('1e-20'));
				}
			),
			{ numRuns: 100 }
		);
	});

	it('charges nothing when salvage is at or above cost', () => {
		// DDB semantics: max(0, book - salvage) = 0
		expect(decliningBalance(1000, 1000, 5, 1).isZero()).toBe(true);
		expect(decliningBalance(1000, 1500, 5, 3).isZero()).toBe(true);
	});

	it('rejects periods outside 1..life and a non-positive factor', () => {
		// decided on purpose, as the spreadsheet function's #NUM! cases
		expect(() => decliningBalance(2400, 300, 10, 0)).toThrow(RangeError);
		expect(() => decliningBalance(2400, 300, 10, 11)).toThrow(RangeError);
		expect(() => decliningBalance(2400, 300, 10, 1.5)).toThrow(RangeError);
		expect(() => decliningBalance(2400, 300, 10, 1, 0)).toThrow(RangeError);
	});
});

describe('depreciationSchedule', () => {
	it('charges equal straight-line amounts, then zeros after the life', () => {
		// straight-line depreciation, hand calculation: 1000 / 4 = 250 a year for 4 years
		expect(asStrings(depreciationSchedule('straight-line', 1000, 4, 6))).toEqual(['250', '250', '250', '250', '0', '0']);
	});

	it('writes off the cost exactly when it does not divide evenly', () => {
		// straight-line depreciation: 100 / 3 a year, the last year takes the remainder so the sum is 100
		const schedule = depreciationSchedule('straight-line', 100, 3, 3);
		expect(sum(schedule).toString()).toBe('100');
		expect(schedule[0].eq(schedule[1])).toBe(true);
		expect(schedule[2].minus(schedule[0]).abs().lt('1e-25')).toBe(true);
	});

	it('switches declining balance to straight line when that charges more', () => {
		// common practice, hand calculation for 1000 over 5 years at factor 2 (40 %):
		// 400, 240, 144; year 4: 86.40 declining < 216 / 2 = 108 straight line; year 5: 108
		expect(asStrings(depreciationSchedule('declining-balance', 1000, 5, 7))).toEqual([
			'400',
			'240',
			'144',
			'108',
			'108',
			'0',
			'0'
		]);
	});

	it('writes the asset off fully by the end of its life with either method', () => {
		// common practice: the charges over the life add up to the cost (to decimal rounding), none negative
		fc.assert(
			fc.property(
				fc.constantFrom('straight-line' as const, 'declining-balance' as const),
				fc.integer({ min: 0, max: 1_000_000_000 }),
				fc.integer({ min: 1, max: 40 }),
				fc.integer({ min: 0, max: 10 }),
				fc.double({ min: 1, max: 3, noNaN: true }),
				(method, cost, life, extraYears, factor) => {
					const schedule = depreciationSchedule(method, cost, life, life + extraYears, factor);
					return (
						schedule.length === life + extraYears &&
						schedule.every((charge) => !charge.isNegative()) &&
						// Each of the ~2 x life additions and subtractions rounds at 30 significant digits, so
						// the sum may miss the cost by a few units in its 28th digit (1.4e-20 on 198,901,664
						// over 35 years was found by this property): a relative bound, not an absolute one.
						sum(schedule).minus(cost).abs().lte(dec(cost).times('1e-27').plus('1e-20')) &&
						schedule.slice(life).every((charge) => charge.isZero())
					);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('stops at the horizon when it is shorter than the life', () => {
		// decided on purpose: one value per operating year; the unexpired rest is outside the horizon
		expect(asStrings(depreciationSchedule('straight-line', 1000, 10, 3))).toEqual(['100', '100', '100']);
		expect(depreciationSchedule('declining-balance', 1000, 10, 0)).toEqual([]);
	});

	it('caps a declining charge at the book value when factor exceeds the life', () => {
		// DDB semantics: factor 3 over 2 years would charge 150 % in year 1; the charge is capped at cost
		expect(asStrings(depreciationSchedule('declining-balance', 1000, 2, 2, 3))).toEqual(['1000', '0']);
	});

	it('rejects a negative cost, a fractional life and a negative horizon', () => {
		// decided on purpose: these are input errors, not schedules
		expect(() => depreciationSchedule('straight-line', -1, 5, 5)).toThrow(RangeError);
		expect(() => depreciationSchedule('straight-line', 1000, 2.5, 5)).toThrow(RangeError);
		expect(() => depreciationSchedule('straight-line', 1000, 0, 5)).toThrow(RangeError);
		expect(() => depreciationSchedule('declining-balance', 1000, 5, -1)).toThrow(RangeError);
		expect(() => depreciationSchedule('declining-balance', 1000, 5, 5, 0)).toThrow(RangeError);
	});
});

/**
 * IRS Publication 946 (How to Depreciate Property), Appendix A, Table A-1: MACRS
 * percentages for 3-, 5-, 7-, 10-, 15- and 20-year property, half-year
 * convention; 200 % declining balance for 3 to 10 years, 150 % for 15 and 20,
 * switching to straight line. Percentages as published (20-year property to
 * three decimals); the table text was read from a reproduction labelled "From
 * IRS Publication 946 Table A-1" and agrees with a textbook copy (MACRS
 * depreciation for personal property, half-year convention).
 */
const PUB_946_TABLE_A1: { life: number; factor: number; places: number; percent: number[] }[] = [
	{ life: 3, factor: 2, places: 2, percent: [33.33, 44.45, 14.81, 7.41] },
	{ life: 5, factor: 2, places: 2, percent: [20.0, 32.0, 19.2, 11.52, 11.52, 5.76] },
	{ life: 7, factor: 2, places: 2, percent: [14.29, 24.49, 17.49, 12.49, 8.93, 8.92, 8.93, 4.46] },
	{ life: 10, factor: 2, places: 2, percent: [10.0, 18.0, 14.4, 11.52, 9.22, 7.37, 6.55, 6.55, 6.56, 6.55, 3.28] },
	{
		life: 15,
		factor: 1.5,
		places: 2,
		percent: [5.0, 9.5, 8.55, 7.7, 6.93, 6.23, 5.9, 5.9, 5.91, 5.9, 5.91, 5.9, 5.91, 5.9, 5.91, 2.95]
	},
	{
		life: 20,
		factor: 1.5,
		places: 3,
		percent: [
			3.75, 7.219, 6.677, 6.177, 5.713, 5.285, 4.888, 4.522, 4.462, 4.461, 4.462, 4.461, 4.462, 4.461, 4.462, 4.461, 4.462, 4.461,
			4.462, 4.461, 2.231
		]
	}
];

describe('decliningBalanceYear', () => {
	it('reproduces every column of IRS Publication 946 Table A-1 when each year is rounded as the table is', () => {
		// IRS Publication 946, Table A-1 (see PUB_946_TABLE_A1). The table rounds each year's percentage to its
		// decimals and carries the rounded book value into the next year: doing the same with this function
		// gives every published figure exactly (3-year: 33.33, then 66.67 x 2/3 = 44.45, ...), rounding halves
		// up (15-year year 5: 69.25 x 0.1 = 6.925 is published as 6.93).
		for (const { life, factor, places, percent } of PUB_946_TABLE_A1) {
			let book = dec(100);
			const rounded: number[] = [];
			for (let year = 1; year <= life + 1; year++) {
				const charge = decliningBalanceYear(book, life, year, factor, 'half-year').toDecimalPlaces(places, Decimal.ROUND_HALF_UP);
				rounded.push(charge.toNumber());
				book = book.minus(charge);
			}
			expect(rounded, `${life}-year property`).toEqual(percent);
			expect(decliningBalanceYear(book, life, life + 2, factor, 'half-year').isZero()).toBe(true);
		}
	});

	it('gives the 5-year column exactly without rounding', () => {
		// IRS Publication 946, Table A-1, 5-year property: 20, 32, 19.2, 11.52, 11.52, 5.76 (no rounding needed)
		expect(asStrings(depreciationSchedule('declining-balance', 100, 5, 6, 2, 'half-year'))).toEqual([
			'20',
			'32',
			'19.2',
			'11.52',
			'11.52',
			'5.76'
		]);
	});

	it('halves the first year, lengthens the write-off by a year and keeps the full-year form unchanged', () => {
		// hand calculation, 1000 over 4 years at 200 %: half-year year 1 = 1000 x 0.5 / 2 = 250;
		// year 2 book 750: DB 375 > SL 750 / 3.5; full-year year 1 = 500
		expect(decliningBalanceYear(1000, 4, 1, 2, 'half-year').toString()).toBe('250');
		expect(decliningBalanceYear(750, 4, 2, 2, 'half-year').toString()).toBe('375');
		expect(decliningBalanceYear(1000, 4, 1, 2, 'full-year').toString()).toBe('500');
		// the last year of the write-off takes the book value: year 5 under half-year, year 4 under full-year
		expect(decliningBalanceYear(123, 4, 5, 2, 'half-year').toString()).toBe('123');
		expect(decliningBalanceYear(123, 4, 4, 2, 'full-year').toString()).toBe('123');
		expect(decliningBalanceYear(123, 4, 5, 2, 'full-year').isZero()).toBe(true);
	});

	it('rejects a fractional life or year and a non-positive factor', () => {
		// decided on purpose: input errors
		expect(() => decliningBalanceYear(100, 2.5, 1)).toThrow(RangeError);
		expect(() => decliningBalanceYear(100, 5, 0)).toThrow(RangeError);
		expect(() => decliningBalanceYear(100, 5, 1, 0)).toThrow(RangeError);
	});
});

describe('depreciationSchedule with the half-year convention', () => {
	it('stays within one unit of the last published decimal of Table A-1 without rounding, and sums to 100', () => {
		// IRS Publication 946, Table A-1: the unrounded schedule differs from the table only by the table's
		// own rounding (e.g. 7-year year 5: 8.92485 here, 8.93 published), at most 0.01 (0.001 for 20-year)
		for (const { life, factor, places, percent } of PUB_946_TABLE_A1) {
			const schedule = depreciationSchedule('declining-balance', 100, life, life + 1, factor, 'half-year');
			const unit = 10 ** -places;
			schedule.forEach((charge, k) => expect(Math.abs(charge.toNumber() - percent[k]), `${life}-year, year ${k + 1}`).toBeLessThanOrEqual(unit + 1e-12));
			expect(sum(schedule).minus(100).abs().lt('1e-25')).toBe(true);
			expect(percent.reduce((a, b) => a + b, 0)).toBeCloseTo(100, 9);
		}
	});

	it('writes straight line off as a half year, full years, then a half year', () => {
		// half-year convention (IRS Publication 946): 1000 over 4 years -> 125, 250, 250, 250, 125
		expect(asStrings(depreciationSchedule('straight-line', 1000, 4, 6, 2, 'half-year'))).toEqual(['125', '250', '250', '250', '125', '0']);
	});

	it('writes the asset off fully by the end of the write-off with either method and convention', () => {
		// common practice: charges add up to cost over life (+1 under half-year), none negative, zero after
		fc.assert(
			fc.property(
				fc.constantFrom('straight-line' as const, 'declining-balance' as const),
				fc.constantFrom<FirstYearConvention>('full-year', 'half-year'),
				fc.integer({ min: 0, max: 1_000_000_000 }),
				fc.integer({ min: 1, max: 40 }),
				fc.double({ min: 1, max: 3, noNaN: true }),
				(method, convention, cost, life, factor) => {
					const span = convention === 'half-year' ? life + 1 : life;
					const schedule = depreciationSchedule(method, cost, life, span + 2, factor, convention);
					return (
						schedule.every((charge) => !charge.isNegative()) &&
						sum(schedule).minus(cost).abs().lte(dec(cost).times('1e-27').plus('1e-20')) &&
						schedule.slice(span).every((charge) => charge.isZero())
					);
				}
			),
			{ numRuns: 200 }
		);
	});
});

describe('scheduledDepreciation', () => {
	it('applies the 5-year and 7-year columns of Table A-1 entered as schedules, which sum to 100 %', () => {
		// IRS Publication 946, Table A-1 (5-year and 7-year property), as fractions
		const fiveYear = [0.2, 0.32, 0.192, 0.1152, 0.1152, 0.0576];
		const sevenYear = [0.1429, 0.2449, 0.1749, 0.1249, 0.0893, 0.0892, 0.0893, 0.0446];
		expect(sum(fiveYear.map((s) => dec(s))).toString()).toBe('1');
		expect(sum(sevenYear.map((s) => dec(s))).toString()).toBe('1');
		// 1000 x each share
		expect(asStrings(scheduledDepreciation(1000, fiveYear, 7))).toEqual(['200', '320', '192', '115.2', '115.2', '57.6', '0']);
		expect(asStrings(scheduledDepreciation(1000, sevenYear, 8))).toEqual(['142.9', '244.9', '174.9', '124.9', '89.3', '89.2', '89.3', '44.6']);
	});

	it('scales shares that miss 1 by rounding so the charges still add up to the cost', () => {
		// decided on purpose: [1/3, 1/3, 1/3] typed as 0.3333333 each sums to 0.9999999 (within 1e-6);
		// each year is 0.3333333 / 0.9999999 of the cost and the last takes the rest
		const schedule = scheduledDepreciation(900, [0.3333333, 0.3333333, 0.3333333], 3);
		expect(sum(schedule).toString()).toBe('900');
		expect(schedule[0].minus(300).abs().lt('1e-20')).toBe(true);
	});

	it('stops at the horizon and rejects a schedule that does not sum to 1', () => {
		// decided on purpose: one value per operating year; the schema refuses such a schedule with its path
		expect(asStrings(scheduledDepreciation(100, [0.5, 0.5], 1))).toEqual(['50']);
		expect(() => scheduledDepreciation(100, [0.5, 0.4], 3)).toThrow(/sum to 1, sums to 0.9/);
		expect(() => scheduledDepreciation(100, [], 3)).toThrow(RangeError);
		expect(() => scheduledDepreciation(100, [1.2, -0.2], 3)).toThrow(RangeError);
	});
});

describe('assetClassShares', () => {
	it('gives the rest to the one class without a share', () => {
		// hand calculation: 1 - 0.25 - 0.45 = 0.3
		expect(asStrings(assetClassShares([{ share: 0.25 }, {}, { share: 0.45 }]))).toEqual(['0.25', '0.3', '0.45']);
	});

	it('accepts shares summing to 1 and refuses others', () => {
		// decided on purpose: shares of the whole base must add up to it
		expect(asStrings(assetClassShares([{ share: 0.5 }, { share: 0.5 }]))).toEqual(['0.5', '0.5']);
		expect(() => assetClassShares([{ share: 0.5 }, { share: 0.4 }])).toThrow(/sum to 1/);
		expect(() => assetClassShares([{ share: 0.8 }, { share: 0.4 }, {}])).toThrow(/sum to 1/);
		expect(() => assetClassShares([{}, {}])).toThrow(/only one/);
		expect(() => assetClassShares([])).toThrow(RangeError);
	});
});

describe('depreciationByYear', () => {
	it('is the single method on the whole base without asset classes (the numbers of depreciationSchedule)', () => {
		// unchanged behaviour: the top-level rule on the whole base, life defaulting to the operating life
		const spec = { method: 'declining-balance' as const, lifeYears: 5, decliningBalanceFactor: 2 };
		expect(asStrings(depreciationByYear(spec, 1000, 7))).toEqual(asStrings(depreciationSchedule('declining-balance', 1000, 5, 7)));
		expect(asStrings(depreciationByYear({ method: 'straight-line' }, 1000, 4))).toEqual(['250', '250', '250', '250']);
		expect(asStrings(depreciationByYear({ method: 'straight-line', assetClasses: [] }, 1000, 4))).toEqual(['250', '250', '250', '250']);
	});

	it('adds up to the single-class result when every class has the same rule', () => {
		// linearity: each rule's charge is proportional to its cost, so splitting the base among equal rules
		// changes nothing (to the 30-digit rounding of the decimal sums)
		fc.assert(
			fc.property(
				fc.constantFrom('straight-line' as const, 'declining-balance' as const),
				fc.constantFrom<FirstYearConvention>('full-year', 'half-year'),
				fc.integer({ min: 1, max: 1_000_000_000 }),
				fc.integer({ min: 1, max: 30 }),
				fc.array(fc.integer({ min: 1, max: 100 }), { minLength: 1, maxLength: 6 }),
				(method, convention, base, life, weights) => {
					const rule = { method, lifeYears: life, decliningBalanceFactor: 2, firstYearConvention: convention };
					const total = weights.reduce((a, b) => a + b, 0);
					const classes = weights.map((w, i) => ({ ...rule, name: `Class ${i + 1}`, ...(i === 0 ? {} : { share: w / total }) }));
					const single = depreciationByYear(rule, base, 30);
					const split = depreciationByYear({ ...rule, assetClasses: classes }, base, 30);
					return split.every((charge, k) => charge.minus(single[k]).abs().lte(dec(base).times('1e-25')));
				}
			),
			{ numRuns: 150 }
		);
	});

	it('gives each class its own rule', () => {
		// hand calculation: 60 % over 2 years straight line = 300, 300; the rest (400) on the 5-year MACRS
		// table (IRS Publication 946, Table A-1): 80, 128, 76.8, 46.08, 46.08, 23.04
		const spec = {
			method: 'straight-line' as const,
			assetClasses: [
				{ name: 'Devices', share: 0.6, method: 'straight-line' as const, lifeYears: 2 },
				{ name: 'Export cable', method: 'schedule' as const, schedule: [0.2, 0.32, 0.192, 0.1152, 0.1152, 0.0576] }
			]
		};
		expect(asStrings(depreciationByYear(spec, 1000, 7))).toEqual(['380', '428', '76.8', '46.08', '46.08', '23.04', '0']);
	});

	it('follows a 200 % half-year class to the Table A-1 figures', () => {
		// IRS Publication 946, Table A-1, 5-year property: 20 %, 32 %, 19.2 %, 11.52 %, 11.52 %, 5.76 % of 1000
		const rule = { method: 'declining-balance' as const, lifeYears: 5, decliningBalanceFactor: 2, firstYearConvention: 'half-year' as const };
		expect(asStrings(ruleDepreciation(rule, 1000, 6))).toEqual(['200', '320', '192', '115.2', '115.2', '57.6']);
	});

	it('refuses the schedule method without a schedule', () => {
		// decided on purpose: the schema refuses it with the path finance.depreciation.schedule
		expect(() => depreciationByYear({ method: 'schedule' }, 1000, 5)).toThrow(/needs a schedule/);
	});
});
