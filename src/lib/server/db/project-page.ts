/**
 * What a project page shows, in one statement: the project, its live
 * scenarios with their stored key figures, and its uploads. Each query is a
 * round trip, and on a small machine the round trips, not PostgreSQL's work,
 * are most of a page view's cost; the lists travel as JSON arrays.
 */
import type { Knex } from 'knex';
import { db } from './knex';
import { projectReads } from './cached-reads';
import { projectColumns, type ProjectRow } from './projects';
import { liveScenariosWithStoredMetricsQuery, scenarioWithStoredMetricsFromJson, type ScenarioWithStoredMetrics } from './scenarios';
import { uploadSummaryFromJson, uploadsInProjectQuery, type UploadSummary } from './uploads';

export interface ProjectPageRead {
	project: ProjectRow;
	scenarios: ScenarioWithStoredMetrics[];
	uploads: UploadSummary[];
}

/** The statement, built once per database handle and engine version: building it costs more than running it. */
const statements = new WeakMap<Knex, Map<string, { sql: string; bindings: readonly Knex.Value[] }>>();
const PROJECT_ID_SLOT = '00000000-0000-0000-0000-000000000000';

function statement(knex: Knex, engineVersion: string) {
	let built = statements.get(knex);
	if (!built) statements.set(knex, (built = new Map()));
	let compiled = built.get(engineVersion);
	if (!compiled) {
		const projectRef = knex.ref('projects.id');
		// json_agg keeps the order of a sorted subquery (it reads the subquery's rows in order).
		compiled = knex('projects')
			.select(projectColumns.map((c) => `projects.${c}`))
			.select(
				knex.raw(`coalesce((select json_agg(s) from (?) s), '[]'::json) as page_scenarios`, [liveScenariosWithStoredMetricsQuery(projectRef, engineVersion, knex)]),
				knex.raw(`coalesce((select json_agg(u) from (?) u), '[]'::json) as page_uploads`, [uploadsInProjectQuery(projectRef, knex)])
			)
			.where('projects.id', PROJECT_ID_SLOT)
			.toSQL();
		built.set(engineVersion, compiled);
	}
	return compiled;
}

export async function readProjectPage(projectId: string, engineVersion: string, knex: Knex = db()): Promise<ProjectPageRead | undefined> {
	const { sql, bindings } = statement(knex, engineVersion);
	const result = await knex.raw(sql, bindings.map((value) => (value === PROJECT_ID_SLOT ? projectId : value)));
	const row = result.rows[0];
	if (!row) return undefined;
	const { page_scenarios: scenarios, page_uploads: uploads, ...project } = row as ProjectRow & {
		page_scenarios: Parameters<typeof scenarioWithStoredMetricsFromJson>[0][];
		page_uploads: Parameters<typeof uploadSummaryFromJson>[0][];
	};
	return {
		project: project as ProjectRow,
		scenarios: scenarios.map(scenarioWithStoredMetricsFromJson),
		uploads: uploads.map(uploadSummaryFromJson)
	};
}

/** readProjectPage through the process's kept reads (db/cached-reads.ts): a project page seen again costs no query until the project changes. */
export function readProjectPageKept(projectId: string, engineVersion: string): Promise<ProjectPageRead | undefined> {
	return projectReads.read(`project-page:${engineVersion}:${projectId}`, () => readProjectPage(projectId, engineVersion), (read) => read.project.id);
}
