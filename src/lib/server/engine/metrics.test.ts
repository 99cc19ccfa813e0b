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

describe('discountedLcoe with a revenue-share cost', () => {
	const withLease = (share: number, tariffPerMWh = 300, extra: Record<string, unknown> = {}) =>
		atbCase({
			...extra,
			revenue: { tariffPerMWh },
			opex: { lines: [{ name: 'Fixed O&M', basis: 'percent-of-capex', fraction: 0.04 }, { name: 'Seabed lease', basis: 'percent-of-revenue', fraction: share }] }
		});

	it('divides the LCOE without the share by (1 - share)', () => {
		// Derivation (docs/methods/lcoe.md): p (1 - s) sum E_k v^k = PV(other costs), so p = LCOE_without / (1 - s).
		// FCR check case (NREL ATB form): (CRF(8 %, 20) x 50 M + 2 M) / 30,660 = 231.3311; with a 4 % lease 231.3311 / 0.96.
		const without = (financial.pmt(0.08, 20, -1) * 50e6 + 2e6) / 30660;
		const e = evaluateDetailed(withLease(0.04), { breakeven: false });
		expect(e.metrics.lcoeReal!.toNumber()).toBeCloseTo(without / 0.96, 9);
		expect(e.metrics.lcoeNominal!.toNumber()).toBeCloseTo(without / 0.96, 9);
		expect(e.metrics.lcoeFcr!.toNumber()).toBeCloseTo(without / 0.96, 9);
	});

	it('does not move when the tariff moves', () => {
		// Property: the LCOE is a cost measure, so the tariff (and so the lease paid at it) cannot change it.
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 0.3, noNaN: true }),
				fc.array(fc.integer({ min: 20, max: 2000 }), { minLength: 3, maxLength: 5 }),
				fc.double({ min: 0, max: 0.05, noNaN: true }),
				(share, tariffs, inflation) => {
					const extra = { finance: { inflation } };
					const reference = evaluateDetailed(withLease(share, 300, extra), { breakeven: false }).metrics;
					return tariffs.every((tariff) => {
						const m = evaluateDetailed(withLease(share, tariff, extra), { breakeven: false }).metrics;
						return m.lcoeReal!.eq(reference.lcoeReal!) && m.lcoeNominal!.eq(reference.lcoeNominal!) && m.lcoeFcr!.eq(reference.lcoeFcr!);
					});
				}
			),
			{ numRuns: 20 }
		);
	});

	it('equals the breakeven tariff with no tax and no grant, lease or not', () => {
		// Breakeven (NPV = 0 at a flat real price) and LCOE solve the same equation when tax and grants are absent.
		for (const share of [0, 0.05, 0.2]) {
			const e = evaluateDetailed(withLease(share, 300, { finance: { inflation: 0.02 } }));
			expect(e.metrics.breakevenTariff!.minus(e.metrics.lcoeReal!).abs().toNumber()).toBeLessThan(1e-6);
		}
	});

	it('is undefined, with the reason, when the revenue shares take all the revenue', () => {
		const e = evaluateDetailed(
			atbCase({ opex: { lines: [{ name: 'Lease', basis: 'percent-of-revenue', fraction: 0.6 }, { name: 'Royalty', basis: 'percent-of-revenue', fraction: 0.4 }] } }),
			{ breakeven: false }
		);
		expect(e.metrics.lcoeReal).toBeNull();
		expect(e.metrics.lcoeFcr).toBeNull();
		expect(e.warnings.some((w) => w.includes('revenue-share costs take all of the revenue'))).toBe(true);
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
