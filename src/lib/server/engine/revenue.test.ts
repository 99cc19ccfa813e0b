import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as financial from 'financial';
import type { Scenario } from '../../schemas/scenario';
import { dec } from './decimal';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed, evaluateScenario } from './evaluate';
import { deliveredEnergy, flatRealPricePath, grantSchedule, nominalPricePath, revenueByYear, tariffIndexPath, tariffInflationOf } from './revenue';

type Revenue = Scenario['revenue'];
const base: Revenue = {
	tariffPerMWh: 200,
	supportYears: 2,
	tariffIndexation: 1,
	indexationMethod: 'indexed-share',
	indexationBaseYearsBeforeCod: 0,
	curtailment: 0,
	merchantPricePerMWh: 50,
	merchantEscalation: 0,
	grants: []
};
const prices = (revenue: Partial<Revenue>, inflation = 0.02, years = 4) => nominalPricePath({ ...base, ...revenue }, inflation, years).map(String);

describe('tariffIndexPath', () => {
	it('indexes a share of the price and keeps the rest fixed in money (indexed-share)', () => {
		// Hand calculation, I_k = a (1 + j)^k + (1 - a). A contract indexing 20 % of its price to CPI
		// (Ontario Renewable Energy Standard Offer Program 2006, s. 5.5), CPI 3 %, price 100:
		//   k = 1: 0.2 x 1.03      + 0.8 = 1.006     -> 100.6
		//   k = 2: 0.2 x 1.0609    + 0.8 = 1.01218   -> 101.218
		//   k = 3: 0.2 x 1.092727  + 0.8 = 1.0185454 -> 101.85454
		const revenue = { ...base, tariffPerMWh: 100, supportYears: 3, tariffIndexation: 0.2 };
		expect(nominalPricePath(revenue, 0.03, 3).map(String)).toEqual(['100.6', '101.218', '101.85454']);
		expect(tariffIndexPath(revenue, 0.03, 3).map(String)).toEqual(['1.006', '1.01218', '1.0185454']);
	});

	it('grows the whole price at a x j (scaled-inflation, the version 2 reading)', () => {
		// Hand calculation, I_k = (1 + a j)^k with a = 0.2, j = 3 %: 1.006, 1.006^2 = 1.012036, 1.006^3 = 1.018108216.
		const revenue = { ...base, tariffPerMWh: 100, supportYears: 3, tariffIndexation: 0.2, indexationMethod: 'scaled-inflation' as const };
		expect(nominalPricePath(revenue, 0.03, 3).map(String)).toEqual(['100.6', '101.2036', '101.8108216']);
	});

	it('gives the same path under both methods for a = 0 and a = 1', () => {
		// a (1 + j)^n + (1 - a) and (1 + a j)^n are both 1 at a = 0 and both (1 + j)^n at a = 1 (algebra).
		fc.assert(
			fc.property(
				fc.constantFrom(0, 1),
				fc.double({ min: -0.05, max: 0.2, noNaN: true }),
				fc.integer({ min: 0, max: 20 }),
				fc.integer({ min: 1, max: 40 }),
				(a, j, baseYears, years) => {
					const revenue = { ...base, tariffIndexation: a, indexationBaseYearsBeforeCod: baseYears };
					const share = tariffIndexPath({ ...revenue, indexationMethod: 'indexed-share' }, j, years).map(String);
					const scaled = tariffIndexPath({ ...revenue, indexationMethod: 'scaled-inflation' }, j, years).map(String);
					return share.join() === scaled.join();
				}
			),
			{ numRuns: 60 }
		);
	});

	it('indexes from a base year before COD, so the tariff has grown by COD', () => {
		// Base year 2 years before COD, a = 0.5, j = 2 %, tariff 200 in base-year prices.
		// At COD the price would already be 200 x (0.5 x 1.0404 + 0.5) = 204.04; in operating years:
		//   k = 1: 200 x (0.5 x 1.02^3 + 0.5) = 200 x (0.5 x 1.061208   + 0.5) = 206.1208
		//   k = 2: 200 x (0.5 x 1.02^4 + 0.5) = 200 x (0.5 x 1.08243216 + 0.5) = 208.243216
		// The merchant price is in COD-year prices and is not moved by the base year: 50 x 1.02^3, 50 x 1.02^4.
		expect(prices({ tariffIndexation: 0.5, indexationBaseYearsBeforeCod: 2 })).toEqual(['206.1208', '208.243216', '53.0604', '54.121608']);
		// scaled-inflation from the same base year: 200 x 1.01^3 = 206.0602, 200 x 1.01^4 = 208.120802.
		expect(prices({ tariffIndexation: 0.5, indexationBaseYearsBeforeCod: 2, indexationMethod: 'scaled-inflation' }).slice(0, 2)).toEqual([
			'206.0602',
			'208.120802'
		]);
		// Fully indexed: 200 x 1.02^3 = 212.2416.
		expect(prices({ indexationBaseYearsBeforeCod: 2 })[0]).toBe('212.2416');
	});
});

