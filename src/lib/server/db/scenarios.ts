/**
 * Scenarios and their revision history. Every change to a scenario's name,
 * notes or document bumps its revision and writes a revision row in the same
 * transaction. A save names the revision it was editing; when the row has
 * moved on the save is refused with StaleRevisionError and nothing is written.
 *
 * The row's name and the document's `name` are kept the same: the row's name
 * wins, and only the `name` field of a save renames a scenario (a document's
 * own `name` is overwritten). Callers pass documents already validated
 * against the scenario schema.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import { projectColumns, type ProjectRow } from './projects';
import { exactTimestamp, keysetPage, type KeysetPage, type KeysetRequest } from './keyset';
import type { Scenario } from '../../schemas/scenario';
import { changedSections, describeEdit } from '../workbench/document-changes';
import { placeholdersAfterSave, samePlaceholders } from '../../workbench/placeholders';

export type ScenarioDocument = Scenario;

export interface PersonRef {
	id: string;
	name: string;
}

export interface ScenarioSummary {
	id: string;
	projectId: string;
	name: string;
	notes: string;
	schemaVersion: number;
	revision: number;
	isBaseCase: boolean;
	archivedAt: Date | null;
	createdAt: Date;
	updatedAt: Date;
	createdBy: PersonRef | null;
	updatedBy: PersonRef | null;
}

export interface ScenarioRecord extends ScenarioSummary {
	document: ScenarioDocument;
	/** Values still a template's placeholders, as document paths (`capex.lines[0].amount`); see workbench/placeholders.ts. */
	placeholderPaths: string[];
}

export interface ScenarioRevision {
	revision: number;
	name: string;
	changedSections: string[];
	summary: string;
	changedAt: Date;
	changedBy: PersonRef | null;
}

export class StaleRevisionError extends Error {
	constructor(
		readonly expectedRevision: number,
		readonly currentRevision: number,
		readonly updatedAt: Date,
		readonly updatedByName: string | null
	) {
		const who = updatedByName ? ` by ${updatedByName}` : '';
		super(
			`This scenario has changed since you opened it: you were editing revision ${expectedRevision}, ` +
				`but revision ${currentRevision} was saved${who} at ${updatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC. ` +
				`Nothing was saved: apply your change to revision ${currentRevision} and save it against that revision.`
		);
		this.name = 'StaleRevisionError';
	}
}

export class ArchivedScenarioError extends Error {
	constructor(action: string) {
		super(`This scenario is archived: restore it before you ${action}.`);
		this.name = 'ArchivedScenarioError';
	}
}

const summaryColumns = [
	'scenarios.id',
	'scenarios.project_id',
	'scenarios.name',
	'scenarios.notes',
	'scenarios.schema_version',
	'scenarios.revision',
	'scenarios.is_base_case',
	'scenarios.archived_at',
	'scenarios.created_at',
	'scenarios.updated_at',
	'scenarios.created_by',
	'scenarios.updated_by',
	'creator.name as created_by_name',
	'updater.name as updated_by_name'
] as const;

interface SummaryDbRow {
	id: string;
	project_id: string;
	name: string;
	notes: string;
	schema_version: number;
	revision: number;
	is_base_case: boolean;
	archived_at: Date | null;
	created_at: Date;
	updated_at: Date;
	created_by: string | null;
	updated_by: string | null;
	created_by_name: string | null;
	updated_by_name: string | null;
}

function person(id: string | null, name: string | null): PersonRef | null {
	return id === null ? null : { id, name: name ?? '' };
}

function toSummary(row: SummaryDbRow): ScenarioSummary {
	return {
		id: row.id,
		projectId: row.project_id,
		name: row.name,
		notes: row.notes,
		schemaVersion: row.schema_version,
		revision: row.revision,
		isBaseCase: row.is_base_case,
		archivedAt: row.archived_at,
		createdAt: row.created_at,
		updatedAt: row.updated_at,
		createdBy: person(row.created_by, row.created_by_name),
		updatedBy: person(row.updated_by, row.updated_by_name)
	};
}

