/**
 * Starting from an example: a new project of one technology with the
 * example's site and currency, and its document saved as the base case, so
 * an empty workspace is one click from a first LCOE.
 */
import { withRoomForProject } from '../billing/gates';
import { createProject, type ProjectRow } from '../db/projects';
import { createScenario } from '../db/scenarios';
import type { Technology } from '../../schemas/workbench';
import { validateDocument } from './api-route';
import { exampleProject } from './starter-documents';
import { storeResultOfSave } from './stored-results';
import { acceptedPlaceholderPaths, placeholderPathsOf } from '../../workbench/placeholders';

export async function startFromExample(workspaceId: string, technology: Technology, userId: string): Promise<ProjectRow> {
	const example = exampleProject(technology);
	if (!example) throw new RangeError(`there is no example for ${technology}`);
	const project = await withRoomForProject(workspaceId, (trx) =>
		createProject({ workspaceId, name: example.name, technology, siteName: example.siteName, siteDescription: example.siteDescription, currency: example.currency }, trx)
	);
	const document = validateDocument(example.document, project);
	const scenario = await createScenario({
		projectId: project.id,
		name: 'Base case',
		notes: 'Started from the example. Every figure is the example’s: replace them with your own.',
		document,
		// The figures the example states are its placeholders; the schema's defaults are not.
		placeholderPaths: acceptedPlaceholderPaths(document, placeholderPathsOf(example.document)),
		userId
	});
	await storeResultOfSave(scenario, project);
	return project;
}
