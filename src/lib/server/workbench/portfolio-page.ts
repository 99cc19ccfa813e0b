/**
 * What the two portfolio pages load: one workspace's (`/app/w/[id]/portfolio`)
 * or every workspace's of the member (`/app/portfolio`, with a workspace
 * filter). Access goes through the access module; bad filters in the address
 * answer 400 naming each parameter.
 */
import { error } from '@sveltejs/kit';
import { authorize, requireUser, visibleWorkspaces } from '../auth/access';
import { portfolioSearch } from '../../portfolio/columns';
import { loadPortfolio, parsePortfolioQuery } from './portfolio';
import { currenciesOf, portfolioTotals } from './portfolio-table';

type PageEvent = Parameters<typeof visibleWorkspaces>[0];

function queryOf(event: PageEvent) {
	const parsed = parsePortfolioQuery(event.url.searchParams);
	if (!parsed.ok) error(400, `The portfolio filters need attention: ${parsed.issues.map((i) => i.message).join('; ')}.`);
	return parsed.query;
}

/**
 * The page's data. `workspaceId` fixes the workspace (the workspace page);
 * without it the page spans the member's workspaces, narrowed by `?workspaceId=`.
 */
export async function loadPortfolioPage(event: PageEvent, fixed: { workspaceId: string } | null) {
	requireUser(event);
	const fixedMembership = fixed ? (await authorize(event, fixed, 'viewer')).membership : null;
	const asked = queryOf(event);
	const query = fixedMembership ? { ...asked, workspaceId: fixedMembership.workspaceId } : asked;
	const everyWorkspace = fixedMembership ? [fixedMembership] : await visibleWorkspaces(event);
	const chosen =
		fixedMembership || query.workspaceId === undefined ? everyWorkspace : [(await authorize(event, { workspaceId: query.workspaceId }, 'viewer')).membership];
	const portfolio = await loadPortfolio(chosen, query);
	const filters = { technology: query.technology, status: query.status, workspaceId: fixedMembership ? undefined : query.workspaceId };
	const order = { sort: query.sort, dir: query.dir };
	const csvSearch = portfolioSearch({ ...filters, workspaceId: query.workspaceId }, order);
	return {
		rows: portfolio.rows,
		counts: portfolio.counts,
		totals: portfolioTotals(portfolio.rows),
		currencies: currenciesOf(portfolio.rows),
		filters,
		order,
		/** The workspace column and filter: only where the page spans the member's workspaces and none is chosen. */
		withWorkspace: fixedMembership === null && query.workspaceId === undefined,
		workspaceChoices: fixedMembership ? [] : everyWorkspace.map((w) => ({ id: w.workspaceId, name: w.workspaceName })),
		csvHref: `/api/v1/portfolio.csv${csvSearch.size > 0 ? `?${csvSearch}` : ''}`
	};
}

export type PortfolioPageData = Awaited<ReturnType<typeof loadPortfolioPage>>;
