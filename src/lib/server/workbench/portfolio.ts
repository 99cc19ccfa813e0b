/**
 * The portfolio: every project of the workspaces a caller may see, with its
 * base case's stored key figures, filtered and ordered as the address asks.
 * Who may see which workspace is decided by the access module alone; figures
 * come from the store only (a read never runs the engine).
 */
import type { Knex } from 'knex';
import { authorize, visibleWorkspaces } from '../auth/access';
import type { WorkspaceMembership } from '../db/memberships';
import { listPortfolioProjects, type PortfolioRecord } from '../db/portfolio';
import { dec } from '../engine/decimal';
import { decimalString } from '../engine/evaluate';
import { ENGINE_VERSION } from '../engine/version';
import type { ApiIssue } from '../api';
import { ApiProblem } from './api-route';
import { sortPortfolio } from './portfolio-table';
import { missingReasonWords, PORTFOLIO_METRIC_KEYS, type MissingReason } from '../../portfolio/columns';
import { portfolioQuerySchema, type PortfolioQuery, type PortfolioRow } from '../../schemas/portfolio';

const KILOWATTS_PER_MEGAWATT = 1000;

/**
 * Installed capacity in MW from the engine's kW: P_MW = P_kW / 1000, exactly
 * (decimal.js), as a decimal string; null stays null.
 */
export function kilowattsToMegawatts(kilowatts: string | null): string | null {
	return kilowatts === null ? null : decimalString(dec(kilowatts).div(KILOWATTS_PER_MEGAWATT));
}

function missingOf(record: PortfolioRecord): MissingReason | null {
	if (record.baseCase === null) return 'no-base-case';
	if (record.stored === null) return 'not-evaluated';
	return null;
}

/** One table row from what the query read: the figures of the stored result, or the reason there are none. */
export function portfolioRowOf(record: PortfolioRecord): PortfolioRow {
	const missing = missingOf(record);
	const stored = missing === null ? record.stored : null;
	const metric = (key: (typeof PORTFOLIO_METRIC_KEYS)[number]) => stored?.metrics[key] ?? null;
	return {
		projectId: record.projectId,
		projectName: record.projectName,
		workspaceId: record.workspaceId,
		workspaceName: record.workspaceName,
		technology: record.technology,
		status: record.archivedAt === null ? 'live' : 'archived',
		baseCase: record.baseCase && { id: record.baseCase.id, name: record.baseCase.name },
		currency: stored?.currency ?? record.projectCurrency,
		missing,
		reason: missing && missingReasonWords[missing],
		figures: {
			installedCapacityMW: kilowattsToMegawatts(stored?.installedCapacityKW ?? null),
			capexRealTotal: stored?.capexRealTotal ?? null,
			...(Object.fromEntries(PORTFOLIO_METRIC_KEYS.map((key) => [key, metric(key)])) as Record<(typeof PORTFOLIO_METRIC_KEYS)[number], string | null>)
		}
	};
}

export type PortfolioQueryResult = { ok: true; query: PortfolioQuery } | { ok: false; issues: ApiIssue[] };

/** The filters and order in an address; an empty value (a select box's "all") counts as left out, unknown parameters are ignored. */
export function parsePortfolioQuery(search: URLSearchParams): PortfolioQueryResult {
	const given: Record<string, string> = {};
	for (const key of Object.keys(portfolioQuerySchema.shape)) {
		const value = search.get(key);
		if (value !== null && value !== '') given[key] = value;
	}
	const parsed = portfolioQuerySchema.safeParse(given);
	if (parsed.success) return { ok: true, query: parsed.data };
	return {
		ok: false,
		issues: parsed.error.issues.map((issue) => {
			const field = String(issue.path[0] ?? '(query)');
			const allowed = issue.code === 'invalid_value' ? `: one of ${issue.values.map(String).join(', ')}` : '';
			return { path: field, message: `${field} "${given[field] ?? ''}" is not accepted${allowed}` };
		})
	};
}

/** The query of an API request; bad parameters answer 422 naming each one. */
export function readPortfolioQuery(url: URL): PortfolioQuery {
	const result = parsePortfolioQuery(url.searchParams);
	if (!result.ok) throw new ApiProblem(422, 'The portfolio filters need attention.', result.issues);
	return result.query;
}

type AccessEvent = Parameters<typeof visibleWorkspaces>[0];

/**
 * The workspaces a portfolio spans: the one asked for (the caller must be a
 * member, viewer or more; a token only its own), else every workspace the
 * caller may see.
 */
export async function portfolioWorkspaces(event: AccessEvent, workspaceId: string | undefined): Promise<WorkspaceMembership[]> {
	if (workspaceId !== undefined) return [(await authorize(event, { workspaceId }, 'viewer')).membership];
	return visibleWorkspaces(event);
}

export interface Portfolio {
	workspaces: { id: string; name: string; role: WorkspaceMembership['role'] }[];
	query: PortfolioQuery;
	rows: PortfolioRow[];
	counts: { projects: number; withResults: number };
}

/** The portfolio of the given workspaces (already authorized), filtered and ordered by the query. */
export async function loadPortfolio(
	workspaces: readonly Pick<WorkspaceMembership, 'workspaceId' | 'workspaceName' | 'role'>[],
	query: PortfolioQuery,
	options: { knex?: Knex; engineVersion?: string } = {}
): Promise<Portfolio> {
	const records = await listPortfolioProjects(
		workspaces.map((w) => w.workspaceId),
		options.engineVersion ?? ENGINE_VERSION,
		{ technology: query.technology, status: query.status },
		options.knex
	);
	const rows = sortPortfolio(records.map(portfolioRowOf), query.sort, query.dir);
	return {
		workspaces: workspaces.map((w) => ({ id: w.workspaceId, name: w.workspaceName, role: w.role })),
		query,
		rows,
		counts: { projects: rows.length, withResults: rows.filter((r) => r.missing === null).length }
	};
}

const asNumber = (value: string | null) => (value === null ? null : Number(value));

/** A row as the API answers it: figures as numbers (or null) in the engine's units, beside the currency. */
export function portfolioRowJson(row: PortfolioRow) {
	const { figures, ...rest } = row;
	return {
		...rest,
		installedCapacityMW: asNumber(figures.installedCapacityMW),
		capexRealTotal: asNumber(figures.capexRealTotal),
		metrics: Object.fromEntries(PORTFOLIO_METRIC_KEYS.map((key) => [key, asNumber(figures[key])]))
	};
}

/** The API's answer: the workspaces, the query as understood, the counts and the rows. */
export function portfolioJson(portfolio: Portfolio) {
	const { query } = portfolio;
	return {
		workspaces: portfolio.workspaces,
		query: { workspaceId: query.workspaceId ?? null, technology: query.technology ?? null, status: query.status ?? null, sort: query.sort, dir: query.dir },
		counts: portfolio.counts,
		rows: portfolio.rows.map(portfolioRowJson)
	};
}
