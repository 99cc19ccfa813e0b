/**
 * Tax depreciation of a capital cost. Amounts are in currency units, lives and
 * periods in years (or any period, used consistently); results are the
 * depreciation charged in a period, positive.
 */
import { dec, Decimal, ZERO, type DecimalInput } from '../decimal';

export type DepreciationMethod = 'straight-line' | 'declining-balance';

function positiveLife(life: DecimalInput): Decimal {
	const n = dec(life);
	if (!n.isFinite() || n.lte(0)) throw new RangeError(`life must be positive, got ${n.toString()}`);
	return n;
}

function positiveFactor(factor: DecimalInput): Decimal {
	const f = dec(factor);
	if (!f.isFinite() || f.lte(0)) throw new RangeError(`declining-balance factor must be positive, got ${f.toString()}`);
	return f;
}

/**
 * Straight-line depreciation per period (the spreadsheet SLN function).
 *
 *     SLN = (cost - salvage) / life
 *
 * Units: currency per period. A salvage above cost gives a negative charge, as
 * SLN does. Source: the spreadsheet SLN function documentation.
 *
 * Example (spreadsheet SLN documentation):
 *
 *     straightLine(30000, 7500, 10)  // => 2250
 *
 * @throws RangeError when life is not positive.
 */
export function straightLine(cost: DecimalInput, salvage: DecimalInput, life: DecimalInput): Decimal {
	return dec(cost).minus(dec(salvage)).div(positiveLife(life));
}

/**
 * Declining-balance depreciation in one period (the spreadsheet DDB function).
 *
 *     D_p = min(B_{p-1} * factor / life, max(0, B_{p-1} - salvage)),  B_0 = cost,  B_p = B_{p-1} - D_p
 *
 * so the book value never falls below salvage. factor 2 is double declining
 * balance. There is no switch to straight line here (see depreciationSchedule).
 * Units: currency per period; period counts from 1. Source: the spreadsheet
 * DDB function documentation.
 *
 * Example (spreadsheet DDB documentation, from memory): cost 2400, salvage 300, 10 years:
 *
 *     decliningBalance(2400, 300, 10, 1)       // => 480
 *     decliningBalance(2400, 300, 10, 2, 1.5)  // => 306
 *     decliningBalance(2400, 300, 10, 10)      // => 22.12 (only the rest down to salvage)
 *
 * @throws RangeError when life or factor is not positive, or period is not a whole number in 1..life.
 */
export function decliningBalance(
	cost: DecimalInput,
	salvage: DecimalInput,
	life: DecimalInput,
	period: number,
	factor: DecimalInput = 2
): Decimal {
	const n = positiveLife(life);
	const f = positiveFactor(factor);
	if (!Number.isInteger(period) || period < 1 || n.lt(period)) {
		throw new RangeError(`period must be a whole number from 1 to the life ${n.toString()}, got ${period}`);
	}
	const floor = dec(salvage);
	let book = dec(cost);
	let charge = ZERO;
	for (let p = 1; p <= period; p++) {
		charge = Decimal.min(book.times(f).div(n), Decimal.max(ZERO, book.minus(floor)));
		book = book.minus(charge);
	}
	return charge;
}

/**
 * Depreciation for each operating year, to zero salvage.
 *
 *     straight-line:       D_k = cost / life                                        for k = 1..life
 *     declining-balance:   D_k = min(B_{k-1}, max(B_{k-1} factor / life, B_{k-1} / (life - k + 1)))
 *
 * Declining balance switches to straight line on the remaining value as soon as
 * that charges more (common practice), so the asset is fully written off by the
 * end of its life. Years after the life are 0. The result has one value per
 * operating year 1..horizonYears; when the horizon is shorter than the life the
 * rest is simply not charged within it. The last year of the life takes the
 * remaining book value, so the charges add up to cost (exactly, up to the
 * 30-digit rounding of the decimal sums).
 * Units: currency per year. Source: common practice (tax depreciation).
 *
 * Example:
 *
 *     depreciationSchedule('straight-line', 1000, 4, 6)      // => [250, 250, 250, 250, 0, 0]
 *     depreciationSchedule('declining-balance', 1000, 5, 5)  // => [400, 240, 144, 108, 108]
 *
 * @throws RangeError when cost is negative, lifeYears is not a positive whole
 *   number, horizonYears is not a whole number >= 0, or factor is not positive.
 */
export function depreciationSchedule(
	method: DepreciationMethod,
	cost: DecimalInput,
	lifeYears: number,
	horizonYears: number,
	factor: DecimalInput = 2
): Decimal[] {
	const base = dec(cost);
	if (!base.isFinite() || base.isNegative()) throw new RangeError(`cost must be >= 0, got ${base.toString()}`);
	if (!Number.isInteger(lifeYears) || lifeYears < 1) {
		throw new RangeError(`life must be a positive whole number of years, got ${lifeYears}`);
	}
	if (!Number.isInteger(horizonYears) || horizonYears < 0) {
		throw new RangeError(`horizon must be a whole number of years >= 0, got ${horizonYears}`);
	}
	const f = positiveFactor(factor);
	const level = base.div(lifeYears);

	const schedule: Decimal[] = [];
	let book = base;
	for (let year = 1; year <= horizonYears; year++) {
		let charge: Decimal;
		if (year > lifeYears) charge = ZERO;
		else if (year === lifeYears) charge = book;
		else if (method === 'straight-line') charge = level;
		else charge = Decimal.min(book, Decimal.max(book.times(f).div(lifeYears), book.div(lifeYears - year + 1)));
		schedule.push(charge);
		book = book.minus(charge);
	}
	return schedule;
}
