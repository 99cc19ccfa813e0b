/** Bodies of the tornado and spider routes, checked against the engine's drivers and metrics. */
import { z } from 'zod';
import { METRIC_KEYS } from '../../metrics/catalogue';
import { DRIVER_IDS, DRIVERS } from '../engine/sensitivity';

const metric = z.enum(METRIC_KEYS, { message: `metric must be one of ${METRIC_KEYS.join(', ')}` });
const driver = z.enum(DRIVER_IDS, { message: `driver must be one of ${DRIVER_IDS.join(', ')}` });
const finite = z.number().finite();
const draftDocument = z.unknown().optional().describe('An unsaved draft to calculate instead of the saved scenario');

const multiplierDrivers = DRIVER_IDS.filter((id) => DRIVERS[id].kind === 'multiplier');

export const tornadoBody = z.strictObject({
	metric: metric.default('lcoeReal').describe('The metric calculated at each low and high value'),
	/** Without drivers: the engine's usual screening ranges (capex and opex +-20 % and so on). */
	drivers: z
		.array(
			z.strictObject({
				driver: driver.describe('Which driver to move (each one once)'),
				low: finite.describe("The driver's low value: a multiplier of its base or the value itself (see drivers)"),
				high: finite.describe("The driver's high value: a multiplier of its base or the value itself (see drivers)")
			})
		)
		.min(1)
		.max(DRIVER_IDS.length)
		.refine((list) => new Set(list.map((d) => d.driver)).size === list.length, { message: 'each driver may appear once' })
		.optional()
		.describe(
			'The drivers to move and their low and high values; without it, the usual screening ranges. ' +
				`low and high are multipliers of the base (1 = base, 0.8 = 20 % less) for ${multiplierDrivers.join(', ')}, ` +
				'and the value itself in its own unit for the others (a fraction such as 0.05 for rates, years for life, a number of devices)'
		),
	document: draftDocument
});

export const spiderBody = z.strictObject({
	metric: metric.default('lcoeReal').describe('The metric followed as the drivers move'),
	drivers: z
		.array(driver)
		.min(1)
		.max(DRIVER_IDS.length)
		.refine((list) => new Set(list).size === list.length, { message: 'each driver may appear once' })
		.optional()
		.describe('The drivers to move, each once; without it, all of them'),
	changes: z
		.array(finite.min(-0.9).max(5))
		.min(2)
		.max(21)
		.optional()
		.describe("Relative steps of every driver's base value (0.1 = 10 % more); without them, [-0.2, -0.1, 0, 0.1, 0.2]"),
	document: draftDocument
});
