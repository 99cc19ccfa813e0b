import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/access';
import { apiRoute } from '$lib/server/workbench/api-route';
import { loadPortfolio, portfolioJson, portfolioWorkspaces, readPortfolioQuery } from '$lib/server/workbench/portfolio';
import type { RequestHandler } from './$types';

/** Every project of your workspaces (or of `?workspaceId=`) with its base case's stored key figures; `?technology=`, `?status=`, `?sort=`, `?dir=`. */
export const GET: RequestHandler = apiRoute(async (event) => {
	requireUser(event);
	const query = readPortfolioQuery(event.url);
	const workspaces = await portfolioWorkspaces(event, query.workspaceId);
	return json(portfolioJson(await loadPortfolio(workspaces, query)));
});
