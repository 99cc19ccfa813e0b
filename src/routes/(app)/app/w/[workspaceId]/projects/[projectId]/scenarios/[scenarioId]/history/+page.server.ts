import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { roleAtLeast } from '$lib/server/auth/roles';
import { authorize, scenarioReadInView } from '$lib/server/auth/access';
import { listScenarioRevisions } from '$lib/server/db/scenarios';
import { readForm } from '$lib/server/forms';
import { loadScenario } from '$lib/server/workbench/evaluation';
import { isArchivedProject, ARCHIVED_PROJECT_MESSAGE } from '$lib/server/workbench/live-project';
import { chooseRevisions } from '$lib/server/workbench/revision-choice';
import { compareRevisions, restoreRevision } from '$lib/server/workbench/revision-history';
import { actorOf } from '$lib/server/workbench/audit-trail';
import type { Actions, PageServerLoad } from './$types';

/** Every revision (who, when, what), and the inputs that differ between the two chosen in the address (`?from=&to=`). */
export const load: PageServerLoad = async (event) => {
	const { project, membership, scenarioId } = await authorize(event, event.params, 'viewer');
	const scenario = scenarioReadInView(event, scenarioId) ?? (await loadScenario(scenarioId));
	const revisions = await listScenarioRevisions(scenarioId);
	const choice = chooseRevisions(event.url.searchParams, revisions.map((r) => r.revision), scenario.revision);
	const comparison = choice ? await compareRevisions(scenarioId, project, choice.from, choice.to) : null;
	const number = (name: string) => Number(event.url.searchParams.get(name)) || null;
	return {
		project: { id: project.id, name: project.name, workspaceId: project.workspace_id },
		scenario: { id: scenario.id, name: scenario.name, revision: scenario.revision, archived: scenario.archivedAt !== null },
		revisions: revisions.map((r) => ({ revision: r.revision, summary: r.summary, by: r.changedBy?.name ?? null, at: r.changedAt.toISOString() })),
		choice,
		comparison,
		restored: number('restored'),
		unchanged: number('unchanged'),
		canRestore: roleAtLeast(membership.role, 'analyst') && !isArchivedProject(project) && scenario.archivedAt === null
	};
};

const restoreForm = z.object({
	revision: z.coerce.number().int().positive(),
	expectedRevision: z.coerce.number().int().positive()
});

export const actions: Actions = {
	/** Asks first (naming the revision and who saved it), then saves that revision again as the newest. */
	restore: async (event) => {
		const access = await authorize(event, event.params, 'analyst');
		const fields = await readForm(event.request);
		const parsed = restoreForm.safeParse(fields);
		if (!parsed.success) return fail(400, { message: 'Choose a revision to restore.' });
		const { revision, expectedRevision } = parsed.data;
		const historyPath = event.url.pathname;
		if (fields.confirmed !== 'yes') {
			if (isArchivedProject(access.project)) return fail(409, { message: ARCHIVED_PROJECT_MESSAGE });
			const entry = (await listScenarioRevisions(access.scenarioId)).find((r) => r.revision === revision);
			if (!entry) return fail(404, { message: `This scenario has no revision ${revision}.` });
			return { confirmRestore: { revision, expectedRevision, by: entry.changedBy?.name ?? null, at: entry.changedAt.toISOString(), summary: entry.summary } };
		}
		const outcome = await restoreRevision(actorOf(event, access), revision, expectedRevision);
		if (!outcome.ok) return fail(outcome.status, { message: outcome.message, currentRevision: outcome.currentRevision ?? null });
		if (!outcome.changed) redirect(303, `${historyPath}?unchanged=${revision}`);
		redirect(303, `${historyPath}?from=${expectedRevision}&to=${outcome.scenario.revision}&restored=${revision}`);
	}
};
