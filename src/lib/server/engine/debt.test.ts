import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { dec, Decimal } from './decimal';
import { structureDebt, type DebtTerms, type SizingCase } from './debt';
import { buildTimeline } from './timeline';

const level = (x: number, n: number) => Array.from({ length: n }, () => new Decimal(x));
const terms = (t: Partial<DebtTerms> & { sizing: DebtTerms['sizing'] }): DebtTerms =>
	({
		interestRate: 0.08,
		tenorYears: 10,
		graceYears: 0,
		upfrontFee: 0,
		commitmentFee: 0,
		fundingOrder: 'pro-rata',
		repayment: 'annuity',
		capitalizeInterestDuringConstruction: true,
		gearing: 0.6,
		targetDscr: 1.3,
		maxGearing: 0.8,
		downsideCases: [],
		...t
	}) as unknown as DebtTerms;
const p50 = (cfads: Decimal[], targetDscr = 1.3): SizingCase => ({ label: 'P50', exceedancePercent: null, horizonYears: null, targetDscr, cfads });
const p90 = (cfads: Decimal[], targetDscr: number): SizingCase => ({ label: 'P90', exceedancePercent: 90, horizonYears: 1, targetDscr, cfads });
/** One construction year, everything spent at COD (year-end): no interest during construction. */
const atCod = { timeline: buildTimeline(1, 20, 'year-end'), operatingYears: 20 };

