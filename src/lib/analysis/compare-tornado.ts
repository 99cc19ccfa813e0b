/**
 * Tornadoes of several scenarios side by side, for the compare page: what
 * each scenario's tornado request holds, one driver order and one x-axis
 * for all the charts (so the same bar length means the same change in every
 * chart), and each driver's swing per scenario for the table under them.
 * Safe to import in the browser; numbers here are for drawing and ordering.
 */
import type { ChartConfiguration } from 'chart.js';
import type { TornadoResult } from '../server/engine/sensitivity';
import { METRICS, metricUnit, type MetricKey } from '../metrics/catalogue';
import { chartValue, formatChartValue, formatMetric, roundedMetric } from '../metrics/format';
import { tornadoChart } from './charts';
import { describeInput, formUnit, type DriverChoice, type DriverUnit } from './driver-inputs';

/** The outputs offered: the cost of energy, the returns and the lenders' cover. */
export const COMPARE_OUTPUTS = ['lcoeReal', 'equityIrr', 'projectIrrPostTax', 'npv', 'minDscr'] as const satisfies readonly MetricKey[];
export type CompareOutput = (typeof COMPARE_OUTPUTS)[number];

/** More tornadoes than this side by side stop being readable at a glance. */
export const MAX_SIDE_BY_SIDE = 4;

export interface DriverRange {
	driver: string;
	low: number;
	high: number;
}

const isMultiplier = (choice: DriverChoice) => choice.unit === 'x base';

/**
 * The drivers each scenario's tornado is asked for: the chosen ones, in the
 * same order for all. A multiplier driver (capex, opex, resource, tariff,
 * losses) moves by the same relative range everywhere, the first scenario's;
 * a value driver (availability, rates, life) over the scenario's own
 * screening range, since "5 points less availability" starts from its own base.
 * A scenario missing one of the drivers (its document no longer reads) gets null.
 */
export function tornadoRequests(
	screening: Readonly<Record<string, readonly DriverChoice[]>>,
	scenarioIds: readonly string[],
	chosen: readonly string[]
): Record<string, DriverRange[] | null> {
	const shared = new Map<string, DriverRange>();
	for (const id of scenarioIds) {
		for (const choice of screening[id] ?? []) {
			if (isMultiplier(choice) && !shared.has(choice.driver)) shared.set(choice.driver, { driver: choice.driver, low: choice.low, high: choice.high });
		}
	}
	return Object.fromEntries(
		scenarioIds.map((id) => {
			const own = new Map((screening[id] ?? []).map((c) => [c.driver, c]));
			const ranges = chosen.map((driver) => {
				const choice = own.get(driver);
				if (!choice) return null;
				return isMultiplier(choice) ? shared.get(driver)! : { driver, low: choice.low, high: choice.high };
			});
			return [id, ranges.every((r) => r !== null) ? (ranges as DriverRange[]) : null];
		})
	);
}

const swingOf = (row: TornadoResult['rows'][number] | undefined) => (row?.swing == null ? null : Math.abs(Number(row.swing)));

/**
 * One driver order for every chart: by the widest swing any scenario shows,
 * widest first, so a driver sits on the same line in each chart; drivers
 * with no swing anywhere go last, in the order first seen.
 */
export function sharedDriverOrder(results: readonly TornadoResult[]): string[] {
	const widest = new Map<string, number | null>();
	for (const result of results) {
		for (const row of result.rows) {
			const swing = swingOf(row);
			const known = widest.get(row.driver);
			widest.set(row.driver, swing === null ? (known ?? null) : Math.max(known ?? 0, swing));
		}
	}
	const seen = [...widest.keys()];
	return seen
		.map((driver, index) => ({ driver, index, swing: widest.get(driver) ?? null }))
		.sort((a, b) => (a.swing === null ? (b.swing === null ? a.index - b.index : 1) : b.swing === null ? -1 : b.swing - a.swing || a.index - b.index))
		.map((d) => d.driver);
}

/** Float noise of a rounded bound (29 x 0.1 = 2.9000000000000004) kept out of the axis: 12 significant digits. */
const tidy = (x: number) => Number(x.toPrecision(12));

/**
 * One x-axis for all the charts: from the lowest to the highest of every
 * base, low and high output (chart numbers in the display unit), widened by
 * 5 % of the span on each side (a single value by 5 % of its size, 1 at
 * zero), then out to a round step, a tenth of the span's power of ten, so
 * the ends read as round figures (213.1 to 379.9 becomes 210 to 380).
 * Null when no scenario has a value.
 */
