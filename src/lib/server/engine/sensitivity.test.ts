import { describe, expect, it } from 'vitest';
import { atbCase } from './testing/fixtures';
import { evaluateDetailed } from './evaluate';
import { applyDriver, defaultDrivers, DRIVER_IDS, DRIVERS, spider, tornado } from './sensitivity';
import { SCENARIO_LIMITS } from '../../schemas/scenario-limits';
import { parseScenario } from '../../schemas/scenario';

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

describe('energy warnings from driver runs', () => {
	// Two sea states at Te 7 s; the matrix's cells reach Hs 0.5..2.5 m, so Hs 2.3 m is covered at base
	// but not at 1.1 x base (2.53 m) nor at +20 % (2.76 m): half the hours then fall outside.
	const wave = atbCase({
		technology: 'wave',
		resource: { kind: 'sea-state-table', states: [{ hsM: 1, periodS: 7, occurrence: 0.5 }, { hsM: 2.3, periodS: 7, occurrence: 0.5 }] },
		device: { kind: 'power-matrix', hsM: [1, 2], periodS: [6, 8], powerKW: [[100, 100], [200, 200]] }
	});
	const outside = '50 % of the time falls in sea states outside the power matrix, which give no power: 50 % with Hs above it (over 2.5 m).';
	const resource = DRIVERS.resource.label;

	it('tornado names the run that pushes sea states outside the power matrix', () => {
		const t = tornado(wave, [{ driver: 'resource', low: 0.9, high: 1.1 }], 'netAepMWh');
		expect(t.warnings).toEqual([`${resource} at the high value (1.1 x base): ${outside}`]);
	});

	it('spider does the same for each step that pushes them out', () => {
		const s = spider(wave, ['resource', 'capex'], 'netAepMWh', [-0.2, 0, 0.1, 0.2]);
		expect(s.warnings).toEqual([`${resource} at +10 %: ${outside}`, `${resource} at +20 %: ${outside}`]);
		expect(spider(base, ['resource'], 'lcoeReal').warnings).toEqual([]);
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

describe('driver bounds', () => {
	it('never asks for a life beyond the schema’s limit, however far a driver or spider step reaches', () => {
		expect(applyDriver(base, 'life', 50_000).timeline.operatingYears).toBe(SCENARIO_LIMITS.operatingYears);
		expect(applyDriver(base, 'life', -3).timeline.operatingYears).toBe(1);
		// The clamped document still passes the schema.
		expect(parseScenario(applyDriver(base, 'life', 50_000)).ok).toBe(true);
	});
});

describe('defaultDrivers', () => {
	it('gives its ranges without floating-point noise (0.07 - 0.015 is 0.055, not 0.05500000000000001)', () => {
		const scenario = atbCase({ finance: { inflation: 0.05, debt: { sizing: 'gearing', gearing: 0.7, interestRate: 0.07, tenorYears: 12 } } });
		expect(0.07 - 0.015).not.toBe(0.055); // IEEE 754 double arithmetic, the noise this removes
		const interest = defaultDrivers(scenario).find((d) => d.driver === 'interestRate')!;
		expect(interest).toEqual({ driver: 'interestRate', low: 0.055, high: 0.085 });
		// 0.05 + 0.01 is 0.060000000000000005 in doubles.
		expect(defaultDrivers(scenario).find((d) => d.driver === 'inflation')).toEqual({ driver: 'inflation', low: 0.04, high: 0.06 });
		for (const range of defaultDrivers(scenario)) {
			for (const value of [range.low, range.high]) expect(String(value).length, `${range.driver} ${value}`).toBeLessThan(14);
		}
	});
});
