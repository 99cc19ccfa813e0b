import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute, validateDocument } from '$lib/server/workbench/api-route';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { csvTables, exportFormats, type CsvTableName, type ExportFormat } from '$lib/server/workbench/export';
import { buildExportOnPool } from '$lib/server/compute/pool';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { actorOf, recordWorkspaceEvent, scenarioDetail } from '$lib/server/workbench/audit-trail';
import type { RequestHandler } from './$types';

/**
 * The saved scenario's results as a file named for the project, the scenario
 * and the day: `?format=xlsx` (every table, a sheet each: assumptions, annual
 * table, metrics, cautions on their own sheet) or `?format=csv` (the cash-flow
 * table, or `&table=metrics` or `&table=assumptions`, the cautions after a
 * blank line).
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const access = await authorize(event, event.params, 'viewer');
	const { project, scenarioId, user } = access;
	const format = event.url.searchParams.get('format') ?? 'xlsx';
	const table = event.url.searchParams.get('table') ?? 'cash-flow';
	if (!(exportFormats as readonly string[]).includes(format)) {
		throw new ApiProblem(422, 'Choose an export format.', [{ path: 'format', message: `format must be ${exportFormats.join(' or ')}` }]);
	}
	if (!(csvTables as readonly string[]).includes(table)) {
		throw new ApiProblem(422, 'Choose a table to export.', [{ path: 'table', message: `table must be ${csvTables.slice(0, -1).join(', ')} or ${csvTables.at(-1)}` }]);
	}
	const scenario = await loadScenario(scenarioId);
	await takeComputeAllowance(user.id, 'export');
	const { result } = await resultOfSavedScenario(scenario, project);
	// Read as the engine read it: an older schema version upgraded, defaults filled in.
	const document = validateDocument(scenario.document, project);
	const file = await buildExportOnPool(
		result,
		{ projectName: project.name, scenarioName: scenario.name, revision: scenario.revision, generatedAt: new Date(), document },
		format as ExportFormat,
		table as CsvTableName
	);
	await recordWorkspaceEvent(actorOf(event, access), 'scenario-exported', {
		...scenarioDetail(project, scenario),
		revision: scenario.revision,
		format,
		...(format === 'csv' ? { table } : {}),
		file: file.fileName
	});
	return new Response(file.body, {
		headers: {
			'content-type': file.contentType,
			'content-disposition': `attachment; filename="${file.fileName}"`,
			'content-length': String(file.body.byteLength)
		}
	});
});
