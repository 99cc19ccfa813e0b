/**
 * A project's currency changes without relabelling money behind anyone's
 * back. The scenarios whose documents are in the project's currency hold
 * amounts in it; a new code for the project needs the user's word on them:
 * keep every figure and read it in the new currency (they were entered in it
 * already), or convert every figure at a rate the user gives. Either way each
 * such scenario gets a new revision saying what happened, in the same
 * transaction as the project's new code, and the change is in the audit log.
 * Scenarios whose documents are in some other currency are left as they are.
 */
import { db } from '../db/knex';
import { updateProject, type ProjectRow } from '../db/projects';
import { getScenarioById, listScenarioDocumentsOfProject, rewriteProjectScenarios } from '../db/scenarios';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { conversionRate } from '../../schemas/workbench';
import { ApiProblem } from './api-route';
import { recordWorkspaceEvent, type Actor } from './audit-trail';
import { currencyChangeSummary, documentInCurrency, rateDecimal, type AmountsChoice } from './currency-conversion';
import { storeResultOfSave } from './stored-results';

export interface CurrencyChangePlan {
	from: string;
	to: string;
	/** The scenarios whose money the change concerns (in the project's currency now), archived ones too, in list order. */
	scenarios: { id: string; name: string; archived: boolean; moneyAmounts: number }[];
	/** Money amounts in all of them. */
	moneyAmounts: number;
	/** Scenarios in a currency of their own, left as they are. */
	otherCurrencies: { name: string; currency: string }[];
}

/** A stored document read in the current format; a document that no longer reads stops the change (nothing is written). */
function readable(scenario: { name: string; document: unknown }): Scenario {
	const parsed = parseScenario(scenario.document);
	if (parsed.ok) return parsed.scenario;
	throw new ApiProblem(422, `The scenario "${scenario.name}" cannot be read as it is stored, so its money cannot be changed: open and save it, then change the currency.`, [
		{ path: 'currency', message: `scenario "${scenario.name}" does not read: ${parsed.issues[0]?.path} ${parsed.issues[0]?.message}` }
	]);
}

/** What changing the project's currency to `to` would concern. */
export async function planCurrencyChange(project: ProjectRow, to: string): Promise<CurrencyChangePlan> {
	const plan: CurrencyChangePlan = { from: project.currency, to, scenarios: [], moneyAmounts: 0, otherCurrencies: [] };
	for (const scenario of await listScenarioDocumentsOfProject(project.id)) {
		const document = readable(scenario);
		if (document.currency !== project.currency) {
			plan.otherCurrencies.push({ name: scenario.name, currency: document.currency });
			continue;
		}
		const { moneyAmounts } = documentInCurrency(document, to, { kind: 'keep' });
		plan.scenarios.push({ id: scenario.id, name: scenario.name, archived: scenario.archivedAt !== null, moneyAmounts });
		plan.moneyAmounts += moneyAmounts;
	}
	return plan;
}

/** The refusal of a change that would relabel money unasked, naming the field that says what to do. */
export function choiceNeeded(from: string, to: string, scenarios: number): ApiProblem {
	const count = scenarios === 1 ? 'one scenario' : `${scenarios} scenarios`;
	return new ApiProblem(
		422,
		`This project has ${count} with money in ${from}; changing the currency does not convert it. Say what happens to those amounts: keep them as they are, to be read in ${to}, or convert them at a rate.`,
		[{ path: 'amounts', message: `required with a new currency: "keep" to read the amounts of ${count} in ${to} unconverted, or send conversionRate (${to} per ${from}) instead` }],
		{ scenarios }
	);
}

/**
 * Sets the project's currency to `to`. Every scenario in the old currency is
 * rewritten as a new revision (its amounts kept or converted by `choice`);
 * without a choice, a project with such scenarios is refused (422) and
 * nothing changes. Answers the project as changed.
 */
export async function changeProjectCurrencyAs(actor: Actor, project: ProjectRow, to: string, choice: AmountsChoice | null): Promise<ProjectRow> {
	const from = project.currency;
	if (to === from) return project;
	const userId = actor.access.user.id;
	let concerned = 0;
	const { updated, rewritten } = await db().transaction(async (trx) => {
		const rewritten = await rewriteProjectScenarios(
			trx,
			project.id,
			(scenario) => {
				const document = readable(scenario);
				if (document.currency !== from) return null;
				concerned += 1;
				if (!choice) return null;
				return { document: documentInCurrency(document, to, choice).document, summary: currencyChangeSummary(from, to, choice) };
			},
			userId
		);
		// Counted under the lock: a scenario added since the user was asked is not relabelled unasked.
		if (concerned > 0 && !choice) throw choiceNeeded(from, to, concerned);
		const updated = (await updateProject(project.id, { currency: to }, trx))!;
		return { updated, rewritten };
	});
	for (const id of rewritten) {
		const scenario = await getScenarioById(id);
		if (scenario) await storeResultOfSave(scenario, updated);
	}
	await recordWorkspaceEvent(actor, 'project-currency-changed', {
		project: project.name,
		projectId: project.id,
		from,
		to,
		amounts: rewritten.length === 0 ? 'none' : choice?.kind === 'convert' ? 'converted' : 'kept',
		...(choice?.kind === 'convert' && rewritten.length > 0 ? { rate: rateDecimal(choice.rate).toString() } : {}),
		scenarios: rewritten.length
	});
	return updated;
}

/** The answer the project page's confirmation posts (`amounts`: keep or convert, `rate`): a choice, or what is missing. */
export function amountsChoiceOfForm(fields: Record<string, string | undefined>, plan: Pick<CurrencyChangePlan, 'from' | 'to'>): { ok: true; choice: AmountsChoice } | { ok: false; message: string } {
	if (fields.amounts === 'keep') return { ok: true, choice: { kind: 'keep' } };
	if (fields.amounts !== 'convert') return { ok: false, message: 'Choose what becomes of the amounts: convert them at a rate, or keep them as they are.' };
	const rate = conversionRate.safeParse((fields.rate ?? '').trim());
	if (!rate.success || (fields.rate ?? '').trim() === '') {
		return { ok: false, message: `Type the rate as how many ${plan.to} one ${plan.from} is worth, with a point for decimals and no thousands separators, such as 1.0825.` };
	}
	return { ok: true, choice: { kind: 'convert', rate: String(rate.data) } };
}

/** What the project page's confirmation says, from a plan: plain data for the page. */
export function currencyQuestion(plan: CurrencyChangePlan) {
	return {
		from: plan.from,
		to: plan.to,
		scenarios: plan.scenarios.map(({ name, archived, moneyAmounts }) => ({ name, archived, moneyAmounts })),
		moneyAmounts: plan.moneyAmounts,
		otherCurrencies: plan.otherCurrencies
	};
}

/** The words after a change: what became of the money. */
export function currencyChangeDone(plan: CurrencyChangePlan, choice: AmountsChoice | null): string {
	const now = `The project's currency is now ${plan.to}.`;
	const count = plan.scenarios.length === 1 ? 'one scenario' : `${plan.scenarios.length} scenarios`;
	if (plan.scenarios.length === 0 || !choice) return now;
	if (choice.kind === 'convert') {
		return `${now} Every money amount of ${count} was converted at ${rateDecimal(choice.rate).toString()} ${plan.to} per ${plan.from}, each saved as a new revision.`;
	}
	return `${now} The money amounts of ${count} were kept as they were and now read as ${plan.to} (not converted), each saved as a new revision.`;
}
