/**
 * A room version's frozen snapshot: each published scenario's document and
 * stored result (and, where the team chose, its latest finished probabilistic
 * run of that revision), the engine version, the method notes and cautions as
 * they were, and the project's description. Stored whole with the version, so
 * later edits of scenarios, notes or cautions never change what a room shows.
 */
import { CAUTIONS } from '../../cautions';
import { listMethodNotes, getMethodNote, getMethodNoteSource } from '../methods/notes';
import { assembleSnapshot, type SnapshotScenario } from './snapshot-format';
import { getScenariosInProject } from '../db/scenarios';
import { resultOfSavedScenario } from '../workbench/stored-results';
import type { ProjectRow } from '../db/projects';
import { latestDoneRunsInFull } from './publishable-runs';
import { freezeRun } from './snapshot-run';
import type { RoomSnapshot } from './snapshot-format';

export type { RoomSnapshot, SnapshotScenario } from './snapshot-format';

export class PublishProblem extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'PublishProblem';
	}
}

export const MAX_SCENARIOS_PER_VERSION = 12;

export interface SnapshotChoices {
	/** Scenarios (of those published) whose latest finished probabilistic run of the published revision goes with them. */
	withRunOf?: readonly string[];
}

/**
 * Freezes the chosen live scenarios of the project, in the order given, with
 * their stored (or now computed) results and the runs asked for. A run asked
 * for a scenario whose saved revision has no finished run is refused in words
 * (the scenario may have been saved again since the page was loaded).
 */
export async function buildSnapshot(project: ProjectRow, scenarioIds: readonly string[], choices: SnapshotChoices = {}): Promise<RoomSnapshot> {
	const unique = [...new Set(scenarioIds)];
	if (unique.length === 0) throw new PublishProblem('Choose at least one scenario to publish.');
	if (unique.length > MAX_SCENARIOS_PER_VERSION) throw new PublishProblem(`A version holds at most ${MAX_SCENARIOS_PER_VERSION} scenarios.`);
	const scenarios = await getScenariosInProject(project.id, unique);
	const live = scenarios.filter((s) => s.archivedAt === null);
	if (live.length !== unique.length) throw new PublishProblem('Some chosen scenarios are not live scenarios of this project: reload the page and choose again.');
	const wantRun = new Set(choices.withRunOf ?? []);
	const runs = await latestDoneRunsInFull(live.filter((s) => wantRun.has(s.id)));
	const frozen: SnapshotScenario[] = [];
	for (const scenario of live) {
		const run = runs.get(scenario.id);
		if (wantRun.has(scenario.id) && !run) {
			throw new PublishProblem(`${scenario.name} has no finished probabilistic run of revision ${scenario.revision}: reload the page and choose again.`);
		}
		const { result } = await resultOfSavedScenario(scenario, project);
		frozen.push({
			id: scenario.id,
			name: scenario.name,
			notes: scenario.notes,
			revision: scenario.revision,
			isBaseCase: scenario.isBaseCase,
			document: scenario.document,
			result,
			...(run ? { probabilisticRun: freezeRun(run) } : {})
		});
	}
	return assembleSnapshot({
		project,
		scenarios: frozen,
		methodNotes: listMethodNotes().map(({ slug }) => ({ ...getMethodNote(slug)!, markdown: getMethodNoteSource(slug)?.markdown ?? '' })),
		cautions: CAUTIONS
	});
}
