/**
 * The run a scenario's probabilistic page starts from. Server-side because
 * the ranges are the sensitivity screening ranges (../engine/sensitivity.ts).
 */
import type { RunInput } from '../../schemas/probabilistic';
import type { Scenario } from '../../schemas/scenario';
import { defaultDrivers, DRIVERS, type DriverId } from '../engine/sensitivity';

/**
 * A starting run: each screening driver of defaultDrivers(scenario) drawn
 * from triangular(min = its low, mode = its base value, max = its high), the
 * energy uncertainty drawn, no correlations, seed 1, 10,000 draws, and the
 * scenario's discount rate as the hurdle rate, made nominal like the IRRs it
 * is compared with (Fisher: (1 + real)(1 + inflation) - 1, the rate the NPV
 * uses, so an IRR above the hurdle goes with a positive NPV).
 *
 * The mode is the base clamped into [low, high] (a range clipped at a bound
 * can leave it outside). Left out: a driver whose range is a single value
 * (nothing to draw), and interest rate and gearing when the scenario has no
 * debt (drawing them changes nothing). `base` gives a driver's base value;
 * by default DRIVERS[d].base(scenario) (1 for a multiplier). Source:
 * triangular low / most likely / high, common practice for screening ranges.
 */
export function defaultRunInput(scenario: Scenario, base: (driver: DriverId) => number = (d) => DRIVERS[d].base(scenario)): RunInput {
	const noDebt = scenario.finance.debt.sizing === 'none';
	const drivers = defaultDrivers(scenario)
		.filter((r) => r.low < r.high && !(noDebt && DEBT_DRIVERS.has(r.driver)))
		.map((r) => ({
			driver: r.driver,
			distribution: { shape: 'triangular' as const, min: r.low, mode: Math.min(r.high, Math.max(r.low, base(r.driver))), max: r.high }
		}));
	const { realDiscountRate, inflation } = scenario.finance;
	// 12 significant digits: (1.08)(1.02) - 1 is 0.10160000000000014 in floating point.
	const hurdleRate = Number(((1 + realDiscountRate) * (1 + inflation) - 1).toPrecision(12));
	return { drivers, energyUncertainty: true, correlations: [], seed: 1, draws: 10_000, hurdleRate };
}

const DEBT_DRIVERS = new Set<DriverId>(['interestRate', 'gearing']);
