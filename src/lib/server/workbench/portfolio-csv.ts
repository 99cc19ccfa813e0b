/**
 * The portfolio table as a CSV file: the rows as filtered and ordered on the
 * page, each figure rounded as the page shows it in its display unit, units in
 * the headers, the currency of each row beside its money, and the cautions
 * after a blank line (the one CSV writer of the exports).
 */
import { CAUTIONS } from '../../cautions';
import { roundedMetric } from '../../metrics/format';
import { figureHeading, PORTFOLIO_FIGURE_KEYS, portfolioColumns } from '../../portfolio/columns';
import type { PortfolioRow } from '../../schemas/portfolio';
import { tableToCsv } from './export-csv';
import type { ExportTable } from './export-tables';
import { currenciesOf, portfolioText } from './portfolio-table';

export function portfolioCsvTable(rows: readonly PortfolioRow[], options: { withWorkspace: boolean }): ExportTable {
	const currencies = currenciesOf(rows);
	const textColumns = portfolioColumns(options).filter((c) => !c.numeric);
	return {
		title: 'Portfolio',
		headers: [...textColumns.map((c) => c.label), 'Currency', ...PORTFOLIO_FIGURE_KEYS.map((key) => figureHeading(key, currencies)), 'Why no figures'],
		rows: rows.map((row) => [
			...textColumns.map((c) => portfolioText(row, c.key)),
			row.missing === null ? row.currency : null,
			...PORTFOLIO_FIGURE_KEYS.map((key) => roundedMetric(key, row.figures[key])),
			row.reason
		]),
		numeric: [...textColumns.map(() => false), false, ...PORTFOLIO_FIGURE_KEYS.map(() => true), false]
	};
}

/** The whole file: table, blank line, cautions. */
export function portfolioCsv(rows: readonly PortfolioRow[], options: { withWorkspace: boolean }): string {
	return tableToCsv(portfolioCsvTable(rows, options), CAUTIONS);
}
