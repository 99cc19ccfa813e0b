/**
 * The frame of every workbench API route: read and validate the body, and
 * turn every refusal into the one JSON error shape
 * `{ error: { message, issues: [{ path, message }] } }` (apiError in src/lib/server/api.ts).
 */
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { apiError, type ApiIssue } from '../api';
import { DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable, isUnstorableTextError } from '../db/errors';
import { UNSTORABLE_TEXT_MESSAGE, unstorableTextPaths } from '../storable-text';
import { ArchivedScenarioError, StaleRevisionError } from '../db/scenarios';
import { parseScenario, SCHEMA_VERSION, type Scenario } from '../../schemas/scenario';
import { safeParseStrict, type FieldIssue } from '../../schemas/strict-parse';

/** A refusal with a status, a message, field issues, any extra facts for the client and any headers (such as Retry-After). */
export class ApiProblem extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly issues: ApiIssue[] = [],
		readonly details: Record<string, unknown> = {},
		readonly headers: Record<string, string> = {}
	) {
		super(message);
		this.name = 'ApiProblem';
	}
}

function responseFor(e: unknown): Response | null {
	if (e instanceof ApiProblem) {
		const response = apiError(e.status, e.message, e.issues, e.details);
		for (const [name, value] of Object.entries(e.headers)) response.headers.set(name, value);
		return response;
	}
	if (e instanceof StaleRevisionError) {
		return apiError(409, e.message, [{ path: 'revision', message: `the scenario is now at revision ${e.currentRevision}` }], {
			currentRevision: e.currentRevision
		});
	}
	if (e instanceof ArchivedScenarioError) return apiError(409, e.message);
	if (isHttpError(e)) return apiError(e.status, e.body.message);
	// Backstops: the same error shape when the database is down, and words instead of a 500 for text it refuses.
	if (isDatabaseUnavailable(e)) return apiError(503, DATABASE_UNAVAILABLE_MESSAGE);
	if (isUnstorableTextError(e)) return apiError(422, `Some text ${UNSTORABLE_TEXT_MESSAGE}.`);
	return null;
}

/** Wraps a route handler so thrown refusals answer as JSON errors; anything else is a real failure (500). */
export function apiRoute<E extends RequestEvent>(handler: (event: E) => Promise<Response>): (event: E) => Promise<Response> {
	return async (event) => {
		try {
			const response = await handler(event);
			response.headers.set('cache-control', 'no-store');
			return response;
		} catch (e) {
			if (isRedirect(e)) throw e;
			const response = responseFor(e);
			if (response) return response;
			throw e;
		}
	};
}

/** `['capex', 'lines', 2, 'amount']` under `document` -> `document.capex.lines[2].amount`. */
export function issuePath(path: readonly PropertyKey[], prefix = ''): string {
	let out = prefix;
	for (const key of path) {
		if (typeof key === 'number') out += `[${key}]`;
		else out += out === '' ? String(key) : `.${String(key)}`;
	}
	return out === '' ? '(body)' : out;
}

/** Field issues as the API answers them; unknown keys come one a key, with the key probably meant (see strict-parse.ts). */
export function fieldIssues(issues: readonly FieldIssue[], prefix = ''): ApiIssue[] {
	return issues.map((issue) => ({ path: issuePath(issue.path, prefix), message: issue.message }));
}

/** The request's JSON body; an empty body reads as `{}` when `optional`. */
export async function readJsonBody(request: Request, options: { optional?: boolean } = {}): Promise<unknown> {
	const text = await request.text();
	if (text.trim() === '') {
		if (options.optional) return {};
		throw new ApiProblem(400, 'The request needs a JSON body.');
	}
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		throw new ApiProblem(400, 'The request body is not valid JSON.');
	}
	const unstorable = unstorableTextPaths(body);
	if (unstorable.length > 0) {
		throw new ApiProblem(422, 'Some text cannot be stored.', unstorable.map((path) => ({ path, message: UNSTORABLE_TEXT_MESSAGE })));
	}
	return body;
}

export function validateBody<S extends z.ZodType>(schema: S, value: unknown): z.output<S> {
	const result = safeParseStrict(schema, value);
	if (result.success) return result.data;
	throw new ApiProblem(422, 'Some fields need attention.', fieldIssues(result.issues));
}

/**
 * A scenario document checked against the schema (and the project's
 * technology), issues under `document.`. A document of an older schema
 * version is upgraded first (parseScenario); its issues then name the
 * current fields, and the message says which version it was read from.
 */
export function validateDocument(value: unknown, project: { technology: string }, prefix = 'document'): Scenario {
	const result = parseScenario(value);
	if (!result.ok) {
		const issues = result.issues.map((issue) => ({
			path: issue.path === '(document)' ? prefix : `${prefix}.${issue.path}`,
			message: issue.message
		}));
		const upgraded = result.upgradedFrom === null ? '' : ` (read as schema version ${SCHEMA_VERSION}, upgraded from version ${result.upgradedFrom})`;
		throw new ApiProblem(422, `The scenario document has problems in the fields listed${upgraded}.`, issues);
	}
	if (result.scenario.technology !== project.technology) {
		throw new ApiProblem(422, 'The scenario document has problems in the fields listed.', [
			{ path: `${prefix}.technology`, message: `this project is ${project.technology}; the document is ${result.scenario.technology}` }
		]);
	}
	return result.scenario;
}

/** The document with the scenario's name in it (the row's name is the one that counts); anything else as it came. */
export function withName(document: unknown, name: string): unknown {
	return document && typeof document === 'object' && !Array.isArray(document) ? { ...document, name } : document;
}
