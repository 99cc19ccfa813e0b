/**
 * Renaming, changing the currency of and archiving projects, and deleting
 * archived scenarios, each with its line in the audit log: what the API
 * routes and the project page's form actions both do, after their own access
 * checks (rename and currency: analyst; archive, restore and delete: owner).
 */
import { archiveProject, restoreProject, updateProject, type ProjectChanges, type ProjectRow } from '../db/projects';
import { deleteArchivedScenario, getScenarioById } from '../db/scenarios';
import { withRoomForProject } from '../billing/gates';
import { recordWorkspaceEvent, scenarioDetail, type Actor } from './audit-trail';
import type { AmountsChoice } from './currency-conversion';
import { changeProjectCurrencyAs } from './project-currency';

/** A project's changes as the API takes them: a new currency comes with what happens to the scenarios' money. */
export type ProjectUpdate = ProjectChanges & { amounts?: 'keep'; conversionRate?: string | number };

/**
 * Changes a project's descriptive fields and currency; a new name is recorded
 * with the old one. A new currency goes through changeProjectCurrencyAs
 * (./project-currency.ts): refused (422, nothing changed) when the project's
 * scenarios hold money and neither `amounts: 'keep'` nor a `conversionRate` says what
 * becomes of it.
 */
export async function updateProjectAs(actor: Actor, project: ProjectRow, update: ProjectUpdate): Promise<ProjectRow> {
	const { currency, amounts, conversionRate, ...described } = update;
	let updated = project;
	if (currency !== undefined && currency !== project.currency) {
		const choice: AmountsChoice | null =
			conversionRate !== undefined ? { kind: 'convert', rate: String(conversionRate) } : amounts === 'keep' ? { kind: 'keep' } : null;
		updated = await changeProjectCurrencyAs(actor, project, currency, choice);
	}
	if (Object.values(described).some((value) => value !== undefined)) updated = (await updateProject(project.id, described))!;
	if (updated.name !== project.name) {
		await recordWorkspaceEvent(actor, 'project-renamed', { project: updated.name, projectId: project.id, from: project.name });
	}
	return updated;
}

/** Archives a live project (its scenarios and uploads are kept); an archived one is answered as it is. */
export async function archiveProjectAs(actor: Actor, project: ProjectRow): Promise<ProjectRow> {
	if (project.archived_at !== null) return project;
	const archived = (await archiveProject(project.id))!;
	await recordWorkspaceEvent(actor, 'project-archived', { project: project.name, projectId: project.id });
	return archived;
}

/** Brings an archived project back, taking a place under the plan's limit (PlanRefusal when there is none). */
export async function restoreProjectAs(actor: Actor, project: ProjectRow): Promise<ProjectRow> {
	if (project.archived_at === null) return project;
	const restored = (await withRoomForProject(project.workspace_id, (trx) => restoreProject(project.id, trx)))!;
	await recordWorkspaceEvent(actor, 'project-restored', { project: project.name, projectId: project.id });
	return restored;
}

/** Deletes an archived scenario of the project for good, with its history. */
export async function deleteArchivedScenarioAs(actor: Actor, project: ProjectRow, scenarioId: string): Promise<'deleted' | 'not-archived' | 'missing'> {
	const scenario = await getScenarioById(scenarioId);
	if (!scenario || scenario.projectId !== project.id) return 'missing';
	const outcome = await deleteArchivedScenario(scenarioId);
	if (outcome === 'deleted') await recordWorkspaceEvent(actor, 'scenario-deleted', { ...scenarioDetail(project, scenario), revision: scenario.revision });
	return outcome;
}
