import { loadPortfolioPage } from '$lib/server/workbench/portfolio-page';
import type { PageServerLoad } from './$types';

/** One workspace's portfolio: every project, live and archived, with its base case's key figures. */
export const load: PageServerLoad = async (event) => ({ portfolio: await loadPortfolioPage(event, { workspaceId: event.params.workspaceId }) });