describe('nominalPricePath', () => {
	it('indexes the tariff in the support years, then pays the merchant price in real terms', () => {
		// Hand calculation with 2 % inflation: 200 x 1.02, 200 x 1.0404, then 50 x 1.061208, 50 x 1.08243216.
		expect(prices({})).toEqual(['204', '208.08', '53.0604', '54.121608']);
	});

	it('keeps a non-indexed tariff flat and indexes half the price with share 0.5', () => {
		expect(prices({ tariffIndexation: 0 }).slice(0, 2)).toEqual(['200', '200']);
		// 200 x (0.5 x 1.02 + 0.5) = 202; 200 x (0.5 x 1.0404 + 0.5) = 204.04 (indexed-share);
		// 200 x 1.01 = 202; 200 x 1.0201 = 204.02 (scaled-inflation): the two part from year 2.
		expect(prices({ tariffIndexation: 0.5 }).slice(0, 2)).toEqual(['202', '204.04']);
		expect(prices({ tariffIndexation: 0.5, indexationMethod: 'scaled-inflation' }).slice(0, 2)).toEqual(['202', '204.02']);
	});

	it('follows the tariff inflation it is given, for the tariff and the merchant price', () => {
		// Tariff inflation 3 %: 200 x 1.03 = 206, 200 x 1.0609 = 212.18, 50 x 1.092727 = 54.63635, 50 x 1.12550881 = 56.2754405.
		expect(prices({}, 0.03)).toEqual(['206', '212.18', '54.63635', '56.2754405']);
		// Real merchant escalation 1 % on top: 50 x 1.03^3 x 1.01^3 = 54.63635 x 1.030301 = 56.29188604135.
		expect(prices({ merchantEscalation: 0.01 }, 0.03)[2]).toBe('56.29188604135');
	});
});

describe('tariffInflationOf', () => {
	it('is revenue.tariffInflation when given, the general inflation otherwise', () => {
		expect(tariffInflationOf(atbCase({ finance: { inflation: 0.02 } })).toString()).toBe('0.02');
		expect(tariffInflationOf(atbCase({ finance: { inflation: 0.02 }, revenue: { tariffInflation: 0.035 } })).toString()).toBe('0.035');
	});

	it('moves the price and nothing on the cost side when only the tariff inflation changes', () => {
		const opexLines = { lines: [{ name: 'O&M', basis: 'per-kW-year', amount: 200, escalation: 0 }, { name: 'Variable', basis: 'per-MWh', amount: 8 }] };
		const general = evaluateDetailed(atbCase({ finance: { inflation: 0.02 }, opex: opexLines }));
		const separate = evaluateDetailed(atbCase({ finance: { inflation: 0.02 }, opex: opexLines, revenue: { tariffInflation: 0.04 } }));
		expect(separate.operating.opex.map(String)).toEqual(general.operating.opex.map(String));
		expect(separate.prep.capex.nominal.map(String)).toEqual(general.prep.capex.nominal.map(String));
		expect(separate.prep.nominalDiscountRate.toString()).toBe(general.prep.nominalDiscountRate.toString());
		expect(separate.metrics.lcoeReal!.toString()).toBe(general.metrics.lcoeReal!.toString());
		// Year-1 price: 300 x 1.04 = 312 against 300 x 1.02 = 306; year 2: 300 x 1.0816 = 324.48.
		expect(separate.operating.pricePerMWh.slice(0, 2).map(String)).toEqual(['312', '324.48']);
		expect(general.operating.pricePerMWh[0].toString()).toBe('306');
		expect(separate.metrics.npv!.gt(general.metrics.npv!)).toBe(true);
	});
});

