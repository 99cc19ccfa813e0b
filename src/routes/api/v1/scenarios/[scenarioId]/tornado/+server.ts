import { json } from '@sveltejs/kit';
import { defaultDrivers } from '$lib/server/engine/sensitivity';
import { tornadoOnPool } from '$lib/server/compute/pool';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { documentToEvaluate, runEngine } from '$lib/server/workbench/evaluation';
import { tornadoBody } from '$lib/server/workbench/sensitivity-body';
import type { RequestHandler } from './$types';

/**
 * Tornado rows for one metric: `{ metric, drivers: [{ driver, low, high }] }`;
 * without drivers, the usual screening ranges. A draft `document` needs the analyst role.
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const body = validateBody(tornadoBody, await readJsonBody(event.request, { optional: true }));
	const { document, source, scenario } = await documentToEvaluate(access, body.document);
	const drivers = body.drivers ?? defaultDrivers(document);
	await takeComputeAllowance(access.user.id, 'tornado');
	const result = await runEngine(() => tornadoOnPool(document, drivers, body.metric));
	return json({ scenarioId: scenario.id, revision: scenario.revision, source, drivers, tornado: result });
});
