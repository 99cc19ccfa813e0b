/**
 * What a caller of the PDF summary gathers on the request thread: the method
 * notes it prints, the team's copy of a saved scenario, and the file name.
 * The data rooms build their investors' copies from the same pieces, with
 * their own edition label and a stamp.
 */
import { CAUTIONS } from '../../cautions';
import type { Scenario } from '../../schemas/scenario';
import type { Technology } from '../../technology';
import type { ProjectRow } from '../db/projects';
import type { EngineResult } from '../engine/evaluate';
import type { TornadoResult } from '../engine/sensitivity';
import type { SnapshotRun } from '../rooms/snapshot-format';
import { getMethodNoteSource } from '../methods/notes';
import { fileStem } from '../workbench/export';
import { summaryNoteSlugs } from './note-choice';
import type { ScenarioSummaryInput } from './summary';

export { summaryNoteSlugs };

/** The chosen notes with their markdown, as bundled with the app. */
export function summaryMethodNotes(technology: Technology, withTornado: boolean, withRun = false): ScenarioSummaryInput['methodNotes'] {
	return summaryNoteSlugs(technology, withTornado, withRun).flatMap((slug) => {
		const note = getMethodNoteSource(slug);
		return note ? [note] : [];
	});
}

export const TEAM_EDITION_LABEL = 'Team copy';

export interface TeamCopySource {
	project: Pick<ProjectRow, 'name' | 'technology' | 'site_name' | 'site_description' | 'currency'>;
	scenario: { name: string; revision: number; notes: string };
	document: Scenario;
	result: EngineResult;
	engineVersion: string;
	tornado: TornadoResult | null;
	/** The revision's latest finished probabilistic run, frozen as a room would freeze it; printed with its method note. */
	run?: SnapshotRun | null;
	date: Date;
}

/** The team's copy of a saved scenario's summary: no stamp, the cautions the exports carry. */
export function teamCopyInput(source: TeamCopySource): ScenarioSummaryInput {
	const { project } = source;
	return {
		project: { name: project.name, technology: project.technology, siteName: project.site_name, siteDescription: project.site_description, currency: project.currency },
		scenario: source.scenario,
		document: source.document,
		result: source.result,
		engineVersion: source.engineVersion,
		tornado: source.tornado,
		run: source.run ?? null,
		methodNotes: summaryMethodNotes(project.technology, source.tornado !== null, Boolean(source.run)),
		cautions: CAUTIONS,
		edition: { label: TEAM_EDITION_LABEL, date: source.date }
	};
}

/** "kestle-narrows-base-case-r3-summary.pdf": safe characters only. */
export function summaryFileName(scenarioName: string, revision: number): string {
	return `${fileStem(scenarioName)}-r${revision}-summary.pdf`;
}

/** The PDF as a download: its file name from the scenario, no sniffing, no shared caching. */
export function summaryPdfResponse(pdf: Uint8Array, scenarioName: string, revision: number): Response {
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `attachment; filename="${summaryFileName(scenarioName, revision)}"`,
			'content-length': String(pdf.byteLength),
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, no-store'
		}
	});
}