/** The columns a record adds to its summary: the document and its placeholder marks. */
const recordColumns = ['scenarios.document', 'scenarios.placeholder_paths'] as const;

function toRecord(row: SummaryDbRow & { document: ScenarioDocument; placeholder_paths: string[] | null }): ScenarioRecord {
	return { ...toSummary(row), document: row.document, placeholderPaths: row.placeholder_paths ?? [] };
}

function summaries(knex: Knex) {
	return knex('scenarios')
		.leftJoin('users as creator', 'creator.id', 'scenarios.created_by')
		.leftJoin('users as updater', 'updater.id', 'scenarios.updated_by');
}

/**
 * The base case first, then by name, then oldest first, then by id: every
 * column ascending (the base case as `not is_base_case`), so one row
 * comparison pages through the list.
 */
const scenarioListOrder = 'not scenarios.is_base_case, scenarios.name, scenarios.created_at, scenarios.id';

export async function listScenariosInProject(
	projectId: string,
	options: { archived?: boolean } = {},
	knex: Knex = db()
): Promise<ScenarioSummary[]> {
	const query = summaries(knex).select(summaryColumns).where('scenarios.project_id', projectId);
	if (options.archived) query.whereNotNull('scenarios.archived_at');
	else query.whereNull('scenarios.archived_at');
	const rows: SummaryDbRow[] = await query.orderByRaw(scenarioListOrder);
	return rows.map(toSummary);
}

export type ScenarioWithStoredMetrics = ScenarioSummary & { stored: { metrics: Record<string, string | null>; currency: string } | null };

type StoredMetricsDbRow = SummaryDbRow & { stored_metrics: Record<string, string | null> | null; stored_currency: string | null };

/**
 * The live scenarios of the project `projectId` names (an id, or a reference
 * to an outer query's column), in list order, each with its current
 * revision's stored metrics for one engine version (null when not stored).
 */
export function liveScenariosWithStoredMetricsQuery(projectId: string | Knex.Ref<string, Record<string, string>>, engineVersion: string, knex: Knex = db()) {
	return summaries(knex)
		.leftJoin('scenario_results as stored', function () {
			this.on('stored.scenario_id', 'scenarios.id').andOn('stored.revision', 'scenarios.revision').andOnVal('stored.engine_version', engineVersion);
		})
		.select([...summaryColumns, 'stored.metrics as stored_metrics', 'stored.currency as stored_currency'])
		.where('scenarios.project_id', projectId)
		.whereNull('scenarios.archived_at')
		.orderByRaw(scenarioListOrder);
}

function toScenarioWithStoredMetrics(row: StoredMetricsDbRow): ScenarioWithStoredMetrics {
	return { ...toSummary(row), stored: row.stored_metrics ? { metrics: row.stored_metrics, currency: row.stored_currency ?? '' } : null };
}

/** A row of liveScenariosWithStoredMetricsQuery read back from json_agg (its timestamps arrive as text). */
export function scenarioWithStoredMetricsFromJson(row: StoredMetricsDbRow): ScenarioWithStoredMetrics {
	return toScenarioWithStoredMetrics({
		...row,
		archived_at: row.archived_at === null ? null : new Date(row.archived_at),
		created_at: new Date(row.created_at),
		updated_at: new Date(row.updated_at)
	});
}

/** A scenario (with its document) and the project it belongs to, in one query: what the editor page needs after the access check. */
export async function getScenarioWithProject(id: string, knex: Knex = db()): Promise<{ scenario: ScenarioRecord; project: ProjectRow } | undefined> {
	const row = await summaries(knex)
		.join('projects', 'projects.id', 'scenarios.project_id')
		.select([...summaryColumns, ...recordColumns, ...projectColumns.map((c) => `projects.${c} as project_${c}`)])
		.where('scenarios.id', id)
		.first();
	if (!row) return undefined;
	const project = Object.fromEntries(projectColumns.map((c) => [c, row[`project_${c}`]])) as unknown as ProjectRow;
	return { scenario: toRecord(row), project };
}

