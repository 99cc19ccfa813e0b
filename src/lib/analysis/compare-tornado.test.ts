import { describe, expect, it } from 'vitest';
import { tidalDocument } from '../../../tests/fixtures/scenario-documents';
import { defaultDrivers, tornado, type DriverRange as EngineDriverRange, type TornadoResult } from '../server/engine/sensitivity';
import { sensitivityChoices } from '../server/analysis/sensitivity-choices';
import type { Scenario } from '../schemas/scenario';
import { chartValue } from '../metrics/format';
import {
	chartValuesOf,
	sharedAxisBounds,
	sharedDriverOrder,
	rangeWords,
	shortDriverLabel,
	sideBySideTornadoCharts,
	swingRows,
	tornadoRequests
} from './compare-tornado';
import type { DriverChoice } from './driver-inputs';

/** Capex up by a factor and availability down by some points: the demo's downside case, built the same way here. */
function downside(base: Scenario, capexFactor: number, availabilityDrop: number): Scenario {
	return {
		...base,
		capex: { ...base.capex, lines: base.capex.lines.map((line) => ({ ...line, amount: line.amount * capexFactor })) },
		array: { ...base.array, availability: base.array.availability - availabilityDrop }
	};
}

const row = (driver: string, swing: string | null, low = '1', high = '2'): TornadoResult['rows'][number] => ({
	driver: driver as TornadoResult['rows'][number]['driver'],
	label: driver,
	unit: 'x base',
	baseInput: 1,
	lowInput: 0.8,
	highInput: 1.2,
	lowOutput: low,
	highOutput: high,
	swing
});
const result = (rows: TornadoResult['rows'], baseOutput: string | null = '1.5'): TornadoResult => ({ metric: 'lcoeReal', unit: 'EUR/MWh', baseOutput, rows, warnings: [] });

describe('sharedAxisBounds', () => {
	it('spans every value, widened by 5 % of the span each side', () => {
		// 10 to 30: span 20, 5 % of it is 1, so 9 to 31, already whole steps of 1 (a tenth of 10) (hand calculation).
		expect(sharedAxisBounds([10, null, 30, 20])).toEqual({ min: 9, max: 31 });
	});

	it('rounds the ends out to a tenth of the padded span’s power of ten', () => {
		// -40 to 60: padded -45 to 65, span 110, step 10: -50 to 70 (hand calculation).
		expect(sharedAxisBounds([-40, 60])).toEqual({ min: -50, max: 70 });
		// 220.7 to 372.3: padded 213.12 to 379.88, span 166.76, step 10: 210 to 380 (hand calculation).
		expect(sharedAxisBounds([220.7, 372.3])).toEqual({ min: 210, max: 380 });
		// IRRs in per cent, 2.94 to 7.17: padded 2.7285 to 7.3815, span 4.65, step 0.1: 2.7 to 7.4, without float noise.
		expect(sharedAxisBounds([2.94, 7.17])).toEqual({ min: 2.7, max: 7.4 });
	});

	it('gives a single value room of 5 % of its size, and 1 at zero; nothing without values', () => {
		expect(sharedAxisBounds([200, 200])).toEqual({ min: 190, max: 210 });
		expect(sharedAxisBounds([-200])).toEqual({ min: -210, max: -190 });
		expect(sharedAxisBounds([0])).toEqual({ min: -1, max: 1 });
		expect(sharedAxisBounds([null, Number.NaN])).toBeNull();
		expect(sharedAxisBounds([])).toBeNull();
	});
});

describe('sharedDriverOrder', () => {
	it('orders by the widest swing any scenario shows, drivers without a swing last', () => {
		const a = result([row('capex', '5'), row('opex', '1'), row('gearing', null)]);
		const b = result([row('opex', '7'), row('capex', '2'), row('gearing', null)]);
		// opex 7 in b beats capex 5 in a.
		expect(sharedDriverOrder([a, b])).toEqual(['opex', 'capex', 'gearing']);
	});

	it('keeps the first order among equal swings', () => {
		expect(sharedDriverOrder([result([row('tariff', '3'), row('capex', '3')])])).toEqual(['tariff', 'capex']);
	});
});

