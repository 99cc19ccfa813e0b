import { requireUser } from '$lib/server/auth/access';
import { openApiDocumentFor } from '$lib/server/api-docs/document';
import { apiOperations } from '$lib/server/api-docs/operations';
import { apiReference } from '$lib/server/api-docs/reference';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	const document = openApiDocumentFor(event.url.origin);
	return {
		origin: event.url.origin,
		version: document.info.version,
		documentHref: '/api/v1/openapi.json',
		tags: apiReference(apiOperations, document)
	};
};
