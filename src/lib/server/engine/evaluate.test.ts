import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import * as financial from 'financial';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed, evaluateScenario, METRIC_KEYS } from './evaluate';
import { METRICS } from '../../metrics/catalogue';
import { parseScenario } from '../../schemas/scenario';

// The fixed-charge-rate check case (see testing/fixtures): 10 MW, 50 M capex at t = 0, 2 M/yr O&M,
// 30,660 MWh/yr (10 MW x 8760 h x 0.35), 20 years at 8 %.
const CAPEX = 50_000_000;
const OPEX = 2_000_000;
const AEP = 30_660;
const num = (s: string | null) => {
	if (s === null) throw new Error('metric is null');
	return Number(s);
};

describe('evaluateScenario: energy metrics', () => {
	it('gives the hand-calculated AEP and capacity factor', () => {
		// Hand calculation: 10,000 kW x 0.35 x 8760 h / 1000 = 30,660 MWh; CF = 30,660 / (10 MW x 8760 h) = 0.35.
		const r = evaluateScenario(atbCase());
		expect(r.metrics.netAepMWh).toBe('30660');
		expect(r.metrics.capacityFactor).toBe('0.35');
	});

	it('gives the rotor AEP worked by hand, with losses multiplied', () => {
		// Rotor check value (CHECK-VALUES): D 20 m, Cp 0.40 at 2.5 m/s gives 1006.291 kW.
		// All year at 2.5 m/s: 1006.291 kW x 8760 h = 8815.11 MWh; losses 0.95 x 0.95 x 0.97 = 0.875425 (CHECK-VALUES).
		const s = atbCase({
			resource: { kind: 'speed-histogram', bins: [{ speedMPerS: 2.5, occurrence: 1 }] },
			device: { kind: 'rotor', rotorDiameterM: 20, powerCoefficient: 0.4, ratedPowerKW: 2000, cutOutSpeedMPerS: 4 },
			array: { deviceCount: 1, availability: 0.95, arrayLoss: 0.05, electricalLoss: 0.03 }
		});
		const r = evaluateScenario(s);
		const gross = 1006.291197 * 8.76;
		expect(num(r.energy.grossAepMWh)).toBeCloseTo(gross, 2);
		expect(num(r.metrics.netAepMWh)).toBeCloseTo(gross * 0.875425, 2);
	});

	it('gives P90 = 0.871845 P50 at a combined sigma of 10 %', () => {
		// CHECK-VALUES (derived): P90/P50 = 1 - 1.281552 x 0.10; sigmas 6 % and 8 % combine to 10 % (RSS).
		const s = atbCase({ uncertainty: { components: [{ name: 'a', sigma: 0.06 }, { name: 'b', sigma: 0.08 }] } });
		const r = evaluateScenario(s);
		expect(num(r.metrics.p90AepMWh) / AEP).toBeCloseTo(0.871845, 6);
	});
});

describe('evaluateScenario: LCOE', () => {
	it('gives the fixed-charge-rate LCOE 231.3311 and the same discounted LCOE', () => {
		// CHECK-VALUES (NREL ATB LCOE equations, derived): (CRF(8 %, 20) x 50 M + 2 M) / 30,660 = 231.3311;
		// the discounted LCOE with capex at t = 0 and level flows is the same to 1e-9.
		const crf = financial.pmt(0.08, 20, -1); // the npm financial package: pmt of 1 borrowed = CRF
		const handFcr = (crf * CAPEX + OPEX) / AEP;
		expect(handFcr).toBeCloseTo(231.3311, 4);
		const d = evaluateDetailed(atbCase());
		expect(d.metrics.lcoeFcr!.toNumber()).toBeCloseTo(231.3311, 4);
		expect(d.metrics.lcoeReal!.minus(d.metrics.lcoeFcr!).abs().toNumber()).toBeLessThan(1e-9);
	});

	it('levelises nominal LCOE with the nominal rate: ratio CRF(n)/CRF(r)', () => {
		// Real vs nominal levelised cost (NREL Manual for the Economic Evaluation of Energy Efficiency and
		// Renewable Energy Technologies, 1995): with costs constant in real terms and inflation i, the nominal
		// level price is the real one times CRF(n, N) / CRF(r, N), n = (1 + r)(1 + i) - 1 (Fisher).
		const d = evaluateDetailed(atbCase({ finance: { inflation: 0.02 } }));
		const n = 1.08 * 1.02 - 1;
		const ratio = financial.pmt(n, 20, -1) / financial.pmt(0.08, 20, -1);
		expect(d.metrics.lcoeReal!.toNumber()).toBeCloseTo(231.3311, 4);
		expect(d.metrics.lcoeNominal!.toNumber()).toBeCloseTo(231.3311 * ratio, 3);
	});

	it('discounts the energy in the denominator', () => {
		// IEA/NEA LCOE definition: sum of discounted costs / sum of discounted energy. With 2 construction
		// years (half the capex at t = -1, compounded by 1.08) the hand figure is
		// (25 M x 1.08 + 25 M + 2 M x AF) / (30,660 x AF), AF = annuity factor of 20 years at 8 %.
		const d = evaluateDetailed(atbCase({ timeline: { constructionYears: 2 } }));
		const af = -financial.pv(0.08, 20, 1);
		const hand = (25e6 * 1.08 + 25e6 + OPEX * af) / (AEP * af);
		expect(d.metrics.lcoeReal!.toNumber()).toBeCloseTo(hand, 6);
	});
});

