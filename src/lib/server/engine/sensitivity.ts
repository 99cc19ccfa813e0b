/**
 * Sensitivity: tornado rows (one driver at a time at its low and high value,
 * sorted by the swing of the chosen output) and spider series (each driver
 * moved by the same relative steps).
 */
import type { Decimal } from './decimal';
import type { Scenario } from '../../schemas/scenario';
import { estimateEnergy, type EnergyEstimate } from './energy/yield';
import { decimalString, evaluateMetric, type DecimalString } from './evaluate';
import { engineValueUnit, METRICS, type MetricKey } from '../../metrics/catalogue';
import { SCENARIO_LIMITS } from '../../schemas/scenario-limits';

import { DRIVER_IDS, type DriverId } from '../../sensitivity-drivers';
export { DRIVER_IDS, type DriverId };

/** low and high are the driver's own values: multipliers (1 = base) or absolute values, per DRIVERS[id].kind. */
export type DriverRange = { driver: DriverId; low: number; high: number };

type DriverDefinition = {
	label: string;
	/** multiplier: the value scales the base inputs (1 = base); value: the value replaces the input. */
	kind: 'multiplier' | 'value';
	unit: string;
	/** Whether the driver changes the energy estimate (the base estimate is reused otherwise). */
	changesEnergy: boolean;
	base: (s: Scenario) => number;
	apply: (s: Scenario, value: number) => Scenario;
};

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

function withDebt(s: Scenario, change: (debt: Exclude<Scenario['finance']['debt'], { sizing: 'none' }>) => Scenario['finance']['debt']): Scenario {
	const debt = s.finance.debt;
	if (debt.sizing === 'none') return s;
	return { ...s, finance: { ...s.finance, debt: change(debt) } };
}

function scaleResource(s: Scenario, f: number): Scenario {
	const r = s.resource;
	switch (r.kind) {
		case 'speed-histogram':
			return { ...s, resource: { ...r, bins: r.bins.map((b) => ({ ...b, speedMPerS: b.speedMPerS * f })) } };
		case 'weibull':
			return { ...s, resource: { ...r, scaleMPerS: r.scaleMPerS * f } };
		case 'rayleigh':
			return { ...s, resource: { ...r, meanSpeedMPerS: r.meanSpeedMPerS * f } };
		case 'sea-state-table':
			return { ...s, resource: { ...r, states: r.states.map((st) => ({ ...st, hsM: st.hsM * f })) } };
		case 'sea-state':
			return { ...s, resource: { ...r, hsM: r.hsM * f } };
		case 'assessed-energy':
			// A given energy has no speed or wave height to scale: the energy itself (P50 and P90) scales.
			return { ...s, resource: { ...r, p50MWh: r.p50MWh * f, ...(r.p90MWh === undefined ? {} : { p90MWh: r.p90MWh * f }) } };
	}
}

function scaleOpex(s: Scenario, f: number): Scenario {
	const lines = s.opex.lines.map((l) => ('amount' in l ? { ...l, amount: l.amount * f } : { ...l, fraction: clamp(l.fraction * f, 0, 1) }));
	return { ...s, opex: { lines } };
}

/** A life inside the schema's bounds: a driver never asks the engine for more years than a document may hold (50,000 years took 2.9 s and 363 MB). */
function setLife(s: Scenario, years: number): Scenario {
	const operatingYears = clamp(Math.round(years), 1, SCENARIO_LIMITS.operatingYears);
	const next: Scenario = { ...s, timeline: { ...s.timeline, operatingYears } };
	return withDebt(next, (d) => {
		const tenorYears = Math.min(d.tenorYears, operatingYears);
		return { ...d, tenorYears, graceYears: Math.min(d.graceYears, tenorYears - 1) };
	});
}

