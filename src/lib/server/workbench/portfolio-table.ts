/**
 * Ordering and totals of the portfolio table. Pure: rows in, rows out.
 *
 * Order: rows without the figure (no result, or the metric undefined) come
 * last in either direction; money figures are ordered within their currency
 * (currencies A to Z, then the amount), since amounts in two currencies do
 * not compare; ties go by project name, then id, so the order is stable.
 */
import { Decimal } from '../engine/decimal';
import { technologyLabels } from '../../technology';
import { isFigureColumn, isMoneyFigure, type PortfolioSortKey, type SortDirection } from '../../portfolio/columns';
import type { PortfolioRow } from '../../schemas/portfolio';

const collator = new Intl.Collator('en', { sensitivity: 'base', numeric: true });
const statusOrder = { live: 0, archived: 1 } as const;

type Comparable = string | number | Decimal | null;

/** A text column's value as the page and the CSV show it (null for figure columns). */
export function portfolioText(row: PortfolioRow, key: PortfolioSortKey): string | null {
	switch (key) {
		case 'project':
			return row.projectName;
		case 'workspace':
			return row.workspaceName;
		case 'technology':
			return technologyLabels[row.technology];
		case 'status':
			return row.status;
		case 'baseCase':
			return row.baseCase?.name ?? null;
		default:
			return null;
	}
}

function sortValue(row: PortfolioRow, key: PortfolioSortKey): Comparable {
	if (isFigureColumn(key)) {
		const value = row.figures[key];
		return value === null ? null : new Decimal(value);
	}
	// Live before archived, not by the word.
	return key === 'status' ? statusOrder[row.status] : portfolioText(row, key);
}

function compareValues(a: Exclude<Comparable, null>, b: Exclude<Comparable, null>): number {
	if (a instanceof Decimal && b instanceof Decimal) return a.comparedTo(b);
	if (typeof a === 'number' && typeof b === 'number') return a - b;
	return collator.compare(String(a), String(b));
}

function byProject(a: PortfolioRow, b: PortfolioRow): number {
	return collator.compare(a.projectName, b.projectName) || (a.projectId < b.projectId ? -1 : a.projectId > b.projectId ? 1 : 0);
}

/** The rows in the order asked for (a new array). */
export function sortPortfolio(rows: readonly PortfolioRow[], key: PortfolioSortKey, dir: SortDirection): PortfolioRow[] {
	const sign = dir === 'asc' ? 1 : -1;
	const byCurrency = isFigureColumn(key) && isMoneyFigure(key);
	const keyed = rows.map((row) => ({ row, value: sortValue(row, key) }));
	keyed.sort((a, b) => {
		if (a.value === null || b.value === null) {
			if (a.value !== b.value) return a.value === null ? 1 : -1;
			return byProject(a.row, b.row);
		}
		if (byCurrency) {
			const currency = collator.compare(a.row.currency, b.row.currency);
			if (currency !== 0) return currency;
		}
		return sign * compareValues(a.value, b.value) || byProject(a.row, b.row);
	});
	return keyed.map((k) => k.row);
}

export interface PortfolioTotals {
	/** Sum over the rows with figures, in MW (capacity adds across currencies). */
	installedCapacityMW: string;
	/** Capex summed per currency, never across: currencies A to Z. */
	capexByCurrency: { currency: string; total: string }[];
}

/** Totals of the rows with figures: capacity in MW, capex per currency (decimal.js, exact). */
export function portfolioTotals(rows: readonly PortfolioRow[]): PortfolioTotals {
	let capacity = new Decimal(0);
	const capex = new Map<string, Decimal>();
	for (const row of rows) {
		if (row.missing !== null) continue;
		if (row.figures.installedCapacityMW !== null) capacity = capacity.plus(row.figures.installedCapacityMW);
		if (row.figures.capexRealTotal !== null) capex.set(row.currency, (capex.get(row.currency) ?? new Decimal(0)).plus(row.figures.capexRealTotal));
	}
	return {
		installedCapacityMW: capacity.toFixed(),
		capexByCurrency: [...capex.entries()].sort(([a], [b]) => collator.compare(a, b)).map(([currency, total]) => ({ currency, total: total.toFixed() }))
	};
}

/** The currencies of the rows with figures, A to Z. */
export function currenciesOf(rows: readonly PortfolioRow[]): string[] {
	return [...new Set(rows.filter((r) => r.missing === null).map((r) => r.currency))].sort(collator.compare);
}
