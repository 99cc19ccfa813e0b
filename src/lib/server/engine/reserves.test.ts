import { describe, expect, it } from 'vitest';
import { dec, Decimal, ZERO } from './decimal';
import { cfadsAfterReserves, costReserves, decommissioningReserve, fundAhead, maintenanceReserve } from './reserves';

const strings = (values: readonly Decimal[]) => values.map(String);
/** A series of `years` zeros with the given costs at 1-based operating years. */
function costsAt(years: number, at: Record<number, number>): Decimal[] {
	return Array.from({ length: years }, (_, k) => dec(at[k + 1] ?? 0));
}

describe('fundAhead', () => {
	it('spreads an overhaul of 300 every 5 years over the 5 years before it: 60 a year', () => {
		// Hand calculation: 300 / 5 = 60 in years 1-5 and 6-10; balance 60 ... 240, then 300 paid out in year 5.
		const m = fundAhead(costsAt(10, { 5: 300, 10: 300 }), 5);
		expect(strings(m.contribution)).toEqual(Array(10).fill('60'));
		expect(strings(m.release)).toEqual(['0', '0', '0', '0', '300', '0', '0', '0', '0', '300']);
		expect(strings(m.balance)).toEqual(['60', '120', '180', '240', '0', '60', '120', '180', '240', '0']);
	});

	it('reproduces a published major-maintenance reserve: 25 every 10 years reserved over 10 years is 2.5 a year', () => {
		// videofinancialmodelling.com, "Modelling a major maintenance reserve account (MMRA)": CFADS 20 a year,
		// replacement capex 25 every 10 years (two of them), reserved over 10 years = 2.5 a year, no interest.
		const m = fundAhead(costsAt(20, { 10: 25, 20: 25 }), 10);
		expect(strings(m.contribution)).toEqual(Array(20).fill('2.5'));
		expect(m.balance[8].toString()).toBe('22.5');
		expect(m.balance[9].toString()).toBe('0');
		expect(m.balance[19].toString()).toBe('0');
	});

	it('starts no earlier than operating year 1 and returns to exactly zero whatever the division leaves', () => {
		// Hand calculation: 100 in year 3 funded over 6 years can only use years 1-3: 33.33..., 33.33..., and the rest.
		const m = fundAhead(costsAt(4, { 3: 100 }), 6);
		expect(m.contribution[0].toFixed(10)).toBe('33.3333333333');
		expect(m.contribution[0].plus(m.contribution[1]).plus(m.contribution[2]).toString()).toBe('100');
		expect(m.balance[2].isZero()).toBe(true);
		expect(m.contribution[3].isZero()).toBe(true);
	});

	it('adds overlapping windows when funding runs longer than the interval', () => {
		// Hand calculation: 40 in year 2 over years 1-2 (20 each), 40 in year 4 over years 1-4 (10 each).
		const m = fundAhead(costsAt(4, { 2: 40, 4: 40 }), 4);
		expect(strings(m.contribution)).toEqual(['30', '30', '10', '10']);
		expect(strings(m.balance)).toEqual(['30', '20', '30', '0']);
	});

	it('refuses funding years that are not whole and positive', () => {
		expect(() => fundAhead([dec(1)], 0)).toThrow(RangeError);
		expect(() => fundAhead([dec(1)], 1.5)).toThrow(/whole number/);
	});
});

describe('maintenanceReserve', () => {
	const overhauls = [
		{ intervalYears: 5, nominal: costsAt(12, { 5: 300, 10: 300 }) },
		{ intervalYears: 4, nominal: costsAt(12, { 4: 80, 8: 80 }) }
	];

	it('funds each line over its own interval by default and adds the lines', () => {
		// Hand calculation: 60 a year for the first line in years 1-10, 20 a year for the second in years 1-8.
		const m = maintenanceReserve(overhauls, {}, 12);
		expect(strings(m.contribution)).toEqual(['80', '80', '80', '80', '80', '80', '80', '80', '60', '60', '0', '0']);
		expect(m.release[4].toString()).toBe('300');
		expect(m.release[3].toString()).toBe('80');
		expect(m.balance.every((b) => b.gte(0))).toBe(true);
		expect(m.balance[11].isZero()).toBe(true);
	});

	it('uses the given funding years for every line', () => {
		// Hand calculation: 300 over years 4-5 is 150 twice.
		const m = maintenanceReserve([overhauls[0]], { fundingYears: 2 }, 12);
		expect(strings(m.contribution.slice(2, 5))).toEqual(['0', '150', '150']);
	});

	it('is all zeros without an account', () => {
		const m = maintenanceReserve(overhauls, undefined, 12);
		expect(m.contribution.every((c) => c.isZero()) && m.release.every((r) => r.isZero())).toBe(true);
		expect(m.balance).toHaveLength(12);
	});
});

describe('decommissioningReserve', () => {
	it('funds the final-year cost over the last N years and draws it in the final year', () => {
		// Hand calculation: 900 in year 10 funded over the last 3 years: 300 in years 8, 9 and 10.
		const m = decommissioningReserve(costsAt(10, { 10: 900 }), { fundingYears: 3 });
		expect(strings(m.contribution)).toEqual(['0', '0', '0', '0', '0', '0', '0', '300', '300', '300']);
		expect(strings(m.release.slice(9))).toEqual(['900']);
		expect(strings(m.balance.slice(7))).toEqual(['300', '600', '0']);
	});
});

describe('costReserves and cfadsAfterReserves', () => {
	it('smooths a lumpy overhaul and the decommissioning out of CFADS', () => {
		// Hand calculation over 10 years, CFADS 100 a year before these costs: an overhaul of 300 in year 5
		// (funded over its 5-year interval: 60 in years 1-5) and decommissioning of 200 in year 10 (funded
		// over the last 5 years: 40 in years 6-10). Without reserves CFADS is -200 in year 5 and -100 in year 10.
		//   years 1-4: 100 - 60 = 40;   year 5: (100 - 300) - 60 + 300 = 40;
		//   years 6-9: 100 - 40 = 60;   year 10: (100 - 200) - 40 + 200 = 60.
		const decommissioning = costsAt(10, { 10: 200 });
		const overhaul = costsAt(10, { 5: 300 });
		const cfads = overhaul.map((o, k) => dec(100).minus(o).minus(decommissioning[k]));
		const reserves = costReserves({
			overhauls: [{ intervalYears: 5, nominal: overhaul }],
			decommissioning,
			spec: { maintenance: {}, decommissioning: { fundingYears: 5 } }
		});
		expect(strings(cfadsAfterReserves(cfads, reserves))).toEqual(['40', '40', '40', '40', '40', '60', '60', '60', '60', '60']);
		let total = ZERO;
		for (const n of reserves.netContribution) total = total.plus(n);
		expect(total.isZero()).toBe(true);
	});

	it('changes nothing without reserves', () => {
		const reserves = costReserves({ overhauls: [{ intervalYears: 2, nominal: costsAt(3, { 2: 50 }) }], decommissioning: costsAt(3, { 3: 9 }), spec: undefined });
		const cfads = [dec(1), dec(-2), dec(3)];
		expect(strings(cfadsAfterReserves(cfads, reserves))).toEqual(['1', '-2', '3']);
	});
});
