/**
 * The portfolio: the query that filters and orders it (pages and API alike),
 * a row as pages receive it (decimal strings), and the API's answer (numbers).
 * Browser-safe.
 */
import { z } from 'zod';
import {
	missingReasons,
	PORTFOLIO_FIGURE_KEYS,
	PORTFOLIO_METRIC_KEYS,
	PORTFOLIO_SORT_KEYS,
	projectStatuses,
	sortDirections,
	type PortfolioFigureKey
} from '../portfolio/columns';
import { decimalStringSchema, workspaceJsonSchema } from './api-responses';
import { technologies } from './workbench';

/** Each query parameter on its own, for the OpenAPI description; an empty value counts as left out. */
export const portfolioQueryFields = {
	workspaceId: z.guid().describe("One of your workspaces; left out, every workspace you belong to (an API token: its own workspace)"),
	technology: z.enum(technologies).describe('Only projects of this technology'),
	status: z.enum(projectStatuses).describe('live or archived projects only; left out, both'),
	sort: z.enum(PORTFOLIO_SORT_KEYS).default('project').describe('The column to order by (project when left out); rows without the figure come last either way'),
	dir: z.enum(sortDirections).default('asc').describe('asc or desc (asc when left out)')
};

export const portfolioQuerySchema = z.object({
	workspaceId: portfolioQueryFields.workspaceId.optional(),
	technology: portfolioQueryFields.technology.optional(),
	status: portfolioQueryFields.status.optional(),
	sort: portfolioQueryFields.sort,
	dir: portfolioQueryFields.dir
});
export type PortfolioQuery = z.output<typeof portfolioQuerySchema>;

const figuresOf = <T extends z.ZodType>(value: T) =>
	z.object(Object.fromEntries(PORTFOLIO_FIGURE_KEYS.map((key) => [key, value])) as Record<PortfolioFigureKey, T>);

const rowBase = z.object({
	projectId: z.uuid(),
	projectName: z.string(),
	workspaceId: z.uuid(),
	workspaceName: z.string(),
	technology: z.enum(technologies),
	status: z.enum(projectStatuses),
	baseCase: z.object({ id: z.uuid(), name: z.string() }).nullable().describe('The live scenario marked as the base case; null when there is none'),
	currency: z.string().describe("The currency of the money figures: the base case result's, else the project's"),
	missing: z
		.enum(missingReasons)
		.nullable()
		.describe('Why the row has no figures: no-base-case, or not-evaluated (no stored result of the current engine); null when it has them'),
	reason: z.string().nullable().describe('The same in words, as the pages show it')
});

/** A row as the pages receive it: figures as decimal strings in the engine's units, capacity in MW. */
export const portfolioRowSchema = rowBase.extend({ figures: figuresOf(decimalStringSchema.nullable()) });
export type PortfolioRow = z.output<typeof portfolioRowSchema>;

const apiNumber = z.number().nullable();

export const portfolioApiRowSchema = rowBase.extend({
	installedCapacityMW: apiNumber.describe("The base case's installed capacity in MW"),
	capexRealTotal: apiNumber.describe('Capex total in the currency, real money of the COD year, with contingency, before grants'),
	metrics: z
		.object(Object.fromEntries(PORTFOLIO_METRIC_KEYS.map((key) => [key, apiNumber])) as Record<(typeof PORTFOLIO_METRIC_KEYS)[number], typeof apiNumber>)
		.describe('Key metrics of the stored base-case result as numbers, in the engine’s units (rates and the capacity factor as fractions, money in the row’s currency); null when undefined or missing')
});

export const portfolioResponseSchema = z.object({
	workspaces: z.array(workspaceJsonSchema).describe('The workspaces the rows come from'),
	query: z.object({
		workspaceId: z.uuid().nullable(),
		technology: z.enum(technologies).nullable(),
		status: z.enum(projectStatuses).nullable(),
		sort: z.enum(PORTFOLIO_SORT_KEYS),
		dir: z.enum(sortDirections)
	}),
	counts: z.object({ projects: z.int(), withResults: z.int() }),
	rows: z.array(portfolioApiRowSchema).describe('Filtered and ordered as asked; money is never added up across currencies')
});
