/**
 * What a room page shows of one frozen scenario (investors' pages and the
 * team's preview of any version alike): results as published, the
 * assumptions in words, the probabilistic run published with it (if any),
 * the method notes and cautions of the snapshot.
 */
import type { RoomVersion } from '../db/rooms';
import { assumptionSections } from '../pdf/assumptions';
import { targetDscrOf } from '../../schemas/scenario';

export function snapshotScenarioView(version: RoomVersion, position: number) {
	const snapshot = version.snapshot;
	const scenario = snapshot.scenarios[position - 1];
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
			targetDscr: targetDscrOf(scenario.document.finance.debt),
			assumptions: assumptionSections(scenario.document, scenario.result),
			// Versions published before runs could be included have none.
			probabilisticRun: scenario.probabilisticRun ?? null
		},
		methodNotes: snapshot.methodNotes,
		cautions: snapshot.cautions
	};
}