/** The drivers. Resource scales flow speeds (currents), wave heights Hs (waves) or an assessed energy. */
export const DRIVERS: Record<DriverId, DriverDefinition> = {
	capex: {
		label: 'Capex',
		kind: 'multiplier',
		unit: 'x base',
		changesEnergy: false,
		base: () => 1,
		apply: (s, f) => ({ ...s, capex: { ...s.capex, lines: s.capex.lines.map((l) => ({ ...l, amount: l.amount * f })) } })
	},
	opex: { label: 'Opex', kind: 'multiplier', unit: 'x base', changesEnergy: false, base: () => 1, apply: scaleOpex },
	resource: {
		label: 'Resource (flow speed, wave height or assessed energy)',
		kind: 'multiplier',
		unit: 'x base',
		changesEnergy: true,
		base: () => 1,
		apply: scaleResource
	},
	availability: {
		label: 'Availability',
		kind: 'value',
		unit: 'fraction',
		changesEnergy: true,
		base: (s) => s.array.availability,
		apply: (s, v) => ({ ...s, array: { ...s.array, availability: clamp(v, 0, 1) } })
	},
	losses: {
		label: 'Array, electrical and other losses',
		kind: 'multiplier',
		unit: 'x base',
		changesEnergy: true,
		base: () => 1,
		apply: (s, f) => ({
			...s,
			array: {
				...s.array,
				arrayLoss: clamp(s.array.arrayLoss * f, 0, 1),
				electricalLoss: clamp(s.array.electricalLoss * f, 0, 1),
				otherLoss: clamp(s.array.otherLoss * f, 0, 1)
			}
		})
	},
	tariff: {
		label: 'Tariff and merchant price',
		kind: 'multiplier',
		unit: 'x base',
		changesEnergy: false,
		base: () => 1,
		apply: (s, f) => ({
			...s,
			revenue: { ...s.revenue, tariffPerMWh: s.revenue.tariffPerMWh * f, merchantPricePerMWh: s.revenue.merchantPricePerMWh * f }
		})
	},
	discountRate: {
		label: 'Real discount rate',
		kind: 'value',
		unit: 'fraction/yr',
		changesEnergy: false,
		base: (s) => s.finance.realDiscountRate,
		apply: (s, v) => ({ ...s, finance: { ...s.finance, realDiscountRate: Math.max(0, v) } })
	},
	interestRate: {
		label: 'Interest rate',
		kind: 'value',
		unit: 'fraction/yr',
		changesEnergy: false,
		base: (s) => (s.finance.debt.sizing === 'none' ? 0 : s.finance.debt.interestRate),
		apply: (s, v) => withDebt(s, (d) => ({ ...d, interestRate: Math.max(0, v) }))
	},
	gearing: {
		label: 'Gearing (or gearing cap)',
		kind: 'value',
		unit: 'fraction',
		changesEnergy: false,
		base: (s) => {
			const d = s.finance.debt;
			return d.sizing === 'gearing' ? d.gearing : d.sizing === 'target-dscr' ? d.maxGearing : 0;
		},
		apply: (s, v) =>
			withDebt(s, (d) => (d.sizing === 'gearing' ? { ...d, gearing: clamp(v, 0, 1) } : d.sizing === 'target-dscr' ? { ...d, maxGearing: clamp(v, 0, 1) } : d))
	},
	life: {
		label: 'Operating life',
		kind: 'value',
		unit: 'years',
		changesEnergy: false,
		base: (s) => s.timeline.operatingYears,
		apply: setLife
	},
	degradation: {
		label: 'Degradation per year',
		kind: 'value',
		unit: 'fraction/yr',
		changesEnergy: false,
		base: (s) => s.array.degradationPerYear,
		apply: (s, v) => ({ ...s, array: { ...s.array, degradationPerYear: clamp(v, 0, 1) } })
	},
	inflation: {
		label: 'Inflation',
		kind: 'value',
		unit: 'fraction/yr',
		changesEnergy: false,
		base: (s) => s.finance.inflation,
		apply: (s, v) => ({ ...s, finance: { ...s.finance, inflation: v } })
	},
	taxRate: {
		label: 'Tax rate',
		kind: 'value',
		unit: 'fraction',
		changesEnergy: false,
		base: (s) => s.finance.taxRate,
		apply: (s, v) => ({ ...s, finance: { ...s.finance, taxRate: clamp(v, 0, 1) } })
	},
	deviceCount: {
		label: 'Device count',
		kind: 'value',
		unit: 'devices',
		changesEnergy: true,
		base: (s) => s.array.deviceCount,
		apply: (s, v) => ({ ...s, array: { ...s.array, deviceCount: Math.max(1, Math.round(v)) } })
	}
};

