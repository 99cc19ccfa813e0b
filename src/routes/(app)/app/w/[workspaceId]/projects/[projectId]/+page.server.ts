import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { roleAtLeast } from '$lib/server/auth/roles';
import { authorize, authorizeProjectRead } from '$lib/server/auth/access';
import { readProjectPageKept } from '$lib/server/db/project-page';
import { projectJson, scenarioSummaryJson, uploadSummaryJson } from '$lib/server/workbench/serialize';
import { keyFiguresOf } from '$lib/server/workbench/stored-results';
import { ENGINE_VERSION } from '$lib/server/engine/version';
import { ARCHIVED_PROJECT_MESSAGE, isArchivedProject } from '$lib/server/workbench/live-project';
import { getScenarioById } from '$lib/server/db/scenarios';
import { readForm } from '$lib/server/forms';
import { actorOf } from '$lib/server/workbench/audit-trail';
import { archiveProjectAs, deleteArchivedScenarioAs, updateProjectAs } from '$lib/server/workbench/project-lifecycle';
import { amountsChoiceOfForm, changeProjectCurrencyAs, currencyChangeDone, currencyQuestion, planCurrencyChange } from '$lib/server/workbench/project-currency';
import type { AmountsChoice } from '$lib/server/workbench/currency-conversion';
import { ApiProblem } from '$lib/server/workbench/api-route';
import type { Actions, PageServerLoad } from './$types';

/**
 * The project, its live scenarios with their stored key figures, and its
 * uploads; changes go through the API and the page refetches from it. An
 * archived project is shown read only, with a restore button for owners.
 */
export const load: PageServerLoad = async (event) => {
	// The project, its scenarios with their stored key figures and its uploads in one query, checked before use.
	const { access, read } = await authorizeProjectRead(event, event.params, 'viewer', (id) => readProjectPageKept(id, ENGINE_VERSION));
	const { project, membership } = access;
	const { scenarios, uploads } = read;
	return {
		project: projectJson(project),
		scenarios: scenarios.map((s) => ({ ...scenarioSummaryJson(s), keyFigures: keyFiguresOf(s.stored) })),
		uploads: uploads.map(uploadSummaryJson),
		role: membership.role,
		canEdit: roleAtLeast(membership.role, 'analyst') && !isArchivedProject(project),
		canRestore: isArchivedProject(project) && roleAtLeast(membership.role, 'owner'),
		isOwner: roleAtLeast(membership.role, 'owner')
	};
};

const renameForm = z.object({ name: z.string().trim().min(1, 'Give the project a name.').max(200, 'At most 200 characters.') });
const scenarioTarget = z.object({ scenarioId: z.uuid('Choose a scenario.') });
const currencyForm = z.object({
	currency: z
		.string()
		.trim()
		.toUpperCase()
		.regex(/^[A-Z]{3}$/, 'Give a three-letter currency code, such as EUR, GBP or USD.')
});

/**
 * Renaming and changing the currency (analysts), archiving and deleting an
 * archived scenario for good (owners), as the API allows; the two that take
 * things out of sight ask first: without `confirmed=yes` the answer is the
 * question, naming what would go, and nothing changes. A new currency for a
 * project whose scenarios hold money asks too, and the confirming post says
 * what becomes of that money (kept, or converted at a rate).
 */
export const actions: Actions = {
	rename: async (event) => {
		const access = await authorize(event, event.params, 'analyst');
		const fields = await readForm(event.request);
		const parsed = renameForm.safeParse(fields);
		if (!parsed.success) return fail(400, { action: 'rename', name: fields.name ?? '', message: parsed.error.issues[0].message });
		if (isArchivedProject(access.project)) return fail(409, { action: 'rename', name: parsed.data.name, message: ARCHIVED_PROJECT_MESSAGE });
		const updated = await updateProjectAs(actorOf(event, access), access.project, { name: parsed.data.name });
		return { action: 'rename', done: `The project is now called ${updated.name}.` };
	},

	currency: async (event) => {
		const access = await authorize(event, event.params, 'analyst');
		const fields = await readForm(event.request);
		const parsed = currencyForm.safeParse(fields);
		if (!parsed.success) return fail(400, { action: 'currency', currency: fields.currency ?? '', message: parsed.error.issues[0].message });
		if (isArchivedProject(access.project)) return fail(409, { action: 'currency', currency: parsed.data.currency, message: ARCHIVED_PROJECT_MESSAGE });
		const to = parsed.data.currency;
		if (to === access.project.currency) return fail(400, { action: 'currency', currency: to, message: `The project's currency is ${to} already.` });
		try {
			const plan = await planCurrencyChange(access.project, to);
			let choice: AmountsChoice | null = null;
			if (plan.scenarios.length > 0) {
				const confirmCurrency = currencyQuestion(plan);
				if (fields.confirmed !== 'yes') return { action: 'currency', confirmCurrency };
				const answer = amountsChoiceOfForm(fields, plan);
				if (!answer.ok) return fail(400, { action: 'currency', confirmCurrency, amounts: fields.amounts ?? '', rate: fields.rate ?? '', message: answer.message });
				choice = answer.choice;
			}
			await changeProjectCurrencyAs(actorOf(event, access), access.project, to, choice);
			return { action: 'currency', done: currencyChangeDone(plan, choice) };
		} catch (e) {
			if (e instanceof ApiProblem) return fail(e.status, { action: 'currency', currency: to, message: e.message });
			throw e;
		}
	},

	archive: async (event) => {
		const access = await authorize(event, event.params, 'owner');
		const fields = await readForm(event.request);
		if (isArchivedProject(access.project)) return fail(409, { action: 'archive', message: 'This project is archived already.' });
		if (fields.confirmed !== 'yes') return { action: 'archive', confirmArchive: { name: access.project.name } };
		await archiveProjectAs(actorOf(event, access), access.project);
		return { action: 'archive', done: `${access.project.name} is archived: it is read only and out of the project list until an owner restores it.` };
	},

	deleteScenario: async (event) => {
		const access = await authorize(event, event.params, 'owner');
		const fields = await readForm(event.request);
		const target = scenarioTarget.safeParse(fields);
		if (!target.success) return fail(400, { action: 'deleteScenario', message: 'Choose a scenario to delete.' });
		if (isArchivedProject(access.project)) return fail(409, { action: 'deleteScenario', message: ARCHIVED_PROJECT_MESSAGE });
		const scenario = await getScenarioById(target.data.scenarioId);
		if (!scenario || scenario.projectId !== access.project.id) return fail(404, { action: 'deleteScenario', message: 'No such scenario in this project.' });
		if (!scenario.archivedAt) return fail(409, { action: 'deleteScenario', message: `Archive ${scenario.name} before deleting it for good.` });
		if (fields.confirmed !== 'yes') {
			return { action: 'deleteScenario', confirmDelete: { scenarioId: scenario.id, name: scenario.name, revision: scenario.revision } };
		}
		const outcome = await deleteArchivedScenarioAs(actorOf(event, access), access.project, scenario.id);
		if (outcome !== 'deleted') return fail(outcome === 'missing' ? 404 : 409, { action: 'deleteScenario', message: `${scenario.name} could not be deleted: it is no longer archived, or already gone.` });
		return { action: 'deleteScenario', done: `${scenario.name} is deleted for good, with its ${scenario.revision === 1 ? 'one revision' : `${scenario.revision} revisions`}.` };
	}
};
