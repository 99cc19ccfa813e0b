/** Bodies of the tornado and spider routes, checked against the engine's drivers and metrics. */
import { z } from 'zod';
import { METRIC_KEYS } from '../../metrics/catalogue';
import { DRIVER_IDS } from '../engine/sensitivity';

const metric = z.enum(METRIC_KEYS, { message: `metric must be one of ${METRIC_KEYS.join(', ')}` });
const driver = z.enum(DRIVER_IDS, { message: `driver must be one of ${DRIVER_IDS.join(', ')}` });
const finite = z.number().finite();

export const tornadoBody = z.strictObject({
	metric: metric.default('lcoeReal'),
	/** Without drivers: the engine's usual screening ranges (capex and opex +-20 % and so on). */
	drivers: z
		.array(z.strictObject({ driver, low: finite, high: finite }))
		.min(1)
		.max(DRIVER_IDS.length)
		.refine((list) => new Set(list.map((d) => d.driver)).size === list.length, { message: 'each driver may appear once' })
		.optional(),
	document: z.unknown().optional()
});

export const spiderBody = z.strictObject({
	metric: metric.default('lcoeReal'),
	drivers: z
		.array(driver)
		.min(1)
		.max(DRIVER_IDS.length)
		.refine((list) => new Set(list).size === list.length, { message: 'each driver may appear once' })
		.optional(),
	/** Relative steps of every driver's base value, e.g. [-0.2, -0.1, 0, 0.1, 0.2]. */
	changes: z.array(finite.min(-0.9).max(5)).min(2).max(21).optional(),
	document: z.unknown().optional()
});