/** Where a scenario sits in the list: base case or not, name, when it was created (to the microsecond), id. */
export type ScenarioListKey = [isBaseCase: boolean, name: string, createdAt: string, id: string];

/** One page of the project's live (or archived) scenarios, in list order, after `after`. */
export async function listScenariosPage(
	projectId: string,
	request: KeysetRequest<ScenarioListKey> & { archived?: boolean },
	knex: Knex = db()
): Promise<KeysetPage<ScenarioSummary, ScenarioListKey>> {
	const query = summaries(knex)
		.select([...summaryColumns, knex.raw(`${exactTimestamp('scenarios.created_at')} as created_at_key`)])
		.where('scenarios.project_id', projectId);
	if (request.archived) query.whereNotNull('scenarios.archived_at');
	else query.whereNull('scenarios.archived_at');
	if (request.after) {
		query.whereRaw(`(${scenarioListOrder}) > (not ?::boolean, ?, ?::timestamptz, ?::uuid)`, request.after);
	}
	const rows: (SummaryDbRow & { created_at_key: string })[] = await query.orderByRaw(scenarioListOrder).limit(request.limit + 1);
	const page = keysetPage(rows, request.limit, (row): ScenarioListKey => [row.is_base_case, row.name, row.created_at_key, row.id]);
	return { items: page.items.map(toSummary), nextKey: page.nextKey };
}

export async function getScenarioById(id: string, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	const row = await summaries(knex)
		.select([...summaryColumns, ...recordColumns])
		.where('scenarios.id', id)
		.first();
	return row && toRecord(row);
}

/** The documents of chosen scenarios of one project, in the order asked (unknown ids are left out). */
export async function getScenariosInProject(projectId: string, ids: readonly string[], knex: Knex = db()): Promise<ScenarioRecord[]> {
	if (ids.length === 0) return [];
	const rows = await summaries(knex)
		.select([...summaryColumns, ...recordColumns])
		.where('scenarios.project_id', projectId)
		.whereIn('scenarios.id', ids);
	const byId = new Map(rows.map((row) => [row.id, toRecord(row)]));
	return ids.flatMap((id) => byId.get(id) ?? []);
}

export async function getBaseCaseOfProject(projectId: string, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	const row = await knex('scenarios').select('id').where({ project_id: projectId, is_base_case: true }).first();
	return row ? getScenarioById(row.id, knex) : undefined;
}

/** Where a scenario sits, for authorization: its project and that project's workspace. */
export async function getScenarioPlace(
	id: string,
	knex: Knex = db()
): Promise<{ scenarioId: string; projectId: string; workspaceId: string } | undefined> {
	const row = await knex('scenarios')
		.join('projects', 'projects.id', 'scenarios.project_id')
		.select('scenarios.id', 'scenarios.project_id', 'projects.workspace_id')
		.where('scenarios.id', id)
		.first();
	return row && { scenarioId: row.id, projectId: row.project_id, workspaceId: row.workspace_id };
}

async function insertRevision(
	trx: Knex.Transaction,
	entry: { scenarioId: string; revision: number; name: string; document: ScenarioDocument; sections: string[]; summary: string; userId: string | null }
) {
	await trx('scenario_revisions').insert({
		scenario_id: entry.scenarioId,
		revision: entry.revision,
		name: entry.name,
		document: JSON.stringify(entry.document),
		changed_sections: entry.sections,
		summary: entry.summary,
		changed_by: entry.userId
	});
}

/** Locks the project row so base-case choices in it happen one at a time. */
async function lockProject(trx: Knex.Transaction, projectId: string) {
	await trx('projects').select('id').where({ id: projectId }).forUpdate();
}