export function sharedAxisBounds(values: readonly (number | null)[]): { min: number; max: number } | null {
	const finite = values.filter((v): v is number => v !== null && Number.isFinite(v));
	if (finite.length === 0) return null;
	const lo = Math.min(...finite);
	const hi = Math.max(...finite);
	const pad = hi > lo ? (hi - lo) * 0.05 : Math.abs(lo) > 0 ? Math.abs(lo) * 0.05 : 1;
	const step = 10 ** (Math.floor(Math.log10(hi - lo + 2 * pad)) - 1);
	return { min: tidy(Math.floor(tidy((lo - pad) / step)) * step), max: tidy(Math.ceil(tidy((hi + pad) / step)) * step) };
}

/** Every output the charts draw, as chart numbers: each base, and each driver's low and high output. */
export function chartValuesOf(metric: MetricKey, results: readonly TornadoResult[]): (number | null)[] {
	return results.flatMap((r) => [chartValue(metric, r.baseOutput), ...r.rows.flatMap((row) => [chartValue(metric, row.lowOutput), chartValue(metric, row.highOutput)])]);
}

/** Driver names short enough for a chart's axis on a phone: without what the brackets add, cut with an ellipsis; the table under the charts gives them whole. */
export function shortDriverLabel(label: string, max = 20): string {
	const plain = label.replace(/\s*\(.*\)$/, '');
	return plain.length <= max ? plain : `${plain.slice(0, max - 1).trimEnd()}…`;
}

/** A driver's range in a few words: "80 to 120 % of base", "88 to 96 %", "20 to 30 years". */
export function rangeWords(unit: DriverUnit, low: number, high: number): string {
	const suffix = ` ${formUnit(unit)}`;
	const bare = (value: number) => describeInput(unit, value).slice(0, -suffix.length);
	// A no-break space keeps the unit with the number when a narrow column wraps.
	return `${bare(low)} to ${bare(high)}\u00a0${formUnit(unit)}`;
}

/**
 * Each scenario's tornado chart with its drivers in the shared order and the
 * x-axis fixed to the shared bounds (no grace of its own), so bars compare
 * across the charts.
 */
export function sideBySideTornadoCharts(
	metric: MetricKey,
	results: readonly TornadoResult[],
	order: readonly string[],
	currency: string
): ChartConfiguration<'bar'>[] {
	const unit = metricUnit(metric, currency);
	const bounds = sharedAxisBounds(chartValuesOf(metric, results));
	const format = (value: number) => formatChartValue(metric, value, currency);
	return results.map((result) => {
		const byDriver = new Map<string, TornadoResult['rows'][number]>(result.rows.map((r) => [r.driver, r]));
		const rows = order.map((driver) => {
			const row = byDriver.get(driver);
			return { label: shortDriverLabel(row?.label ?? driver), low: chartValue(metric, row?.lowOutput ?? null), high: chartValue(metric, row?.highOutput ?? null) };
		});
		const config = tornadoChart(
			rows,
			chartValue(metric, result.baseOutput),
			{ axis: `${METRICS[metric].label} (${unit})`, baseLine: `Base ${formatMetric(metric, result.baseOutput)} ${unit}` },
			format
		);
		const x = config.options?.scales?.x ?? {};
		const shared = bounds ? { min: bounds.min, max: bounds.max, grace: 0 } : {};
		return { ...config, options: { ...config.options, scales: { ...config.options?.scales, x: { ...x, ...shared } } } } as ChartConfiguration<'bar'>;
	});
}

export interface SwingRow {
	driver: string;
	label: string;
	/** The swing |output at high − output at low| of each scenario, as the engine sent it; null where undefined. */
	swings: (string | null)[];
	/** The scenarios (by index) with the widest swing at the shown precision; empty when they all show the same or fewer than two have one. */
	widest: number[];
}

/** The table under the charts: one row a driver in the shared order, one swing a scenario. */
export function swingRows(metric: MetricKey, results: readonly TornadoResult[], order: readonly string[]): SwingRow[] {
	return order.map((driver) => {
		const rows = results.map((r) => r.rows.find((row) => row.driver === driver));
		const swings = rows.map((row) => row?.swing ?? null);
		const numbers = swings.map((swing) => (swing === null ? null : Math.abs(Number(roundedMetric(metric, swing)))));
		const known = numbers.filter((n): n is number => n !== null);
		const top = Math.max(...known);
		const distinct = known.length >= 2 && known.some((n) => n !== top);
		return {
			driver,
			label: rows.find((r) => r !== undefined)?.label ?? driver,
			swings,
			widest: distinct ? numbers.flatMap((n, i) => (n === top ? [i] : [])) : []
		};
	});
}
