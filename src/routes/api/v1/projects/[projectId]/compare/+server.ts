import { json } from '@sveltejs/kit';
import { isUuid } from '$lib/server/auth/access';
import { getBaseCaseOfProject, getScenariosInProject, listScenariosInProject, type ScenarioRecord } from '$lib/server/db/scenarios';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { compareScenarios, type CompareEntry } from '$lib/server/workbench/compare';
import { inputDifferences } from '$lib/server/workbench/input-differences';
import { sensitivityChoices } from '$lib/server/analysis/sensitivity-choices';
import { parseScenario, type Scenario } from '$lib/schemas/scenario';
import { resultOfSavedScenario } from '$lib/server/workbench/stored-results';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import type { ProjectRow } from '$lib/server/db/projects';
import type { RequestHandler } from './$types';

const MAX_COMPARED = 12;

async function entryOf(scenario: ScenarioRecord, project: ProjectRow): Promise<CompareEntry> {
	const { result } = await resultOfSavedScenario(scenario, project).catch((e: unknown) => {
		if (e instanceof ApiProblem) throw new ApiProblem(e.status, `Scenario "${scenario.name}" cannot be evaluated: ${e.message}`, e.issues);
		throw e;
	});
	return { id: scenario.id, name: scenario.name, revision: scenario.revision, isBaseCase: scenario.isBaseCase, result };
}

/** The saved document as the current schema reads it; null when it no longer passes (its result may still be stored). */
function documentOf(scenario: ScenarioRecord): Scenario | null {
	const parsed = parseScenario(scenario.document);
	return parsed.ok ? parsed.scenario : null;
}

/**
 * Saved scenarios side by side (`?ids=a,b,c`; without ids, the project's live
 * scenarios), each with its differences from the project's base case, the
 * inputs that differ between them, and each one's usual sensitivity drivers
 * with its own screening ranges (for tornadoes side by side).
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { project, user } = await authorize(event, event.params, 'viewer');
	const idsParam = event.url.searchParams.get('ids');
	let ids: string[];
	if (idsParam === null || idsParam.trim() === '') {
		ids = (await listScenariosInProject(project.id)).slice(0, MAX_COMPARED).map((s) => s.id);
	} else {
		ids = [...new Set(idsParam.split(',').map((id) => id.trim()).filter((id) => id !== ''))];
		const issues = ids.flatMap((id, i) => (isUuid(id) ? [] : [{ path: `ids[${i}]`, message: `"${id}" is not a scenario id` }]));
		if (ids.length > MAX_COMPARED) issues.push({ path: 'ids', message: `compare at most ${MAX_COMPARED} scenarios at once` });
		if (issues.length > 0) throw new ApiProblem(422, 'The scenario list has problems.', issues);
	}
	const scenarios = await getScenariosInProject(project.id, ids);
	const found = new Set(scenarios.map((s) => s.id));
	const missing = ids.flatMap((id, i) => (found.has(id) ? [] : [{ path: `ids[${i}]`, message: 'no such scenario in this project' }]));
	if (missing.length > 0) throw new ApiProblem(404, 'Some of these scenarios are not in this project.', missing);
	await takeComputeAllowance(user.id, 'compare');

	const entries = await Promise.all(scenarios.map((s) => entryOf(s, project)));
	const base = entries.find((e) => e.isBaseCase) ?? null;
	const baseEntry = base ?? (await getBaseCaseOfProject(project.id).then((s) => (s ? entryOf(s, project) : null)));
	const documents = scenarios.map(documentOf);
	const readable = documents.every((d) => d !== null);
	return json({
		projectId: project.id,
		currency: project.currency,
		...compareScenarios(entries, baseEntry),
		inputDifferences: readable ? inputDifferences(entries.map((e, i) => ({ document: documents[i]!, result: e.result }))) : null,
		screeningDrivers: Object.fromEntries(scenarios.map((s, i) => [s.id, documents[i] ? sensitivityChoices(documents[i]).filter((c) => c.usual) : []]))
	});
});