export interface NewScenario {
	projectId: string;
	name: string;
	notes?: string;
	document: ScenarioDocument;
	userId: string | null;
	/** Revision 1's summary; "Created" when omitted. */
	summary?: string;
	/** Values still a template's placeholders (workbench/placeholders.ts); none when omitted. */
	placeholderPaths?: readonly string[];
}

/** Creates a scenario at revision 1. The first live scenario of a project becomes its base case. */
export async function createScenario(input: NewScenario, knex: Knex = db()): Promise<ScenarioRecord> {
	const id = await knex.transaction(async (trx) => {
		await lockProject(trx, input.projectId);
		const existingBase = await trx('scenarios').select('id').where({ project_id: input.projectId, is_base_case: true }).first();
		const document = { ...input.document, name: input.name };
		const [row] = await trx('scenarios')
			.insert({
				project_id: input.projectId,
				name: input.name,
				notes: input.notes ?? '',
				document: JSON.stringify(document),
				placeholder_paths: JSON.stringify(input.placeholderPaths ?? []),
				schema_version: document.schemaVersion,
				revision: 1,
				is_base_case: !existingBase,
				created_by: input.userId,
				updated_by: input.userId
			})
			.returning('id');
		await insertRevision(trx, {
			scenarioId: row.id,
			revision: 1,
			name: input.name,
			document,
			sections: changedSections(null, document),
			summary: input.summary ?? 'Created',
			userId: input.userId
		});
		return row.id as string;
	});
	return (await getScenarioById(id, knex))!;
}

export interface ScenarioSave {
	scenarioId: string;
	/** The revision the user was editing. */
	expectedRevision: number;
	userId: string | null;
	name?: string;
	notes?: string;
	document?: ScenarioDocument;
	/** Words for the history instead of the generated "Edited capex and opex". */
	summary?: string;
	/** The placeholder marks the editor still shows; the stored ones are narrowed to these (a save never adds a mark). */
	placeholderPaths?: readonly string[];
	/** The part of the document an upload replaced (`resource`, `device`): its marks go. */
	replacedPart?: string;
}

/**
 * Saves a new revision. Refuses (StaleRevisionError) when the scenario is no
 * longer at `expectedRevision`; answers undefined when it does not exist. A
 * save that changes nothing writes nothing and answers the scenario as it is.
 * Placeholder marks whose values the save changed are dropped with it; a
 * save that only drops marks (the user kept the example's values) updates
 * them without a new revision, since no input changed.
 */
export async function saveScenario(save: ScenarioSave, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	const saved = await knex.transaction(async (trx) => {
		const current = await trx('scenarios')
			.leftJoin('users as updater', 'updater.id', 'scenarios.updated_by')
			.select(
				'scenarios.id',
				'scenarios.name',
				'scenarios.notes',
				'scenarios.document',
				'scenarios.placeholder_paths',
				'scenarios.revision',
				'scenarios.archived_at',
				'scenarios.updated_at',
				'updater.name as updated_by_name'
			)
			.where('scenarios.id', save.scenarioId)
			.forUpdate('scenarios')
			.first();
		if (!current) return false;
		if (current.revision !== save.expectedRevision) {
			throw new StaleRevisionError(save.expectedRevision, current.revision, current.updated_at, current.updated_by_name);
		}
		if (current.archived_at) throw new ArchivedScenarioError('edit it');

		const name = save.name ?? current.name;
		const document: ScenarioDocument = { ...(save.document ?? current.document), name };
		const notes = save.notes ?? current.notes;
		const sections = changedSections(current.document, document);
		if (notes !== current.notes) sections.push('notes');
		const marks: string[] = current.placeholder_paths ?? [];
		const placeholders = placeholdersAfterSave(marks, current.document, document, { requested: save.placeholderPaths, replacedPart: save.replacedPart });
		if (sections.length === 0) {
			if (!samePlaceholders(placeholders, marks)) await trx('scenarios').where({ id: save.scenarioId }).update({ placeholder_paths: JSON.stringify(placeholders) });
			return true;
		}

		const revision = current.revision + 1;
		await trx('scenarios').where({ id: save.scenarioId }).update({
			name,
			notes,
			document: JSON.stringify(document),
			placeholder_paths: JSON.stringify(placeholders),
			schema_version: document.schemaVersion,
			revision,
			updated_by: save.userId,
			updated_at: trx.fn.now()
		});
		await insertRevision(trx, {
			scenarioId: save.scenarioId,
			revision,
			name,
			document,
			sections,
			summary: save.summary ?? describeEdit(sections),
			userId: save.userId
		});
		return true;
	});
	return saved ? getScenarioById(save.scenarioId, knex) : undefined;
}

