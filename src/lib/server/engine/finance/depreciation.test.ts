import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { dec, sum } from '../decimal';
import { decliningBalance, depreciationSchedule, straightLine } from './depreciation';

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
