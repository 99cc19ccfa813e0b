import { describe, expect, it } from 'vitest';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed } from './evaluate';
import { applyDriver, defaultDrivers, DRIVER_IDS, spider, tornado } from './sensitivity';

const base = atbCase({
	opex: { lines: [] },
	finance: { taxRate: 0.2, debt: { sizing: 'gearing', gearing: 0.6, interestRate: 0.06, tenorYears: 12 } }
});

describe('tornado', () => {
	it('sorts rows by swing, largest first', () => {
		const t = tornado(base, defaultDrivers(base), 'equityIrr');
		expect(t.rows).toHaveLength(12);
		const swings = t.rows.map((r) => (r.swing === null ? -1 : Number(r.swing)));
		expect([...swings].sort((a, b) => b - a)).toEqual(swings);
	});

	it('gives a capex swing of 0.4 x LCOE when opex is zero (LCOE linear in capex)', () => {
		// CHECK-VALUES property: LCOE is proportional to capex without opex, so capex x0.8 .. x1.2 swings 40 % of base.
		const t = tornado(base, [{ driver: 'capex', low: 0.8, high: 1.2 }, { driver: 'tariff', low: 0.9, high: 1.1 }], 'lcoeReal');
		expect(t.rows[0].driver).toBe('capex');
		expect(Number(t.rows[0].swing) / Number(t.baseOutput)).toBeCloseTo(0.4, 10);
		// The tariff does not enter the LCOE (no revenue-dependent costs here).
		expect(Number(t.rows[1].swing)).toBe(0);
	});

	it('reuses the base energy only where the driver leaves it alone', () => {
		// Availability 0.9 lowers the 30,660 MWh by 10 % (energy re-estimated); resource +-10 % in speed keeps the
		// 3 m/s bin on the flat top of the power curve (2..4 m/s) and the 0.2 m/s bin below cut-in, so energy stays.
		const t = tornado(base, [{ driver: 'availability', low: 0.9, high: 1 }, { driver: 'resource', low: 0.9, high: 1.1 }], 'netAepMWh');
		expect(t.rows[0].lowOutput).toBe('27594');
		expect(t.rows[0].highOutput).toBe('30660');
		expect(t.rows[1].swing).toBe('0');
	});
});

describe('spider', () => {
	it('returns the base output at zero change', () => {
		const s = spider(base, ['capex', 'discountRate'], 'lcoeReal');
		const baseLcoe = evaluateDetailed(base, { breakeven: false }).metrics.lcoeReal!.toNumber();
		for (const series of s.series) {
			const zero = series.points.find((p) => p.change === 0)!;
			expect(Number(zero.output)).toBeCloseTo(baseLcoe, 8);
		}
		// Higher discount rate, higher LCOE (capex-heavy case).
		const rate = s.series[1].points.map((p) => Number(p.output));
		expect(rate[4]).toBeGreaterThan(rate[0]);
	});
});

describe('applyDriver', () => {
	it('keeps every driver within the schema and leaves the input unchanged', () => {
		const before = JSON.stringify(base);
		for (const id of DRIVER_IDS) applyDriver(base, id, id === 'life' ? 5 : 0.5);
		expect(JSON.stringify(base)).toBe(before);
		const shortLife = applyDriver(base, 'life', 5);
		expect(shortLife.timeline.operatingYears).toBe(5);
		expect(shortLife.finance.debt.sizing !== 'none' && shortLife.finance.debt.tenorYears).toBe(5);
	});
});
