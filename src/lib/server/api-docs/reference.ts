/**
 * The API page's view of the OpenAPI document: each operation with its
 * access rules, parameters and body fields written as plain words, read
 * from the same JSON Schemas the document publishes.
 */
import { apiTags, errorStatusesOf, type ApiOperation, type ApiTag, type ApiTokenUse, type MinimumRole } from './operations';
import type { OpenApiDocument } from './openapi';

type JsonSchema = Record<string, unknown>;

export interface FieldView {
	name: string;
	type: string;
	required: boolean;
	description: string;
	/** Limits and the default, such as "1 to 200 characters · default: EUR"; empty when there are none. */
	rules: string;
	/** For a list of objects (or an object) written out in place: the fields of each item; empty otherwise. */
	itemFields: FieldView[];
}

export interface ParameterView extends Omit<FieldView, 'itemFields'> {
	where: 'path' | 'query';
}

export interface OperationView {
	operationId: string;
	method: string;
	path: string;
	summary: string;
	description: string;
	role: string;
	tokens: string;
	parameters: ParameterView[];
	body: { contentType: string; required: boolean; fields: FieldView[] } | null;
	success: { status: number; description: string }[];
	errors: { status: number; description: string }[];
}

export interface TagView {
	tag: ApiTag;
	description: string;
	operations: OperationView[];
}

export const roleLabels: Record<MinimumRole, string> = {
	anyone: 'Anyone, without signing in',
	'signed-in': 'Any signed-in member',
	viewer: 'Viewer, analyst or owner',
	analyst: 'Analyst or owner',
	owner: 'Owner only'
};

export const tokenLabels: Record<ApiTokenUse, string> = {
	'read-only': 'Any API token (read-only or read-write)',
	'read-write': 'Read-write API tokens only',
	refused: 'Not with an API token: sign in from a browser',
	'not-needed': 'No token needed'
};

const LARGEST_SAFE = Number.MAX_SAFE_INTEGER;

/** `#/components/schemas/ScenarioDocumentInput` -> the component it names, or undefined. */
function resolveRef(ref: unknown, components: Record<string, JsonSchema>): JsonSchema | undefined {
	if (typeof ref !== 'string' || !ref.startsWith('#/components/schemas/')) return undefined;
	return components[ref.slice('#/components/schemas/'.length)];
}

/** `ScenarioDocumentInput` -> "scenario document"; `DecimalString` -> "decimal string". */
export function plainSchemaName(componentName: string): string {
	return componentName
		.replace(/Input$/, '')
		.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
		.toLowerCase();
}

/** A JSON Schema's type in words: "text", "whole number", "list of numbers", "one of: csv, xlsx", "decimal string or null". */
export function schemaTypeLabel(schema: JsonSchema): string {
	if (typeof schema.$ref === 'string') return plainSchemaName(schema.$ref.split('/').pop()!);
	if (Array.isArray(schema.enum)) return `one of: ${schema.enum.map(String).join(', ')}`;
	if ('const' in schema) return `exactly ${JSON.stringify(schema.const)}`;
	const options = (schema.anyOf ?? schema.oneOf) as JsonSchema[] | undefined;
	if (Array.isArray(options)) return [...new Set(options.map(schemaTypeLabel))].join(' or ');
	switch (schema.type) {
		case 'string':
			if (schema.format === 'binary') return 'file';
			if (schema.format === 'uuid') return 'id (uuid)';
			if (schema.format === 'date-time') return 'date and time (ISO 8601)';
			return 'text';
		case 'integer':
			return 'whole number';
		case 'number':
			return 'number';
		case 'boolean':
			return 'true or false';
		case 'null':
			return 'null';
		case 'array': {
			const items = schema.items as JsonSchema | undefined;
			if (!items) return 'list';
			return isInlineObject(items) ? 'list of objects' : `list of ${schemaTypeLabel(items)}`;
		}
		case 'object':
			return 'object';
		default:
			return 'any JSON value';
	}
}

