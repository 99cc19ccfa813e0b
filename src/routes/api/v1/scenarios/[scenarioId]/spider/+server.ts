import { json } from '@sveltejs/kit';
import { defaultDrivers } from '$lib/server/engine/sensitivity';
import { spiderOnPool } from '$lib/server/compute/pool';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { authorize } from '$lib/server/auth/access';
import { apiRoute, readJsonBody, validateBody } from '$lib/server/workbench/api-route';
import { documentToEvaluate, runEngine } from '$lib/server/workbench/evaluation';
import { spiderBody } from '$lib/server/workbench/sensitivity-body';
import type { RequestHandler } from './$types';

/** Spider series: each driver's base value moved by the same relative steps (default -20 % .. +20 %). */
export const POST: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const body = validateBody(spiderBody, await readJsonBody(event.request, { optional: true }));
	const { document, source, scenario } = await documentToEvaluate(access, body.document);
	const drivers = body.drivers ?? defaultDrivers(document).map((d) => d.driver);
	await takeComputeAllowance(access.user.id, 'spider');
	const result = await runEngine(() => spiderOnPool(document, drivers, body.metric, body.changes));
	return json({ scenarioId: scenario.id, revision: scenario.revision, source, spider: result });
});
