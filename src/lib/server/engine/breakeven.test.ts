import { describe, expect, it } from 'vitest';
import * as financial from 'financial';
import { atbCase } from './testing/fixtures';
import { estimateEnergy } from './energy/yield';
import { operate, prepareCase } from './cashflow';
import { flatRealPricePath } from './revenue';
import { solveBreakevenTariff } from './breakeven';
import { Decimal } from './decimal';

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

	it('is lower than the LCOE by the grant when there is one (the LCOE leaves grants out, the breakeven counts them as money received)', () => {
		// Same FCR form as above with the grant netted from the 50 M capex it arrives with: (CRF(8 %, 20) x 40 M + 2 M) / 30,660.
		const s = atbCase({ revenue: { grants: [{ name: 'Innovation grant', basis: 'lump-sum', amount: 10e6 }] } });
		const solved = solveBreakevenTariff(prepareCase(s, estimateEnergy(s)));
		if (solved.tariffPerMWh === null) throw new Error(solved.reason);
		const lcoe = (financial.pmt(0.08, 20, -1) * 50e6 + 2e6) / 30660;
		expect(solved.tariffPerMWh.toNumber()).toBeCloseTo((financial.pmt(0.08, 20, -1) * 40e6 + 2e6) / 30660, 6);
		expect(solved.tariffPerMWh.toNumber()).toBeLessThan(lcoe);
	});

	it('indexes the breakeven price to the tariff inflation when it differs from cost inflation', () => {
		// The breakeven is a fully indexed tariff: p x (1 + j)^k with j the tariff inflation (3.5 %), costs at 2 %.
		// Revenue rising faster than costs needs a lower starting price than the real LCOE (which it equals at j = i).
		const s = atbCase({ finance: { inflation: 0.02 }, revenue: { tariffInflation: 0.035 } });
		const prep = prepareCase(s, estimateEnergy(s));
		const solved = solveBreakevenTariff(prep);
		if (solved.tariffPerMWh === null) throw new Error(solved.reason);
		expect(operate(prep, flatRealPricePath(solved.tariffPerMWh, prep.tariffPriceIndex)).npv.abs().toNumber()).toBeLessThan(1e-6);
		const same = atbCase({ finance: { inflation: 0.02 } });
		const atGeneral = solveBreakevenTariff(prepareCase(same, estimateEnergy(same)));
		if (atGeneral.tariffPerMWh === null) throw new Error(atGeneral.reason);
		expect(solved.tariffPerMWh.lt(atGeneral.tariffPerMWh)).toBe(true);
	});

	it('says why when there is no energy', () => {
		const s = atbCase({ array: { availability: 0 } });
		const solved = solveBreakevenTariff(prepareCase(s, estimateEnergy(s)));
		expect(solved.tariffPerMWh).toBeNull();
	});
});

describe('flatTariffNpv', () => {
	it('gives the NPV of the full cash-flow pass at any flat tariff', async () => {
		const { flatTariffNpv } = await import('./breakeven');
		const s = atbCase({
			opex: { lines: [{ name: 'lease', basis: 'percent-of-revenue', fraction: 0.04 }, { name: 'om', basis: 'per-MWh', amount: 20 }] },
			decommissioning: { basis: 'lump-sum', amount: 5e6 },
			timeline: { constructionYears: 2 },
			finance: { inflation: 0.02, taxRate: 0.3, depreciation: { method: 'declining-balance', lifeYears: 10 } }
		});
		const prep = prepareCase(s, estimateEnergy(s));
		const fast = flatTariffNpv(prep);
		for (const p of [0, 120, 250, 400]) {
			const full = operate(prep, flatRealPricePath(new Decimal(p), prep.priceIndex.operation)).npv;
			expect(fast(new Decimal(p)).minus(full).abs().toNumber()).toBeLessThan(1e-15);
		}
	});
});
