import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as financial from 'financial';
import { dec, Decimal } from './decimal';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed } from './evaluate';
import { coverRatios, loanLifeCoverRatio, paybackYears, timedFlows } from './metrics';
import { presentValueOfTimed } from './finance/discounting';

const d = (xs: number[]) => xs.map((x) => new Decimal(x));

describe('paybackYears', () => {
	it('interpolates inside the year the cumulative cash flow turns', () => {
		// Simple payback (common practice): -100 at COD, then 30 a year: cumulative -70, -40, -10, +20,
		// so payback = 3 + 10 / 30 = 3.3333 years.
		expect(paybackYears({ construction: d([-100]), operation: d([30, 30, 30, 30]) })!.toNumber()).toBeCloseTo(3 + 1 / 3, 12);
		// Two construction years add up before COD: -60 - 40, then 50 a year -> 2 years.
		expect(paybackYears({ construction: d([-60, -40]), operation: d([50, 50, 50]) })!.toString()).toBe('2');
	});
	it('is null when the cumulative never turns, and 0 when it is never negative', () => {
		expect(paybackYears({ construction: d([-100]), operation: d([10, 10]) })).toBeNull();
		expect(paybackYears({ construction: d([0]), operation: d([10]) })!.toString()).toBe('0');
	});
});

describe('coverRatios', () => {
	it('gives DSCR per year, minimum and average over years with debt service', () => {
		// Definition DSCR = CFADS / debt service (common practice): 130/100, 120/80, no service.
		const c = coverRatios(d([130, 120, 90]), d([100, 80, 0]));
		expect(c.perYear.map((x) => (x ? x.toString() : null))).toEqual(['1.3', '1.5', null]);
		expect(c.min!.toString()).toBe('1.3');
		expect(c.average!.toString()).toBe('1.4');
		expect(coverRatios(d([1]), d([0])).min).toBeNull();
	});
});

describe('loanLifeCoverRatio', () => {
	it('is the PV of CFADS over the tenor at the loan rate over the debt', () => {
		// -pv(0.1, 3, 130) from the npm financial package is the PV of 130 a year for 3 years at 10 %.
		const llcr = loanLifeCoverRatio(d([130, 130, 130, 500]), dec(250), 0.1, 3)!;
		expect(llcr.toNumber()).toBeCloseTo(-financial.pv(0.1, 3, 130) / 250, 12);
		expect(loanLifeCoverRatio(d([1]), dec(0), 0.1, 1)).toBeNull();
	});
});

describe('LCOE properties', () => {
	it('scales linearly with capex when opex is zero', () => {
		// CHECK-VALUES property: LCOE is linear in capex (and proportional with no opex).
		fc.assert(
			fc.property(fc.integer({ min: 500, max: 20000 }), fc.double({ min: 0.1, max: 5, noNaN: true }), (perKW, k) => {
				const base = { opex: { lines: [] }, capex: { lines: [{ name: 'c', basis: 'per-kW', amount: perKW }] } };
				const a = evaluateDetailed(atbCase(base), { breakeven: false }).metrics.lcoeReal!;
				const b = evaluateDetailed(atbCase({ ...base, capex: { lines: [{ name: 'c', basis: 'per-kW', amount: perKW * k }] } }), { breakeven: false }).metrics.lcoeReal!;
				return b.div(a).minus(k).abs().lt(1e-12);
			}),
			{ numRuns: 40 }
		);
	});

	it('rises by 1/0.9 when energy falls by 10 %', () => {
		// CHECK-VALUES property: 10 % less energy raises LCOE by 1/0.9 (costs independent of energy here).
		fc.assert(
			fc.property(fc.double({ min: 0.5, max: 1, noNaN: true }), fc.integer({ min: 1, max: 3 }), (availability, years) => {
				const a = evaluateDetailed(atbCase({ array: { availability }, timeline: { constructionYears: years } }), { breakeven: false });
				const b = evaluateDetailed(atbCase({ array: { availability: availability * 0.9 }, timeline: { constructionYears: years } }), { breakeven: false });
				return b.metrics.lcoeReal!.div(a.metrics.lcoeReal!).minus(dec(1).div(0.9)).abs().lt(1e-12);
			}),
			{ numRuns: 30 }
		);
	});
});

describe('IRR property', () => {
	it('makes the NPV of the project and equity flows zero', () => {
		// CHECK-VALUES property: NPV at the IRR is zero (IRR definition); present values by finance/discounting.
		fc.assert(
			fc.property(
				fc.integer({ min: 250, max: 600 }),
				fc.double({ min: 0, max: 0.35, noNaN: true }),
				fc.double({ min: 0, max: 0.8, noNaN: true }),
				(tariff, taxRate, gearing) => {
					const s = atbCase({
						revenue: { tariffPerMWh: tariff },
						finance: { taxRate, debt: { sizing: 'gearing', gearing, interestRate: 0.06, tenorYears: 12 } }
					});
					const e = evaluateDetailed(s, { breakeven: false });
					const times = e.prep.timeline.constructionTimes;
					for (const [rate, series] of [
						[e.metrics.projectIrrPostTax, e.operating.projectPostTax],
						[e.metrics.equityIrr, e.financing.equity]
					] as const) {
						if (rate === null) return false;
						const scale = series.construction[0].abs();
						if (presentValueOfTimed(rate, timedFlows(series, times)).abs().div(scale).gt(1e-15)) return false;
					}
					return true;
				}
			),
			{ numRuns: 30 }
		);
	});
});
