/**
 * Tax depreciation of a capital cost. Amounts are in currency units, lives and
 * periods in years (or any period, used consistently); results are the
 * depreciation charged in a period, positive.
 */
import { dec, Decimal, ONE, sum, ZERO, type DecimalInput } from '../decimal';

export type DepreciationMethod = 'straight-line' | 'declining-balance';

/**
 * When the first year's charge starts. full-year: a whole year's charge in
 * operating year 1. half-year: the asset is taken as placed in service in
 * mid-year, so year 1 and the year after the life each get half a year's
 * charge and the write-off spans life + 1 years (the US MACRS half-year
 * convention, IRS Publication 946).
 */
export type FirstYearConvention = 'full-year' | 'half-year';

/** Schedules (and asset-class shares) must sum to 1 within this. */
export const SHARE_SUM_TOLERANCE = 1e-6;

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
 * Years over which a life is written off: the life, or one more under the
 * half-year convention (half a year at each end).
 */
export function writeOffYears(lifeYears: number, convention: FirstYearConvention = 'full-year'): number {
	return convention === 'half-year' ? lifeYears + 1 : lifeYears;
}

/**
 * Declining-balance charge in one year, to zero salvage, switching to
 * straight line on the remaining life as soon as that charges more, given the
 * book value at the start of the year.
 *
 *     full-year:  D_k = min(B, max(B f / N, B / (N - k + 1)))               k = 1..N
 *     half-year:  D_1 = min(B, B max(f, 1) / N / 2)
 *                 D_k = min(B, max(B f / N, B / (N - k + 1.5)))             k = 2..N
 *                 D_{N+1} = B                                               (the last half year)
 *
 * B is the book value at the start of year k, N the life, f the factor
 * (2 = 200 % declining balance, 1.5 = 150 %). In the last year of the
 * write-off the remaining life is one year (full-year) or half a year
 * (half-year), so the charge is the whole remaining book value. Years after
 * the write-off charge 0.
 * Units: currency per year. Source: IRS Publication 946, How to Depreciate
 * Property, appendix A (MACRS: 200 % and 150 % declining balance switching to
 * straight line, half-year convention); common practice for the full-year form.
 *
 * Example: 5-year property, 200 %, half-year (IRS Publication 946, Table A-1):
 *
 *     decliningBalanceYear(100, 5, 1, 2, 'half-year')    // => 20
 *     decliningBalanceYear(80, 5, 2, 2, 'half-year')     // => 32
 *     decliningBalanceYear(17.28, 5, 5, 2, 'half-year')  // => 11.52 (straight line: 17.28 / 1.5)
 *
 * @throws RangeError when lifeYears or year is not a positive whole number, or factor is not positive.
 */
export function decliningBalanceYear(
	book: DecimalInput,
	lifeYears: number,
	year: number,
	factor: DecimalInput = 2,
	convention: FirstYearConvention = 'full-year'
): Decimal {
	wholeLife(lifeYears);
	if (!Number.isInteger(year) || year < 1) throw new RangeError(`year must be a whole number from 1, got ${year}`);
	const b = dec(book);
	const f = positiveFactor(factor);
	const span = writeOffYears(lifeYears, convention);
	if (year > span) return ZERO;
	if (year === span) return b;
	if (convention === 'half-year' && year === 1) return Decimal.min(b, b.times(Decimal.max(f, ONE)).div(lifeYears).div(2));
	const remainingLife = convention === 'half-year' ? dec(lifeYears - year).plus('1.5') : dec(lifeYears - year + 1);
	return Decimal.min(b, Decimal.max(b.times(f).div(lifeYears), b.div(remainingLife)));
}

function wholeLife(lifeYears: number): void {
	if (!Number.isInteger(lifeYears) || lifeYears < 1) {
		throw new RangeError(`life must be a positive whole number of years, got ${lifeYears}`);
	}
}

function wholeHorizon(horizonYears: number): void {
	if (!Number.isInteger(horizonYears) || horizonYears < 0) {
		throw new RangeError(`horizon must be a whole number of years >= 0, got ${horizonYears}`);
	}
}

function nonNegativeCost(cost: DecimalInput): Decimal {
	const base = dec(cost);
	if (!base.isFinite() || base.isNegative()) throw new RangeError(`cost must be >= 0, got ${base.toString()}`);
	return base;
}

