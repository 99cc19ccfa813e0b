/**
 * What a room page shows of one frozen scenario (investors' pages and the
 * team's preview of any version alike): results as published, the
 * assumptions in words, the method notes and cautions of the snapshot.
 */
import type { RoomVersion } from '../db/rooms';
import { assumptionSections } from '../pdf/assumptions';

export function snapshotScenarioView(version: RoomVersion, position: number) {
	const snapshot = version.snapshot;
	const scenario = snapshot.scenarios[position - 1];
	const debt = scenario.document.finance.debt;
	return {
		version: { number: version.version, publishedAt: version.publishedAt.toISOString(), engineVersion: snapshot.engineVersion },
		project: snapshot.project,
		position,
		scenario: {
			id: scenario.id,
			name: scenario.name,
			notes: scenario.notes,
			revision: scenario.revision,
			isBaseCase: scenario.isBaseCase,
			result: scenario.result,
			targetDscr: debt && debt.sizing === 'target-dscr' ? debt.targetDscr : null,
			assumptions: assumptionSections(scenario.document, scenario.result)
		},
		methodNotes: snapshot.methodNotes,
		cautions: snapshot.cautions
	};
}
