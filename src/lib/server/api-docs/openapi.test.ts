import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from './openapi';
import { apiOperations, apiTags, errorStatusesOf, httpMethods, pathPlaceholders, type ApiOperation } from './operations';

const routesRoot = fileURLToPath(new URL('../../../routes/api/v1', import.meta.url));
const document = buildOpenApiDocument(apiOperations, { origin: 'https://tidewright.example', version: '9.9.9', sessionCookie: 'tw_session' });

interface RouteHandler {
	key: string;
	/** The source of this one exported handler, up to the next export. */
	source: string;
}

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) return serverFiles(path);
		return entry.name === '+server.ts' ? [path] : [];
	});
}

/** `projects/[projectId]/+server.ts` -> `/api/v1/projects/{projectId}`. */
function apiPathOf(file: string): string {
	const folder = relative(routesRoot, file).split(sep).slice(0, -1);
	return ['/api/v1', ...folder.map((part) => part.replace(/^\[(.+)\]$/, '{$1}'))].join('/');
}

/** Every handler the route files export, read from their source so that a new route without an entry fails. */
function routeHandlers(): RouteHandler[] {
	return serverFiles(routesRoot).flatMap((file) => {
		const text = readFileSync(file, 'utf8');
		const exports = [...text.matchAll(/^export\s+(?:const|async\s+function|function)\s+([A-Z]+)\b/gm)];
		return exports
			.filter((m) => (httpMethods as readonly string[]).includes(m[1]))
			.map((m, i, all) => {
				const next = text.indexOf('\nexport ', m.index + 1);
				const end = i + 1 < all.length ? all[i + 1].index : next === -1 ? text.length : next;
				return { key: `${m[1]} ${apiPathOf(file)}`, source: text.slice(m.index, end) };
			});
	});
}

const keyOf = (op: ApiOperation) => `${op.method} ${op.path}`;

/** `#/components/schemas/Project` -> the value it points at, or undefined. */
function resolvePointer(root: unknown, ref: string): unknown {
	return ref
		.slice(2)
		.split('/')
		.map((part) => part.replace(/~1/g, '/').replace(/~0/g, '~'))
		.reduce<unknown>((node, part) => (node !== null && typeof node === 'object' ? (node as Record<string, unknown>)[part] : undefined), root);
}

function allRefs(node: unknown, found: string[] = []): string[] {
	if (Array.isArray(node)) node.forEach((item) => allRefs(item, found));
	else if (node !== null && typeof node === 'object') {
		for (const [key, value] of Object.entries(node)) {
			if (key === '$ref' && typeof value === 'string') found.push(value);
			else allRefs(value, found);
		}
	}
	return found;
}