/**
 * Depreciation for each operating year, to zero salvage.
 *
 *     straight-line:       D_k = cost / life                                        for k = 1..life
 *     declining-balance:   D_k = min(B_{k-1}, max(B_{k-1} factor / life, B_{k-1} / (life - k + 1)))
 *
 * Declining balance switches to straight line on the remaining value as soon as
 * that charges more (common practice), so the asset is fully written off by the
 * end of its life. Under the half-year convention the first year charges half
 * of the above, the remaining life counts half a year more, and the write-off
 * ends with half a year's charge in year life + 1 (see decliningBalanceYear;
 * straight line: cost / life / 2, then cost / life, then cost / life / 2).
 * Years after the write-off are 0. The result has one value per operating year
 * 1..horizonYears; when the horizon is shorter than the write-off the rest is
 * simply not charged within it. The last year of the write-off takes the
 * remaining book value, so the charges add up to cost (exactly, up to the
 * 30-digit rounding of the decimal sums).
 * Units: currency per year. Source: common practice (tax depreciation); IRS
 * Publication 946 for the half-year convention.
 *
 * Example:
 *
 *     depreciationSchedule('straight-line', 1000, 4, 6)                      // => [250, 250, 250, 250, 0, 0]
 *     depreciationSchedule('declining-balance', 1000, 5, 5)                  // => [400, 240, 144, 108, 108]
 *     depreciationSchedule('declining-balance', 100, 5, 6, 2, 'half-year')   // => [20, 32, 19.2, 11.52, 11.52, 5.76]
 *
 * @throws RangeError when cost is negative, lifeYears is not a positive whole
 *   number, horizonYears is not a whole number >= 0, or factor is not positive.
 */
export function depreciationSchedule(
	method: DepreciationMethod,
	cost: DecimalInput,
	lifeYears: number,
	horizonYears: number,
	factor: DecimalInput = 2,
	convention: FirstYearConvention = 'full-year'
): Decimal[] {
	const base = nonNegativeCost(cost);
	wholeLife(lifeYears);
	wholeHorizon(horizonYears);
	const f = positiveFactor(factor);
	const level = base.div(lifeYears);
	const span = writeOffYears(lifeYears, convention);
	const halfYear = convention === 'half-year';

	const schedule: Decimal[] = [];
	let book = base;
	for (let year = 1; year <= horizonYears; year++) {
		let charge: Decimal;
		if (year > span) charge = ZERO;
		else if (year === span) charge = book;
		else if (method === 'straight-line') charge = halfYear && year === 1 ? level.div(2) : level;
		else if (halfYear) charge = decliningBalanceYear(book, lifeYears, year, f, convention);
		else charge = Decimal.min(book, Decimal.max(book.times(f).div(lifeYears), book.div(lifeYears - year + 1)));
		schedule.push(charge);
		book = book.minus(charge);
	}
	return schedule;
}

/**
 * Depreciation from a table of shares per year, as tax regimes publish them
 * (the IRS Publication 946 percentage tables, national capital-allowance
 * tables): share k of the cost in operating year k.
 *
 *     D_k = cost x s_k / sum_j s_j     k = 1..length,   0 after
 *
 * The shares are fractions (0.2 for 20 %) and must sum to 1 within 1e-6; they
 * are scaled by their sum so the charges add up to cost, and the last year of
 * the table takes the remaining book value (as the other methods do). Years
 * beyond the horizon are not charged within it.
 * Units: currency per year. Source: common practice (table-based tax
 * depreciation).
 *
 * Example (IRS Publication 946, Table A-1, 5-year property):
 *
 *     scheduledDepreciation(1000, [0.2, 0.32, 0.192, 0.1152, 0.1152, 0.0576], 7)
 *     // => [200, 320, 192, 115.2, 115.2, 57.6, 0]
 *
 * @throws RangeError when cost is negative, horizonYears is not a whole number
 *   >= 0, the table is empty, a share is negative or not finite, or the shares
 *   do not sum to 1 within 1e-6.
 */
export function scheduledDepreciation(cost: DecimalInput, shares: readonly DecimalInput[], horizonYears: number): Decimal[] {
	const base = nonNegativeCost(cost);
	wholeHorizon(horizonYears);
	if (shares.length === 0) throw new RangeError('a depreciation schedule needs at least one year');
	const values = shares.map(dec);
	const bad = values.findIndex((s) => !s.isFinite() || s.isNegative());
	if (bad >= 0) throw new RangeError(`schedule share for year ${bad + 1} must be a fraction >= 0, got ${values[bad].toString()}`);
	const total = sum(values);
	if (total.minus(1).abs().gt(SHARE_SUM_TOLERANCE)) {
		throw new RangeError(`depreciation schedule must sum to 1, sums to ${total.toString()}`);
	}
	const schedule: Decimal[] = [];
	let book = base;
	for (let year = 1; year <= horizonYears; year++) {
		let charge: Decimal;
		if (year > values.length) charge = ZERO;
		else if (year === values.length) charge = book;
		else charge = base.times(values[year - 1]).div(total);
		schedule.push(charge);
		book = book.minus(charge);
	}
	return schedule;
}

/** How one part of the depreciable base is written off (the schema's finance.depreciation fields). */
export type DepreciationRule = {
	method: DepreciationMethod | 'schedule';
	/** Whole years; absent: the operating life. Not used by 'schedule'. */
	lifeYears?: number;
	/** Declining-balance factor; absent: 2. */
	decliningBalanceFactor?: number;
	/** Absent: full-year. Not used by 'schedule' (a table already holds its convention). */
	firstYearConvention?: FirstYearConvention;
	/** Fractions per operating year, used by 'schedule'. */
	schedule?: readonly number[];
};

