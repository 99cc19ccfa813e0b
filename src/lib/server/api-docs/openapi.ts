/**
 * The OpenAPI 3.1 document of /api/v1, built from the list of operations and
 * their zod schemas. Zod writes JSON Schema draft 2020-12, the dialect of
 * OpenAPI 3.1, so schemas go in as they come; shared ones become
 * components and are referenced with $ref. Pure: same input, same document.
 */
import { z } from 'zod';
import {
	apiTags,
	errorStatusesOf,
	namedRequestSchemas,
	namedResponseSchemas,
	pathParameters,
	pathPlaceholders,
	type ApiOperation,
	type ErrorStatus,
	type ResponseSpec
} from './operations';

type JsonSchema = Record<string, unknown>;

export interface OpenApiDocument {
	openapi: '3.1.0';
	jsonSchemaDialect: string;
	info: { title: string; version: string; description: string };
	servers: { url: string }[];
	tags: { name: string; description: string }[];
	paths: Record<string, Record<string, OpenApiOperation>>;
	components: {
		schemas: Record<string, JsonSchema>;
		responses: Record<string, { description: string; content: Record<string, { schema: JsonSchema }> }>;
		securitySchemes: Record<string, Record<string, unknown>>;
	};
}

export interface OpenApiOperation {
	operationId: string;
	tags: string[];
	summary: string;
	description?: string;
	security: Record<string, string[]>[];
	parameters?: { name: string; in: 'path' | 'query'; required: boolean; description: string; schema: JsonSchema }[];
	requestBody?: { required: boolean; content: Record<string, { schema: JsonSchema }> };
	responses: Record<string, unknown>;
	'x-minimum-role': ApiOperation['minimumRole'];
	'x-api-token': ApiOperation['apiToken'];
}

export interface OpenApiOptions {
	/** Where the API is reached, such as https://tidewright.example (the request's origin). */
	origin: string;
	version: string;
	/** The name of the session cookie (SESSION_COOKIE of the session module). */
	sessionCookie: string;
}

const schemaRef = (name: string) => `#/components/schemas/${name}`;

/** The refusals that mean the same for every operation; a 409 is described by each operation (ApiOperation.conflict). */
const errorResponses: Record<Exclude<ErrorStatus, 409>, { name: string; description: string }> = {
	400: { name: 'BadRequest', description: 'The body could not be read (not JSON, or missing where one is needed)' },
	401: { name: 'Unauthorized', description: 'Not signed in, or the API token is unknown, expired or revoked' },
	402: { name: 'PaymentRequired', description: "The workspace's plan does not allow this (or its paid plan lapsed); billingUrl in the error is the owner's billing page" },
	403: { name: 'Forbidden', description: 'Your role in the workspace is too low, the API token may not do this, or a browser sent the request from another site' },
	404: { name: 'NotFound', description: 'No such thing, or it is in a workspace you are not a member of (the two answer alike)' },
	413: { name: 'PayloadTooLarge', description: 'The file is over the upload limit' },
	415: { name: 'UnsupportedMediaType', description: 'The upload was not sent as multipart/form-data' },
	422: { name: 'UnprocessableContent', description: 'Some fields, parameters or rows have problems; issues name each one' },
	429: { name: 'TooManyRequests', description: 'Too many requests with this API token, or too many of this kind of calculation by this user a minute; Retry-After says when to try again' },
	503: { name: 'ServiceUnavailable', description: 'The calculation did not finish in time or the server is busy with others, or the database does not answer; try again shortly' }
};

const securitySchemes = (sessionCookie: string) => ({
	cookieAuth: {
		type: 'apiKey',
		in: 'cookie',
		name: sessionCookie,
		description: 'The session of a signed-in browser. Writes from a browser also need an Origin header matching the site.'
	},
	bearerAuth: {
		type: 'http',
		scheme: 'bearer',
		description:
			'A personal API token (it starts with tw_), created on your account page: `Authorization: Bearer tw_...`. It acts with your role in its workspace, never more; a read-only token cannot write.'
	}
});

const description = [
	'The JSON API of the Tidewright workbench: projects, scenarios, uploads and the figures calculated from them.',
	'Every refusal has one shape: `{ "error": { "message": "...", "issues": [{ "path": "document.capex.lines[0].amount", "message": "..." }] } }`.',
	'Money and energy figures are decimal strings, kept exact. Results are estimates for screening and discussion, not investment advice and not a certified resource or yield assessment.'
].join('\n\n');

/** Emitted components carry `$schema` and `$id`; inside an OpenAPI document both are noise (and `$id` would rebase refs). */
function asComponent(schema: JsonSchema): JsonSchema {
	const { $schema: _schema, $id: _id, ...rest } = schema;
	return rest;
}