/** Every scenario of a project, archived ones too, with its document as stored, in list order. */
export async function listScenarioDocumentsOfProject(
	projectId: string,
	knex: Knex = db()
): Promise<{ id: string; name: string; archivedAt: Date | null; document: ScenarioDocument }[]> {
	const rows = await knex('scenarios')
		.select('id', 'name', 'archived_at', 'document')
		.where({ project_id: projectId })
		.orderByRaw(scenarioListOrder);
	return rows.map((row) => ({ id: row.id, name: row.name, archivedAt: row.archived_at, document: row.document }));
}

export interface ScenarioRewrite {
	document: ScenarioDocument;
	/** The history's words for the new revision. */
	summary: string;
}

/**
 * Rewrites documents of a project's scenarios, archived ones too, each as a
 * new revision, inside the caller's transaction, holding the project and its
 * scenarios so nobody saves in between (an editor open on an older revision
 * then meets the usual save conflict). `rewrite` answers null for a scenario
 * it leaves alone. Placeholder marks stay: a converted example figure is
 * still the example's. Answers the ids rewritten.
 */
export async function rewriteProjectScenarios(
	trx: Knex.Transaction,
	projectId: string,
	rewrite: (scenario: { id: string; name: string; document: ScenarioDocument }) => ScenarioRewrite | null,
	userId: string | null
): Promise<string[]> {
	await lockProject(trx, projectId);
	const rows = await trx('scenarios').select('id', 'name', 'document', 'revision').where({ project_id: projectId }).orderBy('created_at').forUpdate();
	const rewritten: string[] = [];
	for (const row of rows) {
		const change = rewrite({ id: row.id, name: row.name, document: row.document });
		if (!change) continue;
		const document = { ...change.document, name: row.name };
		const sections = changedSections(row.document, document);
		if (sections.length === 0) continue;
		const revision = row.revision + 1;
		await trx('scenarios').where({ id: row.id }).update({
			document: JSON.stringify(document),
			schema_version: document.schemaVersion,
			revision,
			updated_by: userId,
			updated_at: trx.fn.now()
		});
		await insertRevision(trx, { scenarioId: row.id, revision, name: row.name, document, sections, summary: change.summary, userId });
		rewritten.push(row.id);
	}
	return rewritten;
}

/** A copy at revision 1 in the same project, never the base case; answers undefined when the source is missing. */
export async function duplicateScenario(
	sourceId: string,
	options: { name?: string; notes?: string; userId: string | null },
	knex: Knex = db()
): Promise<ScenarioRecord | undefined> {
	const source = await getScenarioById(sourceId, knex);
	if (!source) return undefined;
	const name = options.name ?? `${source.name} (copy)`.slice(0, 200);
	const id = await knex.transaction(async (trx) => {
		const document = { ...source.document, name };
		const [row] = await trx('scenarios')
			.insert({
				project_id: source.projectId,
				name,
				notes: options.notes ?? source.notes,
				document: JSON.stringify(document),
				placeholder_paths: JSON.stringify(source.placeholderPaths),
				schema_version: document.schemaVersion,
				revision: 1,
				is_base_case: false,
				created_by: options.userId,
				updated_by: options.userId
			})
			.returning('id');
		await insertRevision(trx, {
			scenarioId: row.id,
			revision: 1,
			name,
			document,
			sections: changedSections(null, document),
			summary: `Duplicated from "${source.name}" (revision ${source.revision})`,
			userId: options.userId
		});
		return row.id as string;
	});
	return getScenarioById(id, knex);
}

