/**
 * The portfolio table's columns: which figures it shows (labels, units and
 * precision come from the metric catalogue), which columns sort, and the
 * words for a project without figures. Plain data, safe in the browser.
 */
import { CURRENCY_PLACEHOLDER, figureDefinition, metricUnit, type CaseFigureKey, type MetricKey } from '../metrics/catalogue';

/** The engine metrics a portfolio row shows, in the order of the table. */
export const PORTFOLIO_METRIC_KEYS = [
	'netAepMWh',
	'capacityFactor',
	'lcoeReal',
	'equityIrr',
	'projectIrrPostTax',
	'npv',
	'minDscr'
] as const satisfies readonly MetricKey[];

/** Every figure column: the base case's size and cost, then its metrics. */
export const PORTFOLIO_FIGURE_KEYS = ['installedCapacityMW', 'capexRealTotal', ...PORTFOLIO_METRIC_KEYS] as const satisfies readonly (
	| MetricKey
	| CaseFigureKey
)[];
export type PortfolioFigureKey = (typeof PORTFOLIO_FIGURE_KEYS)[number];

export const PORTFOLIO_TEXT_KEYS = ['project', 'workspace', 'technology', 'status', 'baseCase'] as const;
export type PortfolioTextKey = (typeof PORTFOLIO_TEXT_KEYS)[number];

export const PORTFOLIO_SORT_KEYS = [...PORTFOLIO_TEXT_KEYS, ...PORTFOLIO_FIGURE_KEYS] as const;
export type PortfolioSortKey = (typeof PORTFOLIO_SORT_KEYS)[number];

export const projectStatuses = ['live', 'archived'] as const;
export type ProjectStatus = (typeof projectStatuses)[number];

export const sortDirections = ['asc', 'desc'] as const;
export type SortDirection = (typeof sortDirections)[number];

/** Why a row has no figures. */
export const missingReasons = ['no-base-case', 'not-evaluated'] as const;
export type MissingReason = (typeof missingReasons)[number];

export const missingReasonWords: Readonly<Record<MissingReason, string>> = {
	'no-base-case': 'no base case yet',
	'not-evaluated': 'not evaluated by the current engine yet'
};

const textLabels: Readonly<Record<PortfolioTextKey, string>> = {
	project: 'Project',
	workspace: 'Workspace',
	technology: 'Technology',
	status: 'Status',
	baseCase: 'Base case'
};

export function isFigureColumn(key: PortfolioSortKey): key is PortfolioFigureKey {
	return (PORTFOLIO_FIGURE_KEYS as readonly string[]).includes(key);
}

/** Whether a figure is an amount of money (its unit holds the currency): such figures are never added across currencies. */
export function isMoneyFigure(key: PortfolioFigureKey): boolean {
	return figureDefinition(key).unit.includes(CURRENCY_PLACEHOLDER);
}

export interface PortfolioColumn {
	key: PortfolioSortKey;
	label: string;
	/** The figure's unit with `{currency}` in place (see columnUnit); null for text columns. */
	unit: string | null;
	numeric: boolean;
}

/** The table's columns; the workspace column only where the table spans several workspaces. */
export function portfolioColumns(options: { withWorkspace: boolean }): PortfolioColumn[] {
	const text = PORTFOLIO_TEXT_KEYS.filter((key) => options.withWorkspace || key !== 'workspace').map(
		(key): PortfolioColumn => ({ key, label: textLabels[key], unit: null, numeric: false })
	);
	const figures = PORTFOLIO_FIGURE_KEYS.map((key): PortfolioColumn => {
		const definition = figureDefinition(key);
		return { key, label: definition.label, unit: definition.unit, numeric: true };
	});
	return [...text, ...figures];
}

/**
 * A column's unit for a table whose money may be in several currencies: the
 * one currency when all rows share it, else the word "currency" (each row
 * then names its own).
 */
export function columnUnit(key: PortfolioFigureKey, currencies: readonly string[]): string {
	return metricUnit(key, currencies.length === 1 ? currencies[0] : 'currency');
}

/** A figure column's heading with its unit and basis, for a file: "<label> (EUR/MWh; real, COD-year money)". */
export function figureHeading(key: PortfolioFigureKey, currencies: readonly string[]): string {
	const { label, basis } = figureDefinition(key);
	const unit = columnUnit(key, currencies);
	return basis === '' ? `${label} (${unit})` : `${label} (${unit}; ${basis})`;
}

export interface PortfolioFilters {
	technology?: string;
	status?: ProjectStatus;
	workspaceId?: string;
}

export interface PortfolioOrder {
	sort: PortfolioSortKey;
	dir: SortDirection;
}

/** The address's query for filters and order, left out where they are the defaults (empty filter, project ascending). */
export function portfolioSearch(filters: PortfolioFilters, order: PortfolioOrder): URLSearchParams {
	const search = new URLSearchParams();
	if (filters.workspaceId) search.set('workspaceId', filters.workspaceId);
	if (filters.technology) search.set('technology', filters.technology);
	if (filters.status) search.set('status', filters.status);
	if (order.sort !== 'project' || order.dir !== 'asc') {
		search.set('sort', order.sort);
		search.set('dir', order.dir);
	}
	return search;
}

/** The order a column's heading link asks for: the other direction when it already sorts, else ascending. */
export function nextOrder(current: PortfolioOrder, key: PortfolioSortKey): PortfolioOrder {
	if (current.sort === key) return { sort: key, dir: current.dir === 'asc' ? 'desc' : 'asc' };
	return { sort: key, dir: 'asc' };
}
