/**
 * A scenario's history for its history page: any two revisions compared
 * input by input (revision-differences.ts), and an earlier revision restored
 * as a new one. A restore is a save like any other: it names the revision
 * the user was looking at and is refused when someone saved since.
 */
import { ArchivedScenarioError, StaleRevisionError, getScenarioRevisionDocument, saveScenario, type ScenarioRecord } from '../db/scenarios';
import type { ProjectRow } from '../db/projects';
import type { ScenarioAccess } from '../auth/access';
import { ApiProblem, validateDocument } from './api-route';
import { resultOfSavedScenario, storeResultOfSave } from './stored-results';
import { isArchivedProject, ARCHIVED_PROJECT_MESSAGE } from './live-project';
import { revisionDifferences, type RevisionDifference, type RevisionSide } from './revision-differences';
import { recordWorkspaceEvent, scenarioDetail, type Actor } from './audit-trail';

export type RevisionComparison =
	| { ok: true; from: number; to: number; differences: RevisionDifference[] }
	| { ok: false; from: number; to: number; message: string };

/** A saved revision read as the engine reads it (an older format upgraded), with its stored result. */
async function sideOf(scenarioId: string, project: ProjectRow, revision: number): Promise<RevisionSide | string> {
	const saved = await getScenarioRevisionDocument(scenarioId, revision);
	if (!saved) return `This scenario has no revision ${revision}.`;
	try {
		const document = validateDocument(saved, project);
		const { result } = await resultOfSavedScenario({ id: scenarioId, revision, document: saved }, project);
		return { revision, name: document.name, document, result };
	} catch (e) {
		if (e instanceof ApiProblem) return `Revision ${revision} cannot be read as an input list: ${e.message}`;
		throw e;
	}
}

/** The inputs that differ from revision `from` to revision `to`, in words with their units. */
export async function compareRevisions(scenarioId: string, project: ProjectRow, from: number, to: number): Promise<RevisionComparison> {
	const [before, after] = await Promise.all([sideOf(scenarioId, project, from), sideOf(scenarioId, project, to)]);
	if (typeof before === 'string') return { ok: false, from, to, message: before };
	if (typeof after === 'string') return { ok: false, from, to, message: after };
	return { ok: true, from, to, differences: revisionDifferences(before, after) };
}

export type RestoreOutcome =
	| { ok: true; scenario: ScenarioRecord; changed: boolean }
	| { ok: false; status: 404 | 409 | 422; message: string; currentRevision?: number };

/**
 * Saves revision `revision` again as the newest, name and all, when the
 * scenario is still at `expectedRevision` (the one the user was looking at).
 * The notes are kept as they are now: they are not part of a revision.
 */
export async function restoreRevision(actor: Actor & { access: ScenarioAccess }, revision: number, expectedRevision: number): Promise<RestoreOutcome> {
	const { project, user, scenarioId } = actor.access;
	if (isArchivedProject(project)) return { ok: false, status: 409, message: ARCHIVED_PROJECT_MESSAGE };
	const saved = await getScenarioRevisionDocument(scenarioId, revision);
	if (!saved) return { ok: false, status: 404, message: `This scenario has no revision ${revision}.` };
	let scenario: ScenarioRecord | undefined;
	try {
		const document = validateDocument(saved, project);
		scenario = await saveScenario({ scenarioId, expectedRevision, userId: user.id, name: document.name, document, summary: `Restored revision ${revision}` });
	} catch (e) {
		if (e instanceof StaleRevisionError) return { ok: false, status: 409, message: e.message, currentRevision: e.currentRevision };
		if (e instanceof ArchivedScenarioError) return { ok: false, status: 409, message: e.message };
		if (e instanceof ApiProblem) return { ok: false, status: 422, message: `Revision ${revision} cannot be saved again as it is: ${e.message}` };
		throw e;
	}
	if (!scenario) return { ok: false, status: 404, message: 'No such scenario, or it is not yours.' };
	const changed = scenario.revision !== expectedRevision;
	if (changed) {
		await storeResultOfSave(scenario, project);
		await recordWorkspaceEvent(actor, 'scenario-restored', { ...scenarioDetail(project, scenario), revision: scenario.revision, restoredFrom: revision });
	}
	return { ok: true, scenario, changed };
}