/** Makes a scenario its project's base case, taking the mark from whichever scenario had it. */
export async function markBaseCase(scenarioId: string, userId: string | null, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	const found = await knex.transaction(async (trx) => {
		const place = await trx('scenarios').select('project_id', 'archived_at', 'is_base_case').where({ id: scenarioId }).first();
		if (!place) return false;
		if (place.archived_at) throw new ArchivedScenarioError('make it the base case');
		if (place.is_base_case) return true;
		await lockProject(trx, place.project_id);
		await trx('scenarios')
			.where({ project_id: place.project_id, is_base_case: true })
			.update({ is_base_case: false, updated_at: trx.fn.now() });
		await trx('scenarios')
			.where({ id: scenarioId })
			.update({ is_base_case: true, updated_by: userId, updated_at: trx.fn.now() });
		return true;
	});
	return found ? getScenarioById(scenarioId, knex) : undefined;
}

/** Archives a scenario; an archived scenario is no longer the base case. Archiving twice keeps the first date. */
export async function archiveScenario(scenarioId: string, userId: string | null, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	await knex('scenarios')
		.where({ id: scenarioId })
		.whereNull('archived_at')
		.update({ archived_at: knex.fn.now(), is_base_case: false, updated_by: userId, updated_at: knex.fn.now() });
	return getScenarioById(scenarioId, knex);
}

export async function restoreScenario(scenarioId: string, userId: string | null, knex: Knex = db()): Promise<ScenarioRecord | undefined> {
	await knex('scenarios')
		.where({ id: scenarioId })
		.whereNotNull('archived_at')
		.update({ archived_at: null, updated_by: userId, updated_at: knex.fn.now() });
	return getScenarioById(scenarioId, knex);
}

/** Deletes a scenario for good, with its history; only an archived one. */
export async function deleteArchivedScenario(scenarioId: string, knex: Knex = db()): Promise<'deleted' | 'not-archived' | 'missing'> {
	const row = await knex('scenarios').select('archived_at').where({ id: scenarioId }).first();
	if (!row) return 'missing';
	if (!row.archived_at) return 'not-archived';
	await knex('scenarios').where({ id: scenarioId }).whereNotNull('archived_at').delete();
	return 'deleted';
}

export async function listScenarioRevisions(scenarioId: string, knex: Knex = db()): Promise<ScenarioRevision[]> {
	const rows = await knex('scenario_revisions')
		.leftJoin('users', 'users.id', 'scenario_revisions.changed_by')
		.select(
			'scenario_revisions.revision',
			'scenario_revisions.name',
			'scenario_revisions.changed_sections',
			'scenario_revisions.summary',
			'scenario_revisions.changed_at',
			'scenario_revisions.changed_by',
			'users.name as changed_by_name'
		)
		.where('scenario_revisions.scenario_id', scenarioId)
		.orderBy('scenario_revisions.revision', 'desc');
	return rows.map((row) => ({
		revision: row.revision,
		name: row.name,
		changedSections: row.changed_sections,
		summary: row.summary,
		changedAt: row.changed_at,
		changedBy: person(row.changed_by, row.changed_by_name)
	}));
}

export async function getScenarioRevisionDocument(
	scenarioId: string,
	revision: number,
	knex: Knex = db()
): Promise<ScenarioDocument | undefined> {
	const row = await knex('scenario_revisions').select('document').where({ scenario_id: scenarioId, revision }).first();
	return row?.document;
}