describe('evaluateScenario: returns', () => {
	const ebitda = AEP * 300 - OPEX; // 7,198,000 a year at the 300 per MWh tariff

	it('gives the pre-tax project IRR of the npm financial package on the same flows', () => {
		// Reference library: the npm `financial` package (numpy-financial port), irr of [-50 M, 7.198 M x 20].
		const expected = financial.irr([-CAPEX, ...Array(20).fill(ebitda)]);
		const r = evaluateScenario(atbCase());
		expect(num(r.metrics.projectIrrPreTax)).toBeCloseTo(expected, 10);
	});

	it('gives the post-tax project IRR and NPV worked by hand', () => {
		// Hand calculation: straight-line tax depreciation 50 M / 20 = 2.5 M a year (SLN), tax 25 % of
		// (EBITDA - depreciation); IRR and NPV (t = 0 convention) from the npm `financial` package.
		const tax = 0.25 * (ebitda - 2_500_000);
		const flows = [-CAPEX, ...Array(20).fill(ebitda - tax)];
		const r = evaluateScenario(atbCase({ finance: { taxRate: 0.25, depreciation: { method: 'straight-line', lifeYears: 20 } } }));
		expect(num(r.metrics.projectIrrPostTax)).toBeCloseTo(financial.irr(flows), 10);
		expect(num(r.metrics.npv)).toBeCloseTo(financial.npv(0.08, flows), 3);
		expect(num(r.cashFlow[1].depreciation)).toBe(2_500_000);
	});

	it('gives the simple payback worked by hand and null when it never comes', () => {
		// Hand calculation: 50 M / 7.198 M a year = 6.9464 years after COD.
		expect(num(evaluateScenario(atbCase()).metrics.paybackYears)).toBeCloseTo(CAPEX / ebitda, 9);
		const never = evaluateScenario(atbCase({ revenue: { tariffPerMWh: 70 } }));
		expect(never.metrics.paybackYears).toBeNull();
		expect(never.warnings.some((w) => w.startsWith(`${METRICS.paybackYears.label} is not available`))).toBe(true);
	});

	it('gives the equity IRR and DSCR of an annuity loan worked with the npm financial package', () => {
		// 60 % gearing on the total funding need, all paid at t = 0 (year-end spend, one construction year, so no
		// interest during construction), 2 % upfront fee, 8 % over 10 years. Hand calculation: the fee is part of the
		// funding need, D = 0.6 x (50 M + 0.02 D), so D = 30 M / (1 - 0.012) = 30,364,372.47 and equity = 50 M + 0.02 D - D.
		// Debt service = -pmt(0.08, 10, D) (npm financial); DSCR = EBITDA / debt service (no tax);
		// equity flows -equity, then EBITDA - debt service for 10 years and EBITDA for 10.
		const s = atbCase({
			finance: { debt: { sizing: 'gearing', gearing: 0.6, interestRate: 0.08, tenorYears: 10, upfrontFee: 0.02, repayment: 'annuity' } }
		});
		const r = evaluateScenario(s);
		const debt = 30_000_000 / (1 - 0.6 * 0.02);
		const service = -financial.pmt(0.08, 10, debt);
		const equity = [-(50_000_000 + 0.02 * debt - debt), ...Array(10).fill(ebitda - service), ...Array(10).fill(ebitda)];
		expect(num(r.metrics.debtAmount)).toBeCloseTo(debt, 6);
		expect(num(r.financing!.gearing)).toBeCloseTo(0.6, 12);
		expect(num(r.financing!.totalFundingNeed)).toBeCloseTo(50_000_000 + 0.02 * debt, 6);
		expect(num(r.metrics.equityIrr)).toBeCloseTo(financial.irr(equity), 10);
		expect(num(r.metrics.minDscr)).toBeCloseTo(ebitda / service, 10);
		expect(num(r.metrics.avgDscr)).toBeCloseTo(ebitda / service, 10);
		// LLCR = PV of CFADS over the tenor at the loan rate / debt = -pv(0.08, 10, EBITDA) / D.
		expect(num(r.metrics.llcr)).toBeCloseTo(-financial.pv(0.08, 10, ebitda) / debt, 10);
	});

	it('reports DSCR, LLCR as null without debt, with the reason', () => {
		const r = evaluateScenario(atbCase());
		expect(r.metrics.minDscr).toBeNull();
		expect(r.metrics.llcr).toBeNull();
		expect(r.metrics.debtAmount).toBe('0');
		expect(r.warnings.some((w) => w.startsWith(`${METRICS.minDscr.label} is not available`))).toBe(true);
	});
});

