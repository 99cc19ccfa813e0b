/**
 * The drivers the sensitivity page offers for one scenario: the engine's
 * usual screening set with its ranges, chosen at first, then the engine's
 * other drivers at +-20 % of their base value, left for the user to add.
 */
import type { Scenario } from '../../schemas/scenario';
import { DRIVER_IDS, DRIVERS, defaultDrivers, type DriverId } from '../engine/sensitivity';
import type { DriverChoice, DriverUnit } from '../../analysis/driver-inputs';

/** +-20 % of the base value; counts and years stay whole and at least 1. Source: common practice for screening. */
function plusMinusTwentyPercent(driver: DriverId, base: number): { low: number; high: number } {
	const unit = DRIVERS[driver].unit;
	if (unit === 'devices' || unit === 'years') {
		return { low: Math.max(1, Math.round(base * 0.8)), high: Math.max(1, Math.round(base * 1.2)) };
	}
	const low = base * 0.8;
	const high = base * 1.2;
	return unit === 'fraction' ? { low: Math.min(1, low), high: Math.min(1, high) } : { low, high };
}

export function sensitivityChoices(scenario: Scenario): DriverChoice[] {
	const usual = defaultDrivers(scenario);
	const usualIds = new Set(usual.map((d) => d.driver));
	const describe = (driver: DriverId, low: number, high: number, isUsual: boolean): DriverChoice => ({
		driver,
		label: DRIVERS[driver].label,
		unit: DRIVERS[driver].unit as DriverUnit,
		baseInput: DRIVERS[driver].base(scenario),
		low,
		high,
		usual: isUsual
	});
	const others = DRIVER_IDS.filter((id) => !usualIds.has(id)).map((id) => {
		const range = plusMinusTwentyPercent(id, DRIVERS[id].base(scenario));
		return describe(id, range.low, range.high, false);
	});
	return [...usual.map((d) => describe(d.driver, d.low, d.high, true)), ...others];
}
