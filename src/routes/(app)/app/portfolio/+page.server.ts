import { loadPortfolioPage } from '$lib/server/workbench/portfolio-page';
import type { PageServerLoad } from './$types';

/** The portfolio across every workspace the member belongs to (`?workspaceId=` narrows it to one). */
export const load: PageServerLoad = async (event) => ({ portfolio: await loadPortfolioPage(event, null) });