describe('evaluateScenario: debt sizing', () => {
	const sculpted = (extra: Record<string, unknown>) =>
		atbCase({
			finance: {
				taxRate: 0.25,
				depreciation: { method: 'straight-line', lifeYears: 20 },
				debt: { sizing: 'target-dscr', targetDscr: 1.3, maxGearing: 0.9, interestRate: 0.07, tenorYears: 10, repayment: 'sculpted', ...extra }
			}
		});

	it('sculpts to the target DSCR in every year and LLCR equals it (constant DSCR)', () => {
		// Common practice (CHECK-VALUES properties): sculpted DSCR = target each year; with a constant DSCR,
		// LLCR = DSCR; the balance reaches zero at maturity.
		const d = evaluateDetailed(sculpted({}));
		expect(d.financing.debt!.sizedBy).toBe('target-dscr');
		const dscr = d.dscr.slice(0, 10);
		for (const x of dscr) expect(x!.minus(1.3).abs().toNumber()).toBeLessThan(1e-9);
		expect(d.dscr[10]).toBeNull();
		expect(d.metrics.llcr!.minus(1.3).abs().toNumber()).toBeLessThan(1e-9);
		expect(d.financing.closingBalance[9].abs().toNumber()).toBeLessThan(1e-6);
	});

	it('sizes the sculpted loan to the PV of CFADS / target (no tax: annuity of EBITDA / 1.3)', () => {
		// Without tax CFADS is level: debt = -pv(0.07, 10, EBITDA / 1.3) (npm financial).
		const d = evaluateDetailed(
			atbCase({ finance: { debt: { sizing: 'target-dscr', targetDscr: 1.3, maxGearing: 0.9, interestRate: 0.07, tenorYears: 10, repayment: 'sculpted' } } })
		);
		const ebitda = AEP * 300 - OPEX;
		expect(d.metrics.debtAmount!.toNumber()).toBeCloseTo(-financial.pv(0.07, 10, ebitda / 1.3), 4);
	});

	it('takes the lesser of the gearing cap and the sculpted amount', () => {
		// CHECK-VALUES property: debt = min(gearing cap x capex, DSCR-sized amount).
		const free = evaluateDetailed(sculpted({})).metrics.debtAmount!.toNumber();
		const capped = evaluateDetailed(sculpted({ maxGearing: 0.5 }));
		expect(free).toBeGreaterThan(25_000_000);
		expect(free).toBeLessThan(45_000_000);
		expect(capped.metrics.debtAmount!.toNumber()).toBeCloseTo(Math.min(free, 0.5 * CAPEX), 6);
		expect(capped.financing.debt!.sizedBy).toBe('gearing-cap');
		// The capped loan is still sculpted: one constant DSCR above the target.
		const dscr = capped.dscr.slice(0, 10).map((x) => x!.toNumber());
		for (const x of dscr) expect(x).toBeCloseTo(dscr[0], 9);
		expect(dscr[0]).toBeGreaterThan(1.3);
	});

	it('capitalises interest during construction, or has equity pay it', () => {
		// Hand calculation: 2 construction years, capex 25 M at t = -1 and t = 0 (year-end spend), debt pro rata, 50 %
		// gearing on the funding need U = 50 M + IDC, 10 %. With s the debt's share of each payment,
		// D = s x 25 M x 1.1 + s x 25 M = 52.5 M s and IDC = 2.5 M s; D = 0.5 (50 M + 2.5 M s) gives s = 25 / 51.25,
		// D = 25.609756... M, IDC = 1.219512... M. Paid by equity instead, the debt is 0.5 x U with U = 50 M + 2.5 M s
		// and D = 50 M s: s = 25 / 48.75.
		const base = {
			timeline: { constructionYears: 2, spendTiming: 'year-end' },
			finance: { debt: { sizing: 'gearing', gearing: 0.5, interestRate: 0.1, tenorYears: 10, fundingOrder: 'pro-rata' } }
		};
		const cap = evaluateScenario(atbCase(base));
		const s = 25 / 51.25;
		expect(num(cap.financing!.debtAmount)).toBeCloseTo(52_500_000 * s, 5);
		expect(num(cap.financing!.interestDuringConstruction)).toBeCloseTo(2_500_000 * s, 5);
		expect(num(cap.financing!.gearing)).toBeCloseTo(0.5, 12);
		const paid = evaluateScenario(
			atbCase({ ...base, finance: { debt: { ...base.finance.debt, capitalizeInterestDuringConstruction: false } } })
		);
		const p = 25 / 48.75;
		expect(num(paid.financing!.debtAmount)).toBeCloseTo(50_000_000 * p, 5);
		// Equity at t = 0: its (1 - s) of the 25 M spent then, plus the year's interest on the 25 M s drawn at t = -1.
		expect(num(paid.cashFlow[1].equityCashFlow)).toBeCloseTo(-(25_000_000 * (1 - p) + 2_500_000 * p), 5);
	});

});

