import { describe, expect, it } from 'vitest';
import { dec, Decimal, ZERO } from './decimal';
import { fundConstruction, type ConstructionFundingInputs } from './construction-funding';
import { buildTimeline } from './timeline';

const base = (patch: Partial<ConstructionFundingInputs>): ConstructionFundingInputs => ({
	times: [0],
	financialClose: -1,
	spend: [dec(10_000_000)],
	reserveAtCod: ZERO,
	rate: dec(0.08),
	commitmentFee: ZERO,
	upfrontFee: ZERO,
	capitaliseInterest: true,
	order: 'pro-rata',
	debtFor: (need) => need.times(0.6),
	...patch
});

const near = (a: Decimal, b: number, tolerance = 1e-6) => expect(a.minus(b).abs().toNumber()).toBeLessThan(tolerance);

describe('fundConstruction', () => {
	it('charges interest on a one-year build spent mid-year (hand calculation)', () => {
		// Spend S = 10 M at t = -0.5, 60 % gearing on the funding need, 8 %, interest capitalised, pro rata.
		// The debt's share s of the payment grows by g = 1.08^0.5 to COD: D = s S g, IDC = s S (g - 1),
		// and D = 0.6 (S + IDC) gives s = 0.6 / (g - 0.6 (g - 1)).
		const timeline = buildTimeline(1, 20, 'mid-year');
		const funding = fundConstruction(base({ times: timeline.constructionTimes, spend: [dec(10_000_000), ZERO] }));
		const g = Math.sqrt(1.08);
		const s = 0.6 / (g - 0.6 * (g - 1));
		near(funding.balanceAtCod, s * 10_000_000 * g);
		near(funding.interestDuringConstruction, s * 10_000_000 * (g - 1));
		near(funding.gearing, 0.6, 1e-12);
		near(funding.totalFundingNeed, 10_000_000 * (1 + s * (g - 1)));
		// At year-end the same build has no interest during construction at all.
		const yearEnd = fundConstruction(base({}));
		expect(yearEnd.interestDuringConstruction.toString()).toBe('0');
		near(yearEnd.balanceAtCod, 6_000_000);
	});

	it('draws equity first, so a two-year build pays less interest than pro rata (hand calculation)', () => {
		// 25 M at t = -1 and 25 M at t = 0 (year-end), 50 % gearing, 10 %. Equity first: equity (half of the need)
		// pays all of t = -1 and the debt is drawn only at t = 0, so there is no interest: D = 25 M.
		// Pro rata: D = 52.5 M s, IDC = 2.5 M s, D = 0.5 (50 M + 2.5 M s): s = 25 / 51.25.
		const common = { times: [-1, 0], financialClose: -2, spend: [dec(25_000_000), dec(25_000_000)], rate: dec(0.1), debtFor: (need: Decimal) => need.times(0.5) };
		const equityFirst = fundConstruction(base({ ...common, order: 'equity-first' }));
		near(equityFirst.balanceAtCod, 25_000_000);
		expect(equityFirst.interestDuringConstruction.toNumber()).toBeCloseTo(0, 6);
		near(equityFirst.equity[0], 25_000_000);
		const proRata = fundConstruction(base({ ...common, order: 'pro-rata' }));
		const s = 25 / 51.25;
		near(proRata.balanceAtCod, 52_500_000 * s);
		near(proRata.interestDuringConstruction, 2_500_000 * s);
		expect(proRata.balanceAtCod.gt(equityFirst.balanceAtCod)).toBe(true);
	});

	it('charges the commitment fee on the undrawn facility and funds it like spend (hand calculation)', () => {
		// Year-end one-year build: financial close at t = -1, everything drawn at t = 0, so the whole facility D is
		// undrawn for a year: fee = c D. D = 0.6 (S + c D) gives D = 0.6 S / (1 - 0.6 c); c = 1 %, S = 10 M.
		const funding = fundConstruction(base({ commitmentFee: dec(0.01) }));
		const d = (0.6 * 10_000_000) / (1 - 0.6 * 0.01);
		near(funding.balanceAtCod, d);
		near(funding.commitmentFees[0], 0.01 * d);
		near(funding.financingCosts, 0.01 * d);
	});

	it('has equity pay interest that is not capitalised, still counting it in the funding need', () => {
		// 25 M at t = -1 and t = 0 pro rata, 10 %, 50 %: D = 50 M s, U = 50 M + 2.5 M s, s = 25 / 48.75.
		const funding = fundConstruction(
			base({ times: [-1, 0], financialClose: -2, spend: [dec(25_000_000), dec(25_000_000)], rate: dec(0.1), capitaliseInterest: false, debtFor: (n) => n.times(0.5) })
		);
		const s = 25 / 48.75;
		near(funding.balanceAtCod, 50_000_000 * s);
		near(funding.interestPaid[1], 2_500_000 * s);
		near(funding.equity[1], 25_000_000 * (1 - s) + 2_500_000 * s);
	});

	it('funds a reserve at COD as a use, and stops at a debt limit that does not depend on the need', () => {
		const funding = fundConstruction(base({ reserveAtCod: dec(1_000_000), debtFor: (need) => Decimal.min(dec(5_000_000), need.times(0.8)) }));
		near(funding.balanceAtCod, 5_000_000);
		near(funding.totalFundingNeed, 11_000_000);
		near(funding.equity[0], 6_000_000);
	});

	it('solves every timing and order to the gearing asked', () => {
		for (const timing of ['mid-year', 'quarterly', 'monthly', 'year-end'] as const) {
			for (const order of ['equity-first', 'pro-rata'] as const) {
				const timeline = buildTimeline(3, 20, timing);
				const spend = timeline.constructionTimes.map((_, p) => dec(1_000_000).times(timeline.constructionShares[p]).times(timeline.constructionYearOf[p] + 1));
				const funding = fundConstruction(
					base({ times: timeline.constructionTimes, financialClose: timeline.financialClose, spend, order, commitmentFee: dec(0.005), upfrontFee: dec(0.02), debtFor: (n) => n.times(0.7) })
				);
				expect(funding.settled).toBe(true);
				near(funding.gearing, 0.7, 1e-12);
				// Uses balance: equity + draws = spend + fees (+ nothing else: interest is capitalised).
				let paidIn = ZERO;
				for (let p = 0; p < spend.length; p++) paidIn = paidIn.plus(funding.equity[p]).plus(funding.draws[p]);
				near(paidIn.plus(funding.interestDuringConstruction), funding.totalFundingNeed.toNumber(), 1e-6);
			}
		}
	});
});
