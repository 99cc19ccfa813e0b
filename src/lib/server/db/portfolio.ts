/**
 * The portfolio's one query: every project of the given workspaces, live and
 * archived, with its workspace's name, its base case (the live scenario
 * marked so) and that base case's stored result for the current revision and
 * engine version, read from the result's own columns (never the whole result).
 */
import type { Knex } from 'knex';
import { db } from './knex';
import type { EngineResult } from '../engine/evaluate';
import type { ProjectRow } from './projects';

export interface PortfolioRecord {
	projectId: string;
	projectName: string;
	workspaceId: string;
	workspaceName: string;
	technology: ProjectRow['technology'];
	projectCurrency: string;
	archivedAt: Date | null;
	baseCase: { id: string; name: string; revision: number } | null;
	/** The base case's stored result of this engine version for its current revision; null when none. */
	stored: {
		metrics: EngineResult['metrics'];
		currency: string;
		installedCapacityKW: string | null;
		capexRealTotal: string | null;
	} | null;
}

export interface PortfolioFilter {
	technology?: ProjectRow['technology'];
	status?: 'live' | 'archived';
}

interface DbRow {
	project_id: string;
	project_name: string;
	workspace_id: string;
	workspace_name: string;
	technology: ProjectRow['technology'];
	project_currency: string;
	archived_at: Date | null;
	base_case_id: string | null;
	base_case_name: string | null;
	base_case_revision: number | null;
	result_scenario_id: string | null;
	metrics: EngineResult['metrics'] | null;
	result_currency: string | null;
	installed_capacity_kw: string | null;
	capex_real_total: string | null;
}

function toRecord(row: DbRow): PortfolioRecord {
	return {
		projectId: row.project_id,
		projectName: row.project_name,
		workspaceId: row.workspace_id,
		workspaceName: row.workspace_name,
		technology: row.technology,
		projectCurrency: row.project_currency,
		archivedAt: row.archived_at,
		baseCase: row.base_case_id === null ? null : { id: row.base_case_id, name: row.base_case_name ?? '', revision: row.base_case_revision ?? 0 },
		stored:
			row.result_scenario_id === null || row.metrics === null
				? null
				: {
						metrics: row.metrics,
						currency: row.result_currency ?? row.project_currency,
						installedCapacityKW: row.installed_capacity_kw,
						capexRealTotal: row.capex_real_total
					}
	};
}

/** Every project of the workspaces (filtered), by workspace name, project name and id; one query however many projects. */
export async function listPortfolioProjects(
	workspaceIds: readonly string[],
	engineVersion: string,
	filter: PortfolioFilter = {},
	knex: Knex = db()
): Promise<PortfolioRecord[]> {
	if (workspaceIds.length === 0) return [];
	const query = knex('projects')
		.join('workspaces', 'workspaces.id', 'projects.workspace_id')
		.leftJoin('scenarios as base', function () {
			this.on('base.project_id', '=', 'projects.id').andOnVal('base.is_base_case', '=', true).andOnNull('base.archived_at');
		})
		.leftJoin('scenario_results as stored', function () {
			this.on('stored.scenario_id', '=', 'base.id').andOn('stored.revision', '=', 'base.revision').andOnVal('stored.engine_version', '=', engineVersion);
		})
		.select(
			'projects.id as project_id',
			'projects.name as project_name',
			'projects.workspace_id',
			'workspaces.name as workspace_name',
			'projects.technology',
			'projects.currency as project_currency',
			'projects.archived_at',
			'base.id as base_case_id',
			'base.name as base_case_name',
			'base.revision as base_case_revision',
			'stored.scenario_id as result_scenario_id',
			'stored.metrics',
			'stored.currency as result_currency',
			'stored.installed_capacity_kw',
			'stored.capex_real_total'
		)
		.whereIn('projects.workspace_id', workspaceIds);
	if (filter.technology) query.where('projects.technology', filter.technology);
	if (filter.status === 'live') query.whereNull('projects.archived_at');
	if (filter.status === 'archived') query.whereNotNull('projects.archived_at');
	const rows: DbRow[] = await query.orderBy([{ column: 'workspaces.name' }, { column: 'projects.name' }, { column: 'projects.id' }]);
	return rows.map(toRecord);
}