function range(min: unknown, max: unknown, unit: string): string | null {
	const low = typeof min === 'number' ? min : null;
	const high = typeof max === 'number' && max < LARGEST_SAFE ? max : null;
	if (low !== null && high !== null) return `${low} to ${high}${unit}`;
	if (low !== null) return `at least ${low}${unit}`;
	if (high !== null) return `at most ${high}${unit}`;
	return null;
}

/** Limits and the default of a schema in words, joined with " · ". */
export function schemaRules(schema: JsonSchema): string {
	const rules = [
		range(schema.minLength, schema.maxLength, ' characters'),
		range(schema.minItems, schema.maxItems, ' items'),
		range(schema.minimum, schema.maximum, ''),
		'default' in schema ? `default: ${JSON.stringify(schema.default)}` : null
	];
	return rules.filter((rule): rule is string => rule !== null).join(' · ');
}

/** An object written out in place (not a named component), whose fields can be listed where it is used. */
function isInlineObject(schema: JsonSchema): boolean {
	return schema.type === 'object' && typeof schema.properties === 'object' && schema.properties !== null;
}

/** The fields of an inline object, or of the inline objects a list holds; none for anything else. */
function nestedFields(property: JsonSchema, components: Record<string, JsonSchema>): FieldView[] {
	if (isInlineObject(property)) return objectFields(property, components);
	const items = property.type === 'array' ? (property.items as JsonSchema | undefined) : undefined;
	return items && isInlineObject(items) ? objectFields(items, components) : [];
}

/** The fields of an object schema (following a $ref to its component), with the fields of inline objects inside. */
export function objectFields(schema: JsonSchema, components: Record<string, JsonSchema>): FieldView[] {
	const target = resolveRef(schema.$ref, components) ?? schema;
	const properties = (target.properties ?? {}) as Record<string, JsonSchema>;
	const required = new Set((target.required ?? []) as string[]);
	return Object.entries(properties).map(([name, property]) => {
		const described = property.description ?? resolveRef(property.$ref, components)?.description;
		return {
			name,
			type: schemaTypeLabel(property),
			required: required.has(name),
			description: typeof described === 'string' ? described : '',
			rules: schemaRules(property),
			itemFields: nestedFields(property, components)
		};
	});
}

/** The description of a refusal: the operation's own words, or those of the shared response its $ref names. */
function errorDescription(response: unknown, document: OpenApiDocument): string {
	const { $ref: ref, description: own } = (response ?? {}) as { $ref?: unknown; description?: unknown };
	if (typeof own === 'string') return own;
	const name = typeof ref === 'string' ? ref.split('/').pop()! : '';
	return document.components.responses[name]?.description ?? '';
}

function operationView(op: ApiOperation, document: OpenApiDocument): OperationView {
	const entry = document.paths[op.path][op.method.toLowerCase()];
	const components = document.components.schemas;
	const bodyContent = entry.requestBody ? Object.entries(entry.requestBody.content)[0] : undefined;
	return {
		operationId: op.operationId,
		method: op.method,
		path: op.path,
		summary: op.summary,
		description: op.description ?? '',
		role: roleLabels[op.minimumRole],
		tokens: tokenLabels[op.apiToken],
		parameters: (entry.parameters ?? []).map((p) => {
			const described = p.description || (p.schema.description as string | undefined) || '';
			return { name: p.name, where: p.in, type: schemaTypeLabel(p.schema), required: p.required, description: described, rules: schemaRules(p.schema) };
		}),
		body:
			bodyContent && entry.requestBody
				? { contentType: bodyContent[0], required: entry.requestBody.required, fields: objectFields(bodyContent[1].schema, components) }
				: null,
		success: [op.response, ...(op.otherResponses ?? [])].map((r) => ({ status: r.status, description: r.description })),
		errors: errorStatusesOf(op).map((status) => ({ status, description: errorDescription(entry.responses[String(status)], document) }))
	};
}

/** The operations grouped by tag, in the order the tags are declared. */
export function apiReference(operations: readonly ApiOperation[], document: OpenApiDocument): TagView[] {
	return (Object.keys(apiTags) as ApiTag[])
		.map((tag) => ({
			tag,
			description: apiTags[tag],
			operations: operations.filter((op) => op.tag === tag).map((op) => operationView(op, document))
		}))
		.filter((group) => group.operations.length > 0);
}
