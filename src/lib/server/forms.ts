import { error, type RequestEvent } from '@sveltejs/kit';
import { UNSTORABLE_TEXT_MESSAGE, unstorableTextPaths } from './storable-text';
import type { z } from 'zod';
import type { RequestContext } from './auth/accounts';

/**
 * Reads a form into a plain object of strings (files and repeats are not used
 * by these forms). A field holding text the database cannot store is refused
 * here, by name, before any action looks at it.
 */
export async function readForm(request: Request): Promise<Record<string, string>> {
	const data = await request.formData();
	const fields: Record<string, string> = {};
	for (const [key, value] of data) if (typeof value === 'string') fields[key] = value;
	const unstorable = unstorableTextPaths(fields);
	if (unstorable.length > 0) error(400, `The field "${unstorable[0]}" ${UNSTORABLE_TEXT_MESSAGE}.`);
	return fields;
}

/** zod issues as one message per field, for errors beside the field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const errors: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || 'form';
		errors[key] ??= issue.message;
	}
	return errors;
}

export function requestContext(event: RequestEvent): RequestContext {
	return {
		ip: event.getClientAddress(),
		userAgent: event.request.headers.get('user-agent') ?? '',
		origin: event.url.origin
	};
}

/**
 * Where to go after signing in: only a path on this app's own origin. The
 * value is parsed as a URL against the origin the way a browser would read it
 * (browsers drop tabs and newlines and treat `\` as `/`, so "/\t/evil.example"
 * means "//evil.example"); anything with control characters or backslashes,
 * anything that is not a plain path, and anything that resolves elsewhere
 * goes to `fallback`.
 */
export function safeNextPath(next: string | null | undefined, origin: string, fallback = '/app'): string {
	if (!next || !next.startsWith('/')) return fallback;
	// eslint-disable-next-line no-control-regex
	if (/[\u0000-\u001f\u007f\\]/.test(next)) return fallback;
	let url: URL;
	try {
		url = new URL(next, origin);
	} catch {
		return fallback;
	}
	if (url.origin !== new URL(origin).origin) return fallback;
	return url.pathname + url.search + url.hash;
}
