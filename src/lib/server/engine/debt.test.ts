import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { dec, Decimal } from './decimal';
import { structureDebt, type DebtTerms } from './debt';

const level = (x: number, n: number) => Array.from({ length: n }, () => new Decimal(x));
const terms = (t: Partial<DebtTerms> & { sizing: DebtTerms['sizing'] }): DebtTerms =>
	({ interestRate: 0.08, tenorYears: 10, graceYears: 0, upfrontFee: 0, repayment: 'annuity', capitalizeInterestDuringConstruction: true, gearing: 0.6, targetDscr: 1.3, maxGearing: 0.8, ...t }) as unknown as DebtTerms;

describe('structureDebt', () => {
	it('sizes by gearing and schedules an annuity matching the npm financial pmt', () => {
		// 60 % of 1 M at t = 0; annuity 8 % over 10 years: pmt(0.08, 10, -600 k) (npm financial).
		const s = structureDebt({ terms: terms({ sizing: 'gearing' }), fundingNeed: [dec(1_000_000)], cfads: level(200_000, 20), operatingYears: 20 });
		expect(s.balanceAtCod.toString()).toBe('600000');
		expect(s.debtService[0].toNumber()).toBeCloseTo(financial.pmt(0.08, 10, -600_000), 8);
		expect(s.debtService[10].toString()).toBe('0');
		expect(s.rows).toHaveLength(20);
	});

	it('sizes an annuity to the target DSCR on the weakest year', () => {
		// Largest D with CFADS_k / (D x CRF) >= 1.3 in every year: D = min CFADS / (1.3 x CRF(8 %, 10)).
		const cfads = [...level(200_000, 5), ...level(150_000, 15)];
		const s = structureDebt({ terms: terms({ sizing: 'target-dscr', maxGearing: 1 }), fundingNeed: [dec(5_000_000)], cfads, operatingYears: 20 });
		const crf = financial.pmt(0.08, 10, -1);
		expect(s.balanceAtCod.toNumber()).toBeCloseTo(150_000 / (1.3 * crf), 6);
		expect(s.sizedBy).toBe('target-dscr');
	});

	it('refuses to size on non-positive CFADS, with a warning', () => {
		const s = structureDebt({ terms: terms({ sizing: 'target-dscr' }), fundingNeed: [dec(1000)], cfads: [dec(-1), ...level(100, 19)], operatingYears: 20 });
		expect(s.balanceAtCod.toString()).toBe('0');
		expect(s.warnings[0]).toMatch(/not positive in operating year 1/);
	});

	it('charges the upfront fee on the debt amount and keeps grace years interest-only', () => {
		const s = structureDebt({
			terms: terms({ sizing: 'gearing', gearing: 0.5, upfrontFee: 0.02, graceYears: 2, repayment: 'straight-line' }),
			fundingNeed: [dec(2_000_000)],
			cfads: level(300_000, 20),
			operatingYears: 20
		});
		expect(s.upfrontFee.toString()).toBe('20000');
		// Straight line over 8 repayment years after 2 interest-only years: 1 M x 8 % = 80 k interest, then 125 k principal.
		expect(s.rows[0].principal.toString()).toBe('0');
		expect(s.rows[1].interest.toString()).toBe('80000');
		expect(s.rows[2].principal.toString()).toBe('125000');
	});
});