describe('evaluateScenario: breakeven tariff', () => {
	it('equals the real LCOE without tax (231.3311)', () => {
		// Definition: with no tax and no revenue-dependent costs, NPV(p) = 0 at p = discounted LCOE.
		const r = evaluateScenario(atbCase());
		expect(num(r.metrics.breakevenTariff)).toBeCloseTo(231.3311, 4);
	});

	it('matches the hand-solved tariff with tax and gives zero NPV when used', () => {
		// Hand calculation: NPV(p) = -50 M + AF x [(1 - t)(E p - O) + t D] = 0 with t 25 %, D = 2.5 M,
		// AF = -pv(0.08, 20, 1) (npm financial), so p = (50 M / AF - t D + (1 - t) O) / ((1 - t) E).
		const patch = { finance: { taxRate: 0.25, depreciation: { method: 'straight-line', lifeYears: 20 } } };
		const af = -financial.pv(0.08, 20, 1);
		const hand = (CAPEX / af - 0.25 * 2_500_000 + 0.75 * OPEX) / (0.75 * AEP);
		const tariff = num(evaluateScenario(atbCase(patch)).metrics.breakevenTariff);
		expect(tariff).toBeCloseTo(hand, 6);
		const atBreakeven = evaluateScenario(atbCase({ ...patch, revenue: { tariffPerMWh: tariff } }));
		expect(Math.abs(num(atBreakeven.metrics.npv))).toBeLessThan(1e-3);
	});

	it('solves through tax losses carried forward (piecewise-linear NPV) in few evaluations', () => {
		// Declining-balance depreciation and a large opex create early losses, so NPV(p) has kinks; the NPV
		// at the solved tariff is still zero.
		const patch = {
			opex: { lines: [{ name: 'O&M', basis: 'percent-of-capex', fraction: 0.06 }] },
			finance: { taxRate: 0.3, depreciation: { method: 'declining-balance', lifeYears: 8 } }
		};
		const d = evaluateDetailed(atbCase(patch));
		const tariff = d.metrics.breakevenTariff!.toNumber();
		expect(d.breakevenEvaluations).toBeLessThanOrEqual(8);
		const check = evaluateScenario(atbCase({ ...patch, revenue: { tariffPerMWh: tariff } }));
		expect(Math.abs(num(check.metrics.npv))).toBeLessThan(1e-2);
	});
});

