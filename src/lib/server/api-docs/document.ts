/**
 * This build's OpenAPI document, built on first use (it changes only with a
 * new build); only the server address follows the request.
 */
import { version } from '../../../../package.json';
import { SESSION_COOKIE } from '../auth/session';
import { buildOpenApiDocument, type OpenApiDocument } from './openapi';
import { apiOperations } from './operations';

let built: OpenApiDocument | undefined;

export function openApiDocumentFor(origin: string): OpenApiDocument {
	built ??= buildOpenApiDocument(apiOperations, { origin, version, sessionCookie: SESSION_COOKIE });
	return { ...built, servers: [{ url: origin }] };
}