function inlineSchema(schema: z.ZodType): JsonSchema {
	return asComponent(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12' }) as JsonSchema);
}

function pascal(operationId: string): string {
	return operationId.charAt(0).toUpperCase() + operationId.slice(1);
}

/**
 * Converts one registry of schemas, named as given, plus the operations'
 * own schemas (named after the operation unless already named), in one
 * pass so that every named schema inside another becomes a $ref.
 */
function convertSchemas(
	named: Record<string, z.ZodType>,
	perOperation: { operationId: string; suffix: string; schema: z.ZodType }[],
	io: 'input' | 'output'
): { schemas: Record<string, JsonSchema>; nameOf: Map<z.ZodType, string> } {
	const registry = z.registry<{ id: string }>();
	const nameOf = new Map<z.ZodType, string>();
	const add = (schema: z.ZodType, name: string) => {
		if (nameOf.has(schema)) return;
		registry.add(schema, { id: name });
		nameOf.set(schema, name);
	};
	for (const [name, schema] of Object.entries(named)) add(schema, name);
	for (const { operationId, suffix, schema } of perOperation) add(schema, `${pascal(operationId)}${suffix}`);
	const { schemas } = z.toJSONSchema(registry, { io, unrepresentable: 'any', target: 'draft-2020-12', uri: schemaRef });
	return { schemas: Object.fromEntries(Object.entries(schemas).map(([name, s]) => [name, asComponent(s as JsonSchema)])), nameOf };
}

function successResponse(spec: ResponseSpec, nameOf: Map<z.ZodType, string>) {
	if (spec.json) return { description: spec.description, content: { 'application/json': { schema: { $ref: schemaRef(nameOf.get(spec.json)!) } } } };
	if (spec.fileTypes) {
		return {
			description: spec.description,
			headers: { 'Content-Disposition': { description: 'attachment; filename="..."', schema: { type: 'string' } } },
			content: Object.fromEntries(spec.fileTypes.map((type) => [type, { schema: { type: 'string', contentMediaType: type } }]))
		};
	}
	return { description: spec.description };
}

/** A refusal of one operation: a $ref to the shared response, or the operation's own words for a 409. */
function errorResponse(op: ApiOperation, status: ErrorStatus) {
	if (status !== 409) return { $ref: `#/components/responses/${errorResponses[status].name}` };
	if (op.conflict === undefined) throw new Error(`${op.operationId}: a 409 needs the operation's own words in conflict`);
	return { description: op.conflict, content: { 'application/json': { schema: { $ref: schemaRef('Error') } } } };
}

function securityOf(op: ApiOperation): Record<string, string[]>[] {
	if (op.minimumRole === 'anyone') return [];
	if (op.apiToken === 'refused' || op.apiToken === 'not-needed') return [{ cookieAuth: [] }];
	return [{ cookieAuth: [] }, { bearerAuth: [] }];
}

function parametersOf(op: ApiOperation): OpenApiOperation['parameters'] {
	const inPath = pathPlaceholders(op.path).map((name) => {
		const spec = pathParameters[name];
		if (!spec) throw new Error(`${op.operationId}: the path parameter {${name}} is not described in pathParameters`);
		return { name, in: 'path' as const, required: true, description: spec.description, schema: inlineSchema(spec.schema) };
	});
	const inQuery = (op.query ?? []).map((q) => ({
		name: q.name,
		in: 'query' as const,
		required: q.required,
		description: q.description,
		schema: inlineSchema(q.schema)
	}));
	const all = [...inPath, ...inQuery];
	return all.length > 0 ? all : undefined;
}

export function buildOpenApiDocument(operations: readonly ApiOperation[], options: OpenApiOptions): OpenApiDocument {
	const responses = convertSchemas(
		namedResponseSchemas,
		operations.flatMap((op) =>
			[op.response, ...(op.otherResponses ?? [])].flatMap((r) => (r.json ? [{ operationId: op.operationId, suffix: 'Response', schema: r.json }] : []))
		),
		'output'
	);
	const requests = convertSchemas(
		namedRequestSchemas,
		operations.flatMap((op) => (op.requestBody ? [{ operationId: op.operationId, suffix: 'Request', schema: op.requestBody.schema }] : [])),
		'input'
	);
	const clash = Object.keys(requests.schemas).find((name) => name in responses.schemas);
	if (clash) throw new Error(`The schema name ${clash} is used for a request and for a response`);

	const paths: OpenApiDocument['paths'] = {};
	for (const op of operations) {
		const answers: Record<string, unknown> = {};
		for (const spec of [op.response, ...(op.otherResponses ?? [])]) answers[String(spec.status)] = successResponse(spec, responses.nameOf);
		for (const status of errorStatusesOf(op)) answers[String(status)] = errorResponse(op, status);

		const entry: OpenApiOperation = {
			operationId: op.operationId,
			tags: [op.tag],
			summary: op.summary,
			...(op.description ? { description: op.description } : {}),
			security: securityOf(op),
			...(parametersOf(op) ? { parameters: parametersOf(op) } : {}),
			...(op.requestBody
				? {
						requestBody: {
							required: op.requestBody.required,
							content: { [op.requestBody.contentType]: { schema: { $ref: schemaRef(requests.nameOf.get(op.requestBody.schema)!) } } }
						}
					}
				: {}),
			responses: answers,
			'x-minimum-role': op.minimumRole,
			'x-api-token': op.apiToken
		};
		paths[op.path] ??= {};
		paths[op.path][op.method.toLowerCase()] = entry;
	}

	return {
		openapi: '3.1.0',
		jsonSchemaDialect: 'https://spec.openapis.org/oas/3.1/dialect/base',
		info: { title: 'Tidewright API', version: options.version, description },
		servers: [{ url: options.origin }],
		tags: Object.entries(apiTags).map(([name, text]) => ({ name, description: text })),
		paths,
		components: {
			schemas: { ...responses.schemas, ...requests.schemas },
			responses: Object.fromEntries(
				Object.values(errorResponses).map(({ name, description: text }) => [
					name,
					{ description: text, content: { 'application/json': { schema: { $ref: schemaRef('Error') } } } }
				])
			),
			securitySchemes: securitySchemes(options.sessionCookie)
		}
	};
}
