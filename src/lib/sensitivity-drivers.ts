/**
 * The ids of the sensitivity drivers, in their fixed order: the engine's
 * drivers (src/lib/server/engine/sensitivity.ts) and the probabilistic run
 * input both use this list. Safe to import in the browser.
 */
export const DRIVER_IDS = [
	'capex',
	'opex',
	'resource',
	'availability',
	'losses',
	'tariff',
	'discountRate',
	'interestRate',
	'gearing',
	'life',
	'degradation',
	'inflation',
	'taxRate',
	'deviceCount'
] as const;
export type DriverId = (typeof DRIVER_IDS)[number];