describe('tornadoRequests', () => {
	const choice = (driver: string, unit: DriverChoice['unit'], low: number, high: number): DriverChoice => ({ driver, label: driver, unit, baseInput: 0, low, high, usual: true });

	it('moves multiplier drivers by the same relative range everywhere and value drivers over each scenario’s own range', () => {
		const screening = {
			a: [choice('capex', 'x base', 0.8, 1.2), choice('availability', 'fraction', 0.88, 0.96)],
			b: [choice('capex', 'x base', 0.7, 1.3), choice('availability', 'fraction', 0.83, 0.91)]
		};
		expect(tornadoRequests(screening, ['a', 'b'], ['capex', 'availability'])).toEqual({
			a: [
				{ driver: 'capex', low: 0.8, high: 1.2 },
				{ driver: 'availability', low: 0.88, high: 0.96 }
			],
			b: [
				{ driver: 'capex', low: 0.8, high: 1.2 },
				{ driver: 'availability', low: 0.83, high: 0.91 }
			]
		});
	});

	it('asks nothing of a scenario that lacks a chosen driver', () => {
		const screening = { a: [choice('capex', 'x base', 0.8, 1.2)], b: [] };
		expect(tornadoRequests(screening, ['a', 'b'], ['capex'])).toEqual({ a: [{ driver: 'capex', low: 0.8, high: 1.2 }], b: null });
	});

	it('takes each scenario’s usual screening ranges from the engine: the same capex multipliers, its own availability', () => {
		const worse = downside(tidalDocument, 1.15, 0.05);
		const screening = { base: sensitivityChoices(tidalDocument), worse: sensitivityChoices(worse) };
		const asked = tornadoRequests(screening, ['base', 'worse'], ['capex', 'availability']);
		const ownAvailability = (s: Scenario) => defaultDrivers(s).find((d) => d.driver === 'availability')!;
		expect(asked.base![0]).toEqual(asked.worse![0]);
		expect(asked.base![1]).toEqual({ driver: 'availability', low: ownAvailability(tidalDocument).low, high: ownAvailability(tidalDocument).high });
		expect(asked.worse![1]).toEqual({ driver: 'availability', low: ownAvailability(worse).low, high: ownAvailability(worse).high });
		expect(asked.worse![1].high).toBeLessThan(asked.base![1].high);
	});
});

describe('sideBySideTornadoCharts and swingRows on two engine tornadoes', () => {
	const worse = downside(tidalDocument, 1.15, 0.05);
	const drivers = ['capex', 'opex', 'availability'];
	const screening = { base: sensitivityChoices(tidalDocument), worse: sensitivityChoices(worse) };
	const asked = tornadoRequests(screening, ['base', 'worse'], drivers);
	// The page sends these ranges through the tornado route, which checks the driver ids against the engine's.
	const engineRanges = (id: string) => asked[id] as EngineDriverRange[];
	const results = [tornado(tidalDocument, engineRanges('base'), 'lcoeReal'), tornado(worse, engineRanges('worse'), 'lcoeReal')];
	const order = sharedDriverOrder(results);
	const charts = sideBySideTornadoCharts('lcoeReal', results, order, 'EUR');

	it('draws every chart on the same x-axis, wide enough for every bar of either scenario', () => {
		const [a, b] = charts.map((c) => c.options!.scales!.x as { min: number; max: number });
		expect(a).toMatchObject({ min: b.min, max: b.max });
		const values = chartValuesOf('lcoeReal', results).filter((v): v is number => v !== null);
		expect(a.min).toBeLessThan(Math.min(...values));
		expect(a.max).toBeGreaterThan(Math.max(...values));
	});

	it('puts the drivers on the same lines in each chart', () => {
		expect(charts[0].data.labels).toEqual(charts[1].data.labels);
		expect(charts[0].data.labels).toHaveLength(drivers.length);
	});

	it('bars run from each scenario’s own base to its outputs', () => {
		const capexLine = order.indexOf('capex');
		const highBar = charts[1].data.datasets[1].data[capexLine] as unknown as [number, number];
		const capexRow = results[1].rows.find((r) => r.driver === 'capex')!;
		expect(highBar).toEqual([chartValue('lcoeReal', results[1].baseOutput), chartValue('lcoeReal', capexRow.highOutput)]);
	});

	it('shows the downside as the more exposed to capex', () => {
		// LCOE = (discounted capex + discounted opex) / discounted energy (docs/methods/lcoe.md): capex ±20 % moves it by
		// ±20 % of the capex term, and the downside's capex term is larger (capex x1.15 over less energy), so its swing is wider.
		const capex = swingRows('lcoeReal', results, order).find((r) => r.driver === 'capex')!;
		expect(Number(capex.swings[1])).toBeGreaterThan(Number(capex.swings[0]));
		expect(capex.widest).toEqual([1]);
	});

	it('marks no scenario when the swings read the same', () => {
		const same = swingRows('lcoeReal', [result([row('capex', '2.001')]), result([row('capex', '2.002')])], ['capex']);
		// LCOE is shown to 2 decimals (metric catalogue): 2.00 and 2.00.
		expect(same[0].widest).toEqual([]);
		expect(same[0].swings).toEqual(['2.001', '2.002']);
	});
});

describe('shortDriverLabel', () => {
	it('keeps short names, drops what brackets add and cuts long ones with an ellipsis', () => {
		expect(shortDriverLabel('Capex')).toBe('Capex');
		expect(shortDriverLabel('Degradation per year')).toBe('Degradation per year');
		expect(shortDriverLabel('Resource (flow speed, wave height or assessed energy)')).toBe('Resource');
		expect(shortDriverLabel('Array, electrical and other losses')).toBe('Array, electrical a…');
	});
});

describe('rangeWords', () => {
	it('writes a range once with its unit, in the form the sensitivity table uses', () => {
		expect(rangeWords('x base', 0.8, 1.2)).toBe('80 to 120\u00a0% of base');
		expect(rangeWords('fraction', 0.88, 0.96)).toBe('88 to 96\u00a0%');
		expect(rangeWords('fraction/yr', 0.04, 0.08)).toBe('4 to 8\u00a0%/yr');
		expect(rangeWords('years', 20, 30)).toBe('20 to 30\u00a0years');
	});
});
