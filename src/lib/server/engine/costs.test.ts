import { describe, expect, it } from 'vitest';
import { dec, Decimal } from './decimal';
import { capexSchedule, decommissioningCost, opexSchedule, overhaulSchedules, totalOpex } from './costs';

const ones = (n: number) => Array.from({ length: n }, () => dec(1));

describe('capexSchedule', () => {
	it('prices lump-sum, per-kW and per-device lines with contingency and phasing', () => {
		// Hand calculation: (1 M + 100 x 2000 kW + 50 k x 4 devices) x 1.1 = 1.54 M, spread 25/75.
		const s = capexSchedule(
			{
				phasing: [0.25, 0.75],
				contingency: 0.1,
				lines: [
					{ name: 'a', basis: 'lump-sum', amount: 1_000_000 },
					{ name: 'b', basis: 'per-kW', amount: 100 },
					{ name: 'c', basis: 'per-device', amount: 50_000 }
				]
			},
			dec(2000),
			4,
			ones(2)
		);
		expect(s.realTotal.toString()).toBe('1540000');
		expect(s.real.map(String)).toEqual(['385000', '1155000']);
	});
	it('uses a line phasing over the default, an even spread by default, and inflates to nominal', () => {
		// (1 + i)^t with i = 10 %: t = -1 -> 1/1.1, t = 0 -> 1.
		const s = capexSchedule(
			{ contingency: 0, lines: [{ name: 'a', basis: 'lump-sum', amount: 100, phasing: [1, 0] }, { name: 'b', basis: 'lump-sum', amount: 100 }] },
			dec(1),
			1,
			[dec(1).div(1.1), dec(1)]
		);
		expect(s.real.map(String)).toEqual(['150', '50']);
		expect(s.nominal[0].toNumber()).toBeCloseTo(150 / 1.1, 12);
	});
});

describe('opexSchedule', () => {
	const ctx = {
		installedKW: dec(1000),
		deviceCount: 5,
		capexRealTotal: dec(10_000_000),
		energyMWh: [dec(3000), dec(2900), dec(2800), dec(2700)],
		priceIndex: [1.02, 1.0404, 1.061208, 1.08243216].map((x) => new Decimal(x))
	};
	it('prices each basis and indexes it', () => {
		// Hand calculation, year 1 (index 1.02): 200/kW -> 204,000; 5/MWh x 3000 -> 15,300; 1 % of 10 M -> 102,000.
		const s = opexSchedule(
			{
				lines: [
					{ name: 'om', basis: 'per-kW-year', amount: 200, escalation: 0 },
					{ name: 'var', basis: 'per-MWh', amount: 5, escalation: 0 },
					{ name: 'ins', basis: 'percent-of-capex', fraction: 0.01, escalation: 0 }
				]
			},
			ctx
		);
		expect(s.lines.map((l) => l.nominal[0].toString())).toEqual(['204000', '15300', '102000']);
		expect(s.lines[1].nominal[1].toString()).toBe(String(5 * 2900 * 1.0404));
	});
	it('escalates above inflation geometrically', () => {
		// (1.02 x 1.01)^k: year 2 factor 1.0404 x 1.0201.
		const s = opexSchedule({ lines: [{ name: 'f', basis: 'fixed-per-year', amount: 1000, escalation: 0.01 }] }, ctx);
		expect(s.lines[0].nominal[1].toNumber()).toBeCloseTo(1000 * 1.0404 * 1.0201, 10);
	});
	it('places periodic overhauls every n years but not in the final year', () => {
		const s = opexSchedule({ lines: [{ name: 'o', basis: 'periodic-overhaul', amount: 100, perDevice: true, intervalYears: 2, escalation: 0 }] }, ctx);
		// Years 2 and 4 are multiples of 2; year 4 is the last, so only year 2: 100 x 5 devices x 1.0404.
		expect(s.lines[0].nominal.map((x) => x.toNumber())).toEqual([0, 520.2, 0, 0]);
	});
	it('adds revenue-share lines once revenue is known', () => {
		const s = opexSchedule({ lines: [{ name: 'lease', basis: 'percent-of-revenue', fraction: 0.02 }] }, ctx);
		expect(totalOpex(s, [dec(1000), dec(2000), dec(0), dec(0)]).map(String)).toEqual(['20', '40', '0', '0']);
	});
});

describe('overhaulSchedules', () => {
	it('gives the periodic-overhaul lines alone, with their interval, as opexSchedule prices them', () => {
		const ctx = { installedKW: dec(1000), deviceCount: 5, capexRealTotal: dec(1), energyMWh: ones(4), priceIndex: [1.02, 1.0404, 1.061208, 1.08243216].map((x) => new Decimal(x)) };
		const opex = {
			lines: [
				{ name: 'om', basis: 'fixed-per-year' as const, amount: 10, escalation: 0 },
				{ name: 'o', basis: 'periodic-overhaul' as const, amount: 100, perDevice: true, intervalYears: 2, escalation: 0 }
			]
		};
		const [overhaul, ...rest] = overhaulSchedules(opex, ctx);
		expect(rest).toEqual([]);
		expect(overhaul.intervalYears).toBe(2);
		// Hand calculation: 100 x 5 devices x 1.0404 in year 2 only (year 4 is the final year).
		expect(overhaul.nominal.map(String)).toEqual(['0', '520.2', '0', '0']);
		expect(overhaul.nominal).toEqual(opexSchedule(opex, ctx).lines[1].nominal);
	});
});

describe('decommissioningCost', () => {
	it('is priced by its basis and indexed to the final year', () => {
		const ctx = { installedKW: dec(1000), deviceCount: 4, capexRealTotal: dec(1_000_000), finalPriceIndex: dec(2) };
		expect(decommissioningCost({ basis: 'per-device', amount: 10 }, ctx).toString()).toBe('80');
		expect(decommissioningCost({ basis: 'percent-of-capex', fraction: 0.05 }, ctx).toString()).toBe('100000');
		expect(decommissioningCost({ basis: 'per-kW', amount: 1 }, ctx).toString()).toBe('2000');
		expect(decommissioningCost({ basis: 'lump-sum', amount: 7 }, ctx).toString()).toBe('14');
	});
});
