import { requireUser } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { loadPortfolio, portfolioWorkspaces, readPortfolioQuery } from '$lib/server/workbench/portfolio';
import { portfolioCsv } from '$lib/server/workbench/portfolio-csv';
import type { RequestHandler } from './$types';

/** The portfolio table as a CSV file, filtered and ordered by the same query as GET /api/v1/portfolio. */
export const GET: RequestHandler = apiRoute(async (event) => {
	requireUser(event);
	const query = readPortfolioQuery(event.url);
	const workspaces = await portfolioWorkspaces(event, query.workspaceId);
	const portfolio = await loadPortfolio(workspaces, query);
	const body = new TextEncoder().encode(portfolioCsv(portfolio.rows, { withWorkspace: query.workspaceId === undefined }));
	return new Response(body, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="portfolio.csv"',
			'content-length': String(body.byteLength)
		}
	});
});
