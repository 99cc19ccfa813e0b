import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { atbCase } from './testing/fixtures';
import { estimateEnergy } from './energy/yield';
import { operate, prepareCase } from './cashflow';
import { flatRealPricePath } from './revenue';
import { solveBreakevenTariff } from './breakeven';

describe('solveBreakevenTariff', () => {
	it('finds the flat real tariff with zero post-tax NPV, also with inflation', () => {
		// With no tax the breakeven equals the discounted real LCOE: (CRF(8 %, 20) x 50 M + 2 M) / 30,660 = 231.3311
		// (NREL ATB FCR form, CHECK-VALUES); inflation does not change a real breakeven when every cost is real.
		for (const inflation of [0, 0.025]) {
			const s = atbCase({ finance: { inflation } });
			const prep = prepareCase(s, estimateEnergy(s));
			const solved = solveBreakevenTariff(prep);
			if (solved.tariffPerMWh === null) throw new Error(solved.reason);
			expect(solved.tariffPerMWh.toNumber()).toBeCloseTo((financial.pmt(0.08, 20, -1) * 50e6 + 2e6) / 30660, 6);
			expect(operate(prep, flatRealPricePath(solved.tariffPerMWh, prep.priceIndex.operation)).npv.abs().toNumber()).toBeLessThan(1e-6);
			expect(solved.evaluations).toBeLessThanOrEqual(4);
		}
	});

	it('says why when there is no energy', () => {
		const s = atbCase({ array: { availability: 0 } });
		const solved = solveBreakevenTariff(prepareCase(s, estimateEnergy(s)));
		expect(solved.tariffPerMWh).toBeNull();
	});
});