/** Apply one driver value to a scenario (a new object; the input is not changed). */
export function applyDriver(scenario: Scenario, driver: DriverId, value: number): Scenario {
	return DRIVERS[driver].apply(scenario, value);
}

/**
 * Twelve drivers with the usual screening ranges: capex and opex +-20 %,
 * resource +-10 % (flow speed or Hs), availability -5/+3 points, losses +-50 %,
 * tariff +-10 %, discount rate +-2 points, interest rate +-1.5 points, gearing
 * +-10 points, life -5/+5 years, degradation 0 to +0.5 points, inflation +-1 point.
 * Source: common practice for screening sensitivities.
 */
export function defaultDrivers(scenario: Scenario): DriverRange[] {
	const b = (d: DriverId) => DRIVERS[d].base(scenario);
	return defaultRanges(b).map((r) => ({ ...r, low: tidy(r.low), high: tidy(r.high) }));
}

/** Base plus a step in floating point leaves noise (0.065 + 0.015 = 0.08000000000000002): kept to 12 significant digits. */
function tidy(value: number): number {
	return Number(value.toPrecision(12));
}

function defaultRanges(b: (d: DriverId) => number): DriverRange[] {
	return [
		{ driver: 'capex', low: 0.8, high: 1.2 },
		{ driver: 'opex', low: 0.8, high: 1.2 },
		{ driver: 'resource', low: 0.9, high: 1.1 },
		{ driver: 'availability', low: clamp(b('availability') - 0.05, 0, 1), high: clamp(b('availability') + 0.03, 0, 1) },
		{ driver: 'losses', low: 0.5, high: 1.5 },
		{ driver: 'tariff', low: 0.9, high: 1.1 },
		{ driver: 'discountRate', low: Math.max(0, b('discountRate') - 0.02), high: b('discountRate') + 0.02 },
		{ driver: 'interestRate', low: Math.max(0, b('interestRate') - 0.015), high: b('interestRate') + 0.015 },
		{ driver: 'gearing', low: clamp(b('gearing') - 0.1, 0, 1), high: clamp(b('gearing') + 0.1, 0, 1) },
		{ driver: 'life', low: Math.max(1, b('life') - 5), high: b('life') + 5 },
		{ driver: 'degradation', low: 0, high: b('degradation') + 0.005 },
		{ driver: 'inflation', low: b('inflation') - 0.01, high: b('inflation') + 0.01 }
	];
}

export type TornadoRow = {
	driver: DriverId;
	label: string;
	unit: string;
	baseInput: number;
	lowInput: number;
	highInput: number;
	lowOutput: DecimalString | null;
	highOutput: DecimalString | null;
	/** |high output - low output|; null when either is undefined. */
	swing: DecimalString | null;
};

/** `unit`: the unit of the outputs as sent (rates as fractions), with the scenario's currency, from the metric catalogue. */
export type TornadoResult = { metric: MetricKey; unit: string; baseOutput: DecimalString | null; rows: TornadoRow[]; warnings: string[] };

/**
 * Evaluates scenarios for one metric, reusing the base energy estimate where a
 * driver leaves it alone. Energy warnings a driver run raises and the base case
 * does not (sea states pushed outside the power matrix, distribution bins
 * widened) are kept in `warnings`, each after the words naming the run.
 */
