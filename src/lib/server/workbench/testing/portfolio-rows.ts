/** Portfolio rows for unit tests: invented projects, figures given as [key, decimal string] pairs. */
import { PORTFOLIO_FIGURE_KEYS, type PortfolioFigureKey } from '../../../portfolio/columns';
import type { PortfolioRow } from '../../../schemas/portfolio';

let counter = 0;

/** A row with figures (every figure null unless given), or without any when `missing` is set. */
export function portfolioRow(
	overrides: Partial<Omit<PortfolioRow, 'figures'>> = {},
	figures: [PortfolioFigureKey, string | null][] = []
): PortfolioRow {
	counter += 1;
	const id = `00000000-0000-4000-8000-${String(counter).padStart(12, '0')}`;
	const missing = overrides.missing ?? null;
	return {
		projectId: id,
		projectName: `Project ${counter}`,
		workspaceId: '00000000-0000-4000-8000-0000000000aa',
		workspaceName: 'Fennick Advisory',
		technology: 'tidal-stream',
		status: 'live',
		baseCase: missing === 'no-base-case' ? null : { id: `10000000-0000-4000-8000-${String(counter).padStart(12, '0')}`, name: 'Base case' },
		currency: 'EUR',
		missing,
		reason: null,
		...overrides,
		figures: { ...(Object.fromEntries(PORTFOLIO_FIGURE_KEYS.map((key) => [key, null])) as PortfolioRow['figures']), ...Object.fromEntries(figures) }
	};
}
