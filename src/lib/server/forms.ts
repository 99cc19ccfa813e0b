import type { RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import type { RequestContext } from './auth/accounts';

/** Reads a form into a plain object of strings (files and repeats are not used by these forms). */
export async function readForm(request: Request): Promise<Record<string, string>> {
	const data = await request.formData();
	const fields: Record<string, string> = {};
	for (const [key, value] of data) if (typeof value === 'string') fields[key] = value;
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

/** Only same-site paths may be a post-sign-in destination. */
export function safeNextPath(next: string | null | undefined, fallback = '/app'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
	return next;
}