function metricEvaluator(metric: MetricKey, base: Scenario) {
	const baseEnergy: EnergyEstimate = estimateEnergy(base);
	const baseWarnings = new Set(baseEnergy.warnings);
	const warnings: string[] = [];
	const evaluate = (s: Scenario, changesEnergy: boolean, run = ''): Decimal | null => {
		if (!changesEnergy) return evaluateMetric(s, metric, baseEnergy);
		const energy = estimateEnergy(s);
		for (const warning of energy.warnings) {
			const line = `${run}: ${warning}`;
			if (!baseWarnings.has(warning) && !warnings.includes(line)) warnings.push(line);
		}
		return evaluateMetric(s, metric, energy);
	};
	return { evaluate, warnings };
}

const signedPercent = (change: number) => `${change > 0 ? '+' : ''}${Number((change * 100).toPrecision(6))} %`;

/**
 * Tornado: for each driver the output at its low and at its high value, all
 * else at base; rows sorted by swing |output(high) - output(low)|, largest
 * first, rows without a swing last. Source: common practice (one-at-a-time
 * sensitivity).
 */
export function tornado(scenario: Scenario, drivers: readonly DriverRange[], metric: MetricKey): TornadoResult {
	const { evaluate, warnings: runWarnings } = metricEvaluator(metric, scenario);
	const baseOutput = evaluate(scenario, false);
	const warnings: string[] = [];
	const rows = drivers.map(({ driver, low, high }) => {
		const def = DRIVERS[driver];
		const lowOutput = evaluate(def.apply(scenario, low), def.changesEnergy, `${def.label} at the low value (${low} ${def.unit})`);
		const highOutput = evaluate(def.apply(scenario, high), def.changesEnergy, `${def.label} at the high value (${high} ${def.unit})`);
		if (lowOutput === null || highOutput === null) warnings.push(`${def.label}: ${METRICS[metric].label} is undefined at the ${lowOutput === null ? 'low' : 'high'} value.`);
		const swing = lowOutput !== null && highOutput !== null ? highOutput.minus(lowOutput).abs() : null;
		return { row: { driver, label: def.label, unit: def.unit, baseInput: def.base(scenario), lowInput: low, highInput: high }, lowOutput, highOutput, swing };
	});
	rows.sort((a, b) => (a.swing === null ? (b.swing === null ? 0 : 1) : b.swing === null ? -1 : b.swing.comparedTo(a.swing)));
	const str = (d: Decimal | null) => (d === null ? null : decimalString(d));
	return {
		metric,
		unit: engineValueUnit(metric, scenario.currency),
		baseOutput: str(baseOutput),
		rows: rows.map((r) => ({ ...r.row, lowOutput: str(r.lowOutput), highOutput: str(r.highOutput), swing: str(r.swing) })),
		warnings: [...warnings, ...runWarnings]
	};
}

export type SpiderSeries = {
	driver: DriverId;
	label: string;
	points: { change: number; input: number; output: DecimalString | null }[];
};

/**
 * Spider: each driver's base input moved by the same relative changes (for
 * example -20 % .. +20 %), the output at each. Drivers whose base input is 0
 * (no debt, no degradation) stay flat. `warnings`: energy warnings the moved
 * runs raise and the base does not. Source: common practice.
 */
export function spider(
	scenario: Scenario,
	drivers: readonly DriverId[],
	metric: MetricKey,
	changes: readonly number[] = [-0.2, -0.1, 0, 0.1, 0.2]
): { metric: MetricKey; unit: string; series: SpiderSeries[]; warnings: string[] } {
	const { evaluate, warnings } = metricEvaluator(metric, scenario);
	const series = drivers.map((driver) => {
		const def = DRIVERS[driver];
		const base = def.base(scenario);
		const points = changes.map((change) => {
			const input = base * (1 + change);
			const output = evaluate(def.apply(scenario, input), def.changesEnergy, `${def.label} at ${signedPercent(change)}`);
			return { change, input, output: output === null ? null : decimalString(output) };
		});
		return { driver, label: def.label, points };
	});
	return { metric, unit: engineValueUnit(metric, scenario.currency), series, warnings };
}
