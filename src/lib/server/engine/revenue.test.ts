import { describe, expect, it } from 'vitest';
import { dec, Decimal } from './decimal';
import { flatRealPricePath, grantSchedule, nominalPricePath, revenueByYear } from './revenue';

const index = [1.02, 1.0404, 1.061208, 1.08243216].map((x) => new Decimal(x));
const base = { tariffPerMWh: 200, supportYears: 2, tariffIndexation: 1, merchantPricePerMWh: 50, merchantEscalation: 0, grants: [] };

describe('nominalPricePath', () => {
	it('indexes the tariff in the support years, then pays the merchant price in real terms', () => {
		// Hand calculation with 2 % inflation: 200 x 1.02, 200 x 1.0404, then 50 x 1.061208, 50 x 1.08243216.
		expect(nominalPricePath(base, 0.02, index).map(String)).toEqual(['204', '208.08', '53.0604', '54.121608']);
	});
	it('keeps a non-indexed tariff flat in nominal terms and half-indexes with share 0.5', () => {
		expect(nominalPricePath({ ...base, tariffIndexation: 0 }, 0.02, index).slice(0, 2).map(String)).toEqual(['200', '200']);
		expect(nominalPricePath({ ...base, tariffIndexation: 0.5 }, 0.02, index).slice(0, 2).map(String)).toEqual(['202', '204.02']);
	});
});

describe('revenueByYear and flatRealPricePath', () => {
	it('multiply energy by price', () => {
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