describe('structureDebt', () => {
	it('sizes by gearing and schedules an annuity matching the npm financial pmt', () => {
		// 60 % of 1 M at t = 0; annuity 8 % over 10 years: pmt(0.08, 10, -600 k) (npm financial).
		const s = structureDebt({ ...atCod, terms: terms({ sizing: 'gearing' }), spend: [dec(1_000_000)], cases: [p50(level(200_000, 20))] });
		expect(s.balanceAtCod.toNumber()).toBeCloseTo(600_000, 8);
		expect(s.debtService[0].toNumber()).toBeCloseTo(financial.pmt(0.08, 10, -600_000), 6);
		expect(s.debtService[10].toString()).toBe('0');
		expect(s.rows).toHaveLength(20);
	});

	it('sizes an annuity to the target DSCR on the weakest year', () => {
		// Largest D with CFADS_k / (D x CRF) >= 1.3 in every year: D = min CFADS / (1.3 x CRF(8 %, 10)).
		const cfads = [...level(200_000, 5), ...level(150_000, 15)];
		const s = structureDebt({ ...atCod, terms: terms({ sizing: 'target-dscr', maxGearing: 1 }), spend: [dec(5_000_000)], cases: [p50(cfads)] });
		const crf = financial.pmt(0.08, 10, -1);
		expect(s.balanceAtCod.toNumber()).toBeCloseTo(150_000 / (1.3 * crf), 6);
		expect(s.sizedBy).toBe('target-dscr');
		expect(s.governingCase).toBe('P50');
	});

	it('refuses to size on non-positive CFADS, naming every such year', () => {
		const cfads = [dec(-1), dec(0), ...level(100, 18)];
		const s = structureDebt({ ...atCod, terms: terms({ sizing: 'target-dscr' }), spend: [dec(1000)], cases: [p50(cfads)] });
		expect(s.balanceAtCod.toString()).toBe('0');
		expect(s.warnings[0]).toBe('Debt cannot be sized to a DSCR: CFADS is not positive in operating years 1 and 2.');
	});

	it('charges the upfront fee on the debt amount and keeps grace years interest-only', () => {
		// 50 % of the funding need, the fee part of it: D = 0.5 (2 M + 0.02 D), D = 1 M / 0.99.
		const s = structureDebt({
			...atCod,
			terms: terms({ sizing: 'gearing', gearing: 0.5, upfrontFee: 0.02, graceYears: 2, repayment: 'straight-line' }),
			spend: [dec(2_000_000)],
			cases: [p50(level(300_000, 20))]
		});
		const debt = 1_000_000 / 0.99;
		expect(s.funding.upfrontFee.toNumber()).toBeCloseTo(0.02 * debt, 6);
		// Straight line over 8 repayment years after 2 interest-only years.
		expect(s.rows[0].principal.toString()).toBe('0');
		expect(s.rows[1].interest.toNumber()).toBeCloseTo(0.08 * debt, 6);
		expect(s.rows[2].principal.toNumber()).toBeCloseTo(debt / 8, 6);
	});

	it('sizes on P50 and P90 each at its own target and lets the lesser govern (hand calculation)', () => {
		// Annuity 8 % over 10 years, CRF = pmt(0.08, 10, -1) (npm financial). P50 CFADS 1.3 M a year at 1.30 allows
		// 1 M / CRF; P90 CFADS 1.1 M at 1.20 allows 1.1 / 1.2 = 0.916667 M / CRF, the lesser: P90 governs.
		const crf = financial.pmt(0.08, 10, -1);
		const s = structureDebt({
			...atCod,
			terms: terms({ sizing: 'target-dscr', maxGearing: 1 }),
			spend: [dec(50_000_000)],
			cases: [p50(level(1_300_000, 20), 1.3), p90(level(1_100_000, 20), 1.2)]
		});
		expect(s.governingCase).toBe('P90');
		expect(s.capacities.map((c) => c.balance.toNumber())).toEqual([expect.closeTo(1_000_000 / crf, 6), expect.closeTo(1_100_000 / 1.2 / crf, 6)]);
		expect(s.balanceAtCod.toNumber()).toBeCloseTo(1_100_000 / 1.2 / crf, 6);
		// Under P90 energy the cover is exactly its target; under P50 it is 1.3 x 1.2 / 1.1 = 1.41818.
		expect(1_100_000 / s.debtService[0].toNumber()).toBeCloseTo(1.2, 9);
		expect(1_300_000 / s.debtService[0].toNumber()).toBeCloseTo((1.3 * 1.2) / 1.1, 9);
	});

	it('keeps a sculpted loan inside its target in grace years too', () => {
		// Year 1 is interest only and its CFADS is low (50): sculpting years 2-10 at 130 / 1.3 = 100 a year would
		// borrow 100 x annuity factor(8 %, 9) = 624.69 and pay 49.98 interest in year 1, a DSCR of 1.0004. The grace
		// year allows at most 50 / (1.3 x 0.08) = 480.77, which governs; the repayment years then cover more.
		const cfads = [dec(50), ...level(130, 19)];
		const s = structureDebt({ ...atCod, terms: terms({ sizing: 'target-dscr', maxGearing: 1, graceYears: 1, repayment: 'sculpted' }), spend: [dec(5000)], cases: [p50(cfads)] });
		expect(s.capacities[0].limitedBy).toBe('grace');
		expect(s.balanceAtCod.toNumber()).toBeCloseTo(50 / (1.3 * 0.08), 8);
		expect(50 / s.debtService[0].toNumber()).toBeCloseTo(1.3, 9);
		const repayment = s.debtService.slice(1, 10).map((ds) => 130 / ds.toNumber());
		for (const dscr of repayment) expect(dscr).toBeCloseTo(repayment[0], 9);
		expect(repayment[0]).toBeGreaterThan(1.3);
		expect(-financial.pv(0.08, 9, 100)).toBeGreaterThan(s.balanceAtCod.toNumber());
	});

	it("holds the governing case's DSCR at its target in every repayment year of a sculpted loan, and every case at or above its own (property)", () => {
		// Seeded random cases: P50 CFADS with a ramp and noise, P90 a share of it less fixed costs (so the case that
		// binds can change from year to year), random targets, tenors, grace and rates.
		let seed = 12345;
		const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
		let checkedYears = 0;
		for (let trial = 0; trial < 25; trial++) {
			const years = 20;
			const base = Array.from({ length: years }, (_, k) => dec(900_000 + 300_000 * random() + (k < 2 ? -200_000 : 0)));
			const share = 0.8 + 0.15 * random();
			const downside = base.map((c) => c.times(share).minus(50_000 + 100_000 * random()));
			const grace = Math.floor(random() * 2);
			const tenor = 8 + Math.floor(random() * 8);
			const cases = [p50(base, 1.3 + 0.2 * random()), p90(downside, 1.05 + 0.2 * random())];
			const s = structureDebt({
				timeline: buildTimeline(2, years, 'mid-year'),
				operatingYears: years,
				terms: terms({ sizing: 'target-dscr', maxGearing: 1, graceYears: grace, tenorYears: tenor, repayment: 'sculpted', interestRate: 0.05 + 0.04 * random() }),
				spend: [dec(30_000_000), dec(30_000_000), dec(0)],
				cases
			});
			expect(s.bindingCases).toHaveLength(tenor);
			const cover = (c: SizingCase, k: number) => c.cfads[k].div(s.debtService[k]).toNumber();
			for (let k = 0; k < tenor; k++) for (const c of cases) expect(cover(c, k)).toBeGreaterThanOrEqual(c.targetDscr - 1e-9);
			if (s.sizedBy !== 'target-dscr' || grace > 0) continue;
			for (let k = 0; k < tenor; k++) {
				const binding = cases.find((c) => c.label === s.bindingCases[k])!;
				expect(cover(binding, k)).toBeCloseTo(binding.targetDscr, 9);
				checkedYears++;
			}
			expect([s.bindingCases.includes(s.governingCase!)]).toEqual([true]);
		}
		expect(checkedYears).toBeGreaterThan(50);
	});
});
