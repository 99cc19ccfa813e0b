import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { runOfScenario } from '$lib/server/probabilistic/run-requests';
import { drawsCsv } from '$lib/server/probabilistic/runs';
import type { RequestHandler } from './$types';

/** Every draw of a finished run: the drawn driver values, the energy factor and each output. */
export const GET: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const run = await runOfScenario(access, event.params.runId);
	if (run.state !== 'done') throw new ApiProblem(409, `The draws can be downloaded once the run is done; it is ${run.state}.`);
	const csv = await drawsCsv(run.id);
	if (csv === undefined) throw new ApiProblem(404, 'No such probabilistic run on this scenario.');
	const name = `${access.project.name}-run-${run.createdAt.toISOString().slice(0, 10)}-seed-${run.seed}`.replace(/[^A-Za-z0-9._-]+/g, '-');
	return new Response(csv, {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}.csv"`, 'cache-control': 'no-store' }
	});
});
