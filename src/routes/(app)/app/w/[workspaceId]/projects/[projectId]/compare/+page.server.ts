import { authorize } from '$lib/server/auth/access';
import { listScenariosInProject } from '$lib/server/db/scenarios';
import type { PageServerLoad } from './$types';

/** The project's live scenarios to choose from; their metrics come from the compare route, fetched by the page. */
export const load: PageServerLoad = async (event) => {
	const { project } = await authorize(event, event.params, 'viewer');
	const scenarios = await listScenariosInProject(project.id);
	return {
		project: { id: project.id, name: project.name, currency: project.currency, technology: project.technology },
		scenarios: scenarios.map((s) => ({ id: s.id, name: s.name, isBaseCase: s.isBaseCase, revision: s.revision }))
	};
};