describe('buildOpenApiDocument', () => {
	it('declares OpenAPI 3.1.0 with the title, version and server it was given', () => {
		expect(document.openapi).toBe('3.1.0');
		expect(document.info.title).toBe('Tidewright API');
		expect(document.info.version).toBe('9.9.9');
		expect(document.servers).toEqual([{ url: 'https://tidewright.example' }]);
	});

	it('documents every handler under src/routes/api/v1 once, and nothing that has no route', () => {
		const handlers = routeHandlers().map((h) => h.key).sort();
		const documented = apiOperations.map(keyOf).sort();
		expect(handlers.length).toBeGreaterThan(20);
		expect(documented).toEqual(handlers);
		expect(new Set(documented).size).toBe(documented.length);
	});

	it('gives every operation its own operationId', () => {
		const ids = apiOperations.map((op) => op.operationId);
		expect(new Set(ids).size).toBe(ids.length);
		expect(Object.values(document.paths).flatMap((item) => Object.values(item).map((op) => op.operationId)).sort()).toEqual([...ids].sort());
	});

	it('states a request body exactly where the route reads one, optional where the route allows an empty body', () => {
		const byKey = new Map(apiOperations.map((op) => [keyOf(op), op]));
		for (const handler of routeHandlers()) {
			const op = byKey.get(handler.key)!;
			const readsBody = /validateBody\(|readUploadForm\(|request\.(json|formData)\(/.test(handler.source);
			expect({ route: handler.key, body: op.requestBody !== undefined }).toEqual({ route: handler.key, body: readsBody });
			if (op.requestBody) {
				const optional = /optional:\s*true/.test(handler.source);
				expect({ route: handler.key, required: op.requestBody.required }).toEqual({ route: handler.key, required: !optional });
			}
		}
	});

	it('resolves every $ref inside the document', () => {
		const refs = allRefs(document);
		expect(refs.length).toBeGreaterThan(50);
		const broken = refs.filter((ref) => !ref.startsWith('#/') || resolvePointer(document, ref) === undefined);
		expect(broken).toEqual([]);
	});

	it('describes the scenario document as a component, both as sent and as answered', () => {
		for (const name of ['ScenarioDocument', 'ScenarioDocumentInput']) {
			const schema = document.components.schemas[name];
			expect(schema.type).toBe('object');
			expect(Object.keys(schema.properties as object)).toEqual(expect.arrayContaining(['technology', 'resource', 'device', 'capex', 'finance']));
		}
		expect(resolvePointer(document, '#/components/schemas/CreateScenarioRequest/properties/document/$ref')).toBe(
			'#/components/schemas/ScenarioDocumentInput'
		);
	});

	it('leaves no $schema or $id inside the components (they would rebase references)', () => {
		for (const schema of Object.values(document.components.schemas)) {
			expect(schema).not.toHaveProperty('$schema');
			expect(schema).not.toHaveProperty('$id');
		}
	});

	it('is plain JSON', () => {
		expect(JSON.parse(JSON.stringify(document))).toEqual(document);
	});

	it('gives each operation a success answer, its path parameters, declared tags and declared security schemes', () => {
		const schemes = Object.keys(document.components.securitySchemes);
		for (const [path, item] of Object.entries(document.paths)) {
			expect(path.startsWith('/api/v1/')).toBe(true);
			for (const op of Object.values(item)) {
				expect(Object.keys(op.responses).some((status) => /^2\d\d$/.test(status))).toBe(true);
				const inPath = (op.parameters ?? []).filter((p) => p.in === 'path');
				expect(inPath.map((p) => p.name)).toEqual(pathPlaceholders(path));
				expect(inPath.every((p) => p.required)).toBe(true);
				const names = (op.parameters ?? []).map((p) => `${p.in}:${p.name}`);
				expect(new Set(names).size).toBe(names.length);
				expect(op.tags.every((tag) => tag in apiTags)).toBe(true);
				expect(op.security.flatMap((requirement) => Object.keys(requirement)).every((name) => schemes.includes(name))).toBe(true);
			}
		}
	});

	it('names the session cookie and bearer tokens as the ways to sign in, and asks for neither on public operations', () => {
		expect(document.components.securitySchemes.cookieAuth).toMatchObject({ type: 'apiKey', in: 'cookie', name: 'tw_session' });
		expect(document.components.securitySchemes.bearerAuth).toMatchObject({ type: 'http', scheme: 'bearer' });
		expect(document.paths['/api/v1/health'].get.security).toEqual([]);
		expect(document.paths['/api/v1/openapi.json'].get.security).toEqual([]);
		expect(document.paths['/api/v1/projects/{projectId}'].patch.security).toEqual([{ cookieAuth: [] }, { bearerAuth: [] }]);
	});

	it('answers refusals with the one error shape', () => {
		const refusal = document.paths['/api/v1/scenarios/{scenarioId}'].put.responses['404'] as { $ref: string };
		const response = resolvePointer(document, refusal.$ref) as { content: Record<string, { schema: { $ref: string } }> };
		expect(response.content['application/json'].schema.$ref).toBe('#/components/schemas/Error');
		expect(resolvePointer(document, '#/components/schemas/Error/properties/error/properties/issues/type')).toBe('array');
	});

	it("describes each 409 in the operation's own words, in the one error shape", () => {
		const conflictOf = (path: string, method: string) =>
			document.paths[path][method].responses['409'] as { description: string; content: Record<string, { schema: { $ref: string } }> };
		const save = conflictOf('/api/v1/scenarios/{scenarioId}', 'put');
		const remove = conflictOf('/api/v1/scenarios/{scenarioId}', 'delete');
		expect(save.description).toMatch(/currentRevision/);
		expect(remove.description).toMatch(/archive it first/);
		expect(remove.description).not.toMatch(/currentRevision/);
		expect(remove.content['application/json'].schema.$ref).toBe('#/components/schemas/Error');
		expect(document.components.responses).not.toHaveProperty('Conflict');
	});
});

describe('apiOperations', () => {
	it('keeps public operations free of tokens and writes away from read-only tokens', () => {
		for (const op of apiOperations) {
			expect({ op: op.operationId, publicWithoutToken: op.minimumRole === 'anyone' }).toEqual({
				op: op.operationId,
				publicWithoutToken: op.apiToken === 'not-needed'
			});
			if (op.minimumRole === 'analyst' || op.minimumRole === 'owner') expect({ op: op.operationId, token: op.apiToken }).not.toEqual({ op: op.operationId, token: 'read-only' });
			if (op.method === 'GET') expect(op.apiToken).not.toBe('read-write');
		}
	});
});

describe('errorStatusesOf', () => {
	const byId = (id: string) => apiOperations.find((op) => op.operationId === id)!;

	it('gives a public operation no refusals', () => {
		expect(errorStatusesOf(byId('getHealth'))).toEqual([]);
	});

	it('gives a viewer read 401, 404 and 429 but no 403', () => {
		expect(errorStatusesOf(byId('getProject'))).toEqual([401, 404, 429]);
	});

	it('adds 403 for a higher role, 400 and 422 for a body, and the operation own refusals', () => {
		expect(errorStatusesOf(byId('saveScenario'))).toEqual([400, 401, 403, 404, 409, 422, 429]);
		expect(errorStatusesOf(byId('createUpload'))).toEqual([400, 401, 403, 404, 409, 413, 415, 422, 429, 503]);
	});

	it('gives work on the compute pool its per-user limit (429) and its time limit (503), and every write the cross-site 403', () => {
		// evaluate is open to viewers, yet a write method: a browser page on another site is refused.
		expect(errorStatusesOf(byId('evaluateScenario'))).toEqual([400, 401, 403, 404, 422, 429, 503]);
		expect(errorStatusesOf(byId('getScenario'))).not.toContain(503);
	});
});
