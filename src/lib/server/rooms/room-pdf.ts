/**
 * The PDF summary of a scenario as a room version froze it: the snapshot's
 * document, result, probabilistic run (when one was published with it),
 * method notes and cautions, never today's; an investor's
 * copy carries their address and the time in every footer.
 */
import type { RoomVersion } from '../db/rooms';
import type { ScenarioSummaryInput } from '../pdf/summary';
import { summaryNoteSlugs } from '../pdf/summary-input';
import type { Technology } from '../../technology';

export function roomSummaryInput(roomName: string, version: RoomVersion, position: number, stamp: { email: string; at: Date } | null): ScenarioSummaryInput {
	const snapshot = version.snapshot;
	const scenario = snapshot.scenarios[position - 1];
	const technology = snapshot.project.technology as Technology;
	const run = scenario.probabilisticRun ?? null;
	const wanted = summaryNoteSlugs(technology, false, run !== null);
	return {
		project: { name: snapshot.project.name, technology, siteName: snapshot.project.siteName, siteDescription: snapshot.project.siteDescription, currency: snapshot.project.currency },
		scenario: { name: scenario.name, revision: scenario.revision, notes: scenario.notes },
		document: scenario.document,
		result: scenario.result,
		engineVersion: snapshot.engineVersion,
		tornado: null,
		run,
		methodNotes: wanted.flatMap((slug) => snapshot.methodNotes.filter((n) => n.slug === slug && n.markdown).map((n) => ({ slug: n.slug, title: n.title, markdown: n.markdown }))),
		cautions: snapshot.cautions,
		edition: { label: `Data room ${roomName}, version ${version.version}`, date: version.publishedAt },
		...(stamp ? { stamp } : {})
	};
}