describe('deliveredEnergy', () => {
	it('takes the curtailed share off the net energy', () => {
		// 30,660 MWh with 10 % curtailed: 30,660 x 0.9 = 27,594 MWh delivered.
		expect(deliveredEnergy(dec(30660), 0.1).toString()).toBe('27594');
		expect(deliveredEnergy(dec(30660), 0).toString()).toBe('30660');
	});

	it('reaches revenue, per-MWh opex, LCOE and the cash-flow table (end to end)', () => {
		// The fixed-charge-rate case (fixtures: 30,660 MWh a year, 50 M capex at COD, 2 M fixed O&M, 8 %, 20 years,
		// no inflation) with 10 % curtailment and a 10 per MWh variable cost on the energy delivered:
		//   delivered 27,594 MWh; revenue year 1 = 27,594 x 300 = 8,278,200; opex = 2,000,000 + 27,594 x 10 = 2,275,940;
		//   LCOE = (CRF(8 %, 20) x 50 M + 2 M) / 27,594 + 10 (CRF by -pmt of the npm financial package).
		const s = atbCase({
			revenue: { curtailment: 0.1 },
			opex: { lines: [{ name: 'Fixed O&M', basis: 'percent-of-capex', fraction: 0.04 }, { name: 'Grid charge', basis: 'per-MWh', amount: 10 }] }
		});
		const detailed = evaluateDetailed(s);
		expect(detailed.operating.revenue[0].toString()).toBe('8278200');
		expect(detailed.operating.opex[0].toString()).toBe('2275940');
		const lcoe = (financial.pmt(0.08, 20, -1) * 50e6 + 2e6) / 27594 + 10;
		expect(detailed.metrics.lcoeReal!.toNumber()).toBeCloseTo(lcoe, 8);
		expect(detailed.metrics.lcoeFcr!.toNumber()).toBeCloseTo(lcoe, 8);
		// The array still generates the net AEP; the capacity factor describes generation, not sales.
		expect(detailed.metrics.netAepMWh!.toString()).toBe('30660');

		const result = evaluateScenario(s);
		expect(result.energy).toMatchObject({ curtailment: '0.1', curtailedAepMWh: '3066', deliveredAepMWh: '27594', netAepMWh: '30660' });
		const operating = result.cashFlow.filter((row) => row.phase === 'operation');
		expect(operating.every((row) => row.energyMWh === '27594')).toBe(true);
	});

	it('leaves LCOE and breakeven undefined, with the reason, when everything is curtailed', () => {
		const detailed = evaluateDetailed(atbCase({ revenue: { curtailment: 1 } }));
		expect(detailed.metrics.lcoeReal).toBeNull();
		expect(detailed.metrics.lcoeFcr).toBeNull();
		expect(detailed.metrics.breakevenTariff).toBeNull();
		expect(detailed.warnings.some((w) => w.includes('no energy is delivered'))).toBe(true);
	});
});

describe('revenueByYear and flatRealPricePath', () => {
	it('multiply energy by price', () => {
		const index = [1.02, 1.0404, 1.061208, 1.08243216].map((x) => dec(x));
		expect(revenueByYear([dec(10), dec(20)], [dec(3), dec(4)]).map(String)).toEqual(['30', '80']);
		expect(flatRealPricePath(dec(100), index).map(String)).toEqual(['102', '104.04', '106.1208', '108.243216']);
	});
});

describe('grantSchedule', () => {
	it('pays grants pro rata to capex spend and caps them at capex', () => {
		// Lump 100 + 10 % of 1000 = 200 of 1000 capex: 20 % of each year's spend.
		const g = grantSchedule(
			[
				{ name: 'a', basis: 'lump-sum', amount: 100 },
				{ name: 'b', basis: 'percent-of-capex', fraction: 0.1 }
			],
			dec(1000),
			[dec(400), dec(600)],
			[dec(1), dec(1)]
		);
		expect(g.nominal.map(String)).toEqual(['80', '120']);
		const capped = grantSchedule([{ name: 'a', basis: 'lump-sum', amount: 5000 }], dec(1000), [dec(1000)], [dec(1)]);
		expect(capped.capped).toBe(true);
		expect(capped.realTotal.toString()).toBe('1000');
	});
});
