/**
 * The browser's side of the workbench JSON API: one call shape, one error
 * shape (`{ error: { message, issues } }`), and no exceptions for refusals.
 */

export interface ApiIssue {
	path: string;
	message: string;
	row?: number | null;
	column?: string | null;
}

export type ApiAnswer<T> =
	| { ok: true; status: number; body: T }
	| { ok: false; status: number; message: string; issues: ApiIssue[]; details: Record<string, unknown> };

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

function refusal(status: number, message: string, issues: ApiIssue[] = [], details: Record<string, unknown> = {}) {
	return { ok: false as const, status, message, issues, details };
}

/** Sends JSON (or a FormData as multipart) and answers the parsed body or the refusal in words. */
export async function callApi<T>(method: Method, url: string, body?: unknown, options: { signal?: AbortSignal } = {}): Promise<ApiAnswer<T>> {
	const init: RequestInit = { method, signal: options.signal, headers: { accept: 'application/json' } };
	if (body instanceof FormData) init.body = body;
	else if (body !== undefined) {
		init.body = JSON.stringify(body);
		init.headers = { ...init.headers, 'content-type': 'application/json' };
	}
	let response: Response;
	try {
		response = await fetch(url, init);
	} catch (e) {
		if (e instanceof DOMException && e.name === 'AbortError') throw e;
		return refusal(0, 'Tidewright could not reach the server. Check the connection and try again.');
	}
	const parsed: unknown = await response.json().catch(() => null);
	if (response.ok) return { ok: true, status: response.status, body: parsed as T };
	const error = (parsed as { error?: { message?: string; issues?: ApiIssue[] } } | null)?.error;
	if (!error) return refusal(response.status, `The server answered ${response.status}.`);
	const { message, issues, ...details } = error as { message?: string; issues?: ApiIssue[] } & Record<string, unknown>;
	return refusal(response.status, message ?? `The server answered ${response.status}.`, issues ?? [], details);
}
