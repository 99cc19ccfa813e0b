import { json } from '@sveltejs/kit';
import { openApiDocumentFor } from '$lib/server/api-docs/document';
import type { RequestHandler } from './$types';

/** The OpenAPI 3.1 description of /api/v1. Public: it describes the API and holds no data. */
export const GET: RequestHandler = async ({ url }) => {
	return json(openApiDocumentFor(url.origin), { headers: { 'cache-control': 'public, max-age=300' } });
};