describe('evaluateScenario: output shape', () => {
	it('has every metric key, strings or null, never NaN, and a row per year', () => {
		const r = evaluateScenario(atbCase({ timeline: { constructionYears: 3, operatingYears: 25 } }));
		expect(Object.keys(r.metrics).sort()).toEqual([...METRIC_KEYS].sort());
		for (const v of Object.values(r.metrics)) if (v !== null) expect(Number.isFinite(Number(v))).toBe(true);
		expect(r.cashFlow.map((row) => row.t)).toEqual(Array.from({ length: 28 }, (_, i) => i - 2));
		expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
	});

	it('evaluates every example scenario', () => {
		const dir = join(process.cwd(), 'examples');
		const files = readdirSync(dir).filter((f) => f.endsWith('.json'));
		expect(files.length).toBeGreaterThanOrEqual(3);
		for (const f of files) {
			const parsed = parseScenario(JSON.parse(readFileSync(join(dir, f), 'utf8')));
			expect(parsed.ok, f).toBe(true);
			if (!parsed.ok) continue;
			const r = evaluateScenario(parsed.scenario);
			expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
			expect(r.metrics.lcoeReal, f).not.toBeNull();
		}
	});
});

describe('evaluateScenario: assessed energy', () => {
	// One 10 MW device; an assessment's net P50 30,000 MWh and P90 26,000 MWh; 0.5 %/yr degradation.
	const assessedCase = () =>
		atbCase({
			resource: { kind: 'assessed-energy', p50MWh: 30_000, p90MWh: 26_000, assessedBy: 'Invented assessor, report 1' },
			device: { kind: 'power-curve', ratedPowerKW: 10_000, points: [{ speedMPerS: 0.5, powerKW: 0 }, { speedMPerS: 2, powerKW: 10_000 }] },
			array: { deviceCount: 1, degradationPerYear: 0.005 }
		});

	it('delivers the given P50 times degradation each year, with the capacity factor by hand', () => {
		const r = evaluateScenario(assessedCase());
		const operating = r.cashFlow.filter((row) => row.phase === 'operation');
		// E_k = 30,000 x 0.995^(k - 1): year 1 30,000; year 10 30,000 x 0.995^9 = 28,676.68735 MWh.
		expect(operating[0].energyMWh).toBe('30000');
		expect(Number(operating[9].energyMWh)).toBeCloseTo(28_676.68735072679, 6);
		operating.forEach((row, k) => expect(Number(row.energyMWh)).toBeCloseTo(30_000 * 0.995 ** k, 6));
		// CF = 30,000 MWh / (10,000 kW x 8760 h / 1000) = 30,000 / 87,600 = 0.3424657534.
		expect(Number(r.metrics.capacityFactor)).toBeCloseTo(0.3424657534, 10);
		expect(r.metrics.netAepMWh).toBe('30000');
		expect(Number(r.metrics.p90AepMWh)).toBeCloseTo(26_000, 6);
		// Per-kW capex on the rated power x device count: 5000 x 10,000 kW = 50,000,000.
		expect(r.costs.capexRealTotal).toBe('50000000');
		expect(r.energy.energySource).toBe('assessed');
		expect(r.energy.bins).toEqual([]);
	});

	it('reports the levels over one and ten years, equal when the uncertainty is all long-term', () => {
		const r = evaluateScenario(assessedCase());
		expect(r.energy.exceedancesByHorizon.map((h) => h.horizonYears)).toEqual([1, 10]);
		expect(r.energy.exceedancesByHorizon[0].levels).toEqual(r.energy.exceedances);
		expect(r.energy.exceedancesByHorizon[1].levels).toEqual(r.energy.exceedances);
		expect(r.energy.sigmaInterAnnual).toBe('0');
	});
});