/** A share of the depreciable base with its own rule. A share left out takes the rest (at most one class). */
export type AssetClassRule = DepreciationRule & { name: string; share?: number };

export type DepreciationSpec = DepreciationRule & { assetClasses?: readonly AssetClassRule[] };

/** One rule's charges per operating year on the given cost. */
export function ruleDepreciation(rule: DepreciationRule, cost: DecimalInput, operatingYears: number): Decimal[] {
	if (rule.method === 'schedule') {
		if (!rule.schedule) throw new RangeError('the schedule method needs a schedule of shares per year');
		return scheduledDepreciation(cost, rule.schedule, operatingYears);
	}
	return depreciationSchedule(
		rule.method,
		cost,
		rule.lifeYears ?? operatingYears,
		operatingYears,
		rule.decliningBalanceFactor ?? 2,
		rule.firstYearConvention ?? 'full-year'
	);
}

/**
 * The share of the depreciable base each asset class takes. Shares given
 * must sum to 1 within 1e-6; or one class leaves its share out and takes the
 * rest, 1 - (sum of the others), which must not be negative (beyond 1e-6).
 * The shares are then scaled by their sum, so they add up to exactly 1.
 * Source: decided on purpose (a share of the whole base, not capex lines by
 * name, so that interest and fees capitalised into the base are split too,
 * and a renamed capex line cannot drop out of its class unnoticed).
 *
 * Example:
 *
 *     assetClassShares([{ share: 0.7 }, {}])          // => [0.7, 0.3]
 *     assetClassShares([{ share: 0.5 }, { share: 0.5 }])  // => [0.5, 0.5]
 *
 * @throws RangeError when the list is empty, a share is negative, more than
 *   one share is left out, or the shares do not add up as above.
 */
export function assetClassShares(classes: readonly { share?: number }[]): Decimal[] {
	if (classes.length === 0) throw new RangeError('at least one asset class is needed');
	const open = classes.filter((c) => c.share === undefined).length;
	if (open > 1) throw new RangeError(`only one asset class may leave its share out (it takes the rest), ${open} do`);
	let given = ZERO;
	for (const c of classes) {
		if (c.share === undefined) continue;
		const s = dec(c.share);
		if (!s.isFinite() || s.isNegative()) throw new RangeError(`asset-class shares must be fractions >= 0, got ${s.toString()}`);
		given = given.plus(s);
	}
	const rest = ONE.minus(given);
	if (open === 1 ? rest.lt(-SHARE_SUM_TOLERANCE) : rest.abs().gt(SHARE_SUM_TOLERANCE)) {
		throw new RangeError(`asset-class shares must sum to 1, sum to ${given.toString()}`);
	}
	const shares = classes.map((c) => (c.share === undefined ? Decimal.max(ZERO, rest) : dec(c.share)));
	const total = sum(shares);
	return shares.map((s) => s.div(total));
}

/**
 * Tax depreciation per operating year of an explicit depreciable base (capex
 * net of grants; the caller may add interest and fees capitalised during
 * construction).
 *
 *     no asset classes:   D_k = rule(base)_k
 *     asset classes:      D_k = sum_c rule_c(base x share_c)_k
 *
 * Each class writes off its part of the base by its own rule (method, life,
 * factor, convention or schedule); the last class takes base minus the other
 * parts, so the parts add up to the base exactly. Without assetClasses (or
 * with an empty list) the top-level rule applies to the whole base. Lives
 * default to the operating life.
 * Units: currency per year, one value per operating year.
 * Source: common practice (tax depreciation by asset class).
 *
 * Example:
 *
 *     depreciationByYear({ method: 'straight-line' }, 1000, 4)   // => [250, 250, 250, 250]
 *     depreciationByYear({ method: 'straight-line', assetClasses: [
 *         { name: 'Devices', share: 0.6, method: 'straight-line', lifeYears: 2 },
 *         { name: 'Cable', method: 'straight-line', lifeYears: 4 } ] }, 1000, 4)
 *     // => [400, 400, 100, 100]
 *
 * @throws RangeError as the rule functions and assetClassShares do.
 */
export function depreciationByYear(spec: DepreciationSpec, base: DecimalInput, operatingYears: number): Decimal[] {
	const classes = spec.assetClasses ?? [];
	if (classes.length === 0) return ruleDepreciation(spec, base, operatingYears);
	const total = nonNegativeCost(base);
	const shares = assetClassShares(classes);
	let allotted = ZERO;
	const parts = classes.map((rule, i) => {
		const part = i === classes.length - 1 ? total.minus(allotted) : total.times(shares[i]);
		allotted = allotted.plus(part);
		return ruleDepreciation(rule, Decimal.max(ZERO, part), operatingYears);
	});
	return Array.from({ length: operatingYears }, (_, k) => parts.reduce((acc, part) => acc.plus(part[k]), ZERO));
}
