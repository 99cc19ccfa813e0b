/**
 * One draw of a probabilistic run: the scenario with the drawn driver values,
 * its energy turning out at the drawn multiple of the estimate, evaluated in
 * float64 (the same engine as the reported case, see ../engine/decimal.ts).
 *
 * The drivers are what is known, or assumed, at financial close: the debt is
 * sized with them. The energy uncertainty is what the years bring: the debt
 * is sized on the estimate and then lives with the energy drawn, so the
 * chance of a DSCR below the lock-up level means something.
 */
import type { Scenario } from '../../schemas/scenario';
import { withFloat64 } from '../engine/decimal';
import { evaluateMetrics } from '../engine/evaluate';
import { applyDriver, type DriverId } from '../engine/sensitivity';

/** The outputs every draw reports, in the catalogue's keys. */
export const RUN_OUTPUTS = ['lcoeReal', 'projectIrrPostTax', 'equityIrr', 'npv', 'minDscr'] as const;
export type RunOutput = (typeof RUN_OUTPUTS)[number];
export type DrawOutcome = Record<RunOutput, number | null>;

export type DrawInput = { drivers: Partial<Record<DriverId, number>>; energyOutturn: number };

/** The scenario with each drawn driver value applied, in the order given. */
export function scenarioForDraw(base: Scenario, drivers: DrawInput['drivers']): Scenario {
	let scenario = base;
	for (const [driver, value] of Object.entries(drivers) as [DriverId, number][]) scenario = applyDriver(scenario, driver, value);
	return scenario;
}

/**
 * The outputs of one draw. A draw the engine refuses (a driver pushed an input
 * outside what the model accepts) has every output null, like a missing IRR.
 */
export function evaluateDraw(base: Scenario, draw: DrawInput): DrawOutcome {
	const scenario = scenarioForDraw(base, draw.drivers);
	try {
		const { metrics } = withFloat64(() => evaluateMetrics(scenario, RUN_OUTPUTS, { breakeven: false, energyOutturn: draw.energyOutturn, extraChecks: false }));
		const outcome = {} as DrawOutcome;
		for (const key of RUN_OUTPUTS) {
			const value = metrics[key]?.toNumber() ?? null;
			outcome[key] = value !== null && Number.isFinite(value) ? value : null;
		}
		return outcome;
	} catch (e) {
		if (e instanceof RangeError) return Object.fromEntries(RUN_OUTPUTS.map((k) => [k, null])) as DrawOutcome;
		throw e;
	}
}
