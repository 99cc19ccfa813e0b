/**
 * The analysis pages' calls to the JSON API: the parsed body, or the refusal
 * in words (`{ error: { message, issues } }`), never an exception for an
 * answer the server gave. Aborted requests still throw, so a newer request
 * can replace an older one.
 */
export interface RefusalIssue {
	path: string;
	message: string;
}

export type JsonAnswer<T> = { ok: true; body: T } | { ok: false; status: number; message: string; issues: RefusalIssue[] };

export async function requestJson<T>(url: string, init: { method?: 'GET' | 'POST'; body?: unknown; signal?: AbortSignal } = {}): Promise<JsonAnswer<T>> {
	let response: Response;
	try {
		response = await fetch(url, {
			method: init.method ?? 'GET',
			signal: init.signal,
			headers: init.body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
			body: init.body === undefined ? undefined : JSON.stringify(init.body)
		});
	} catch (e) {
		if (e instanceof DOMException && e.name === 'AbortError') throw e;
		return { ok: false, status: 0, message: 'Tidewright could not reach the server. Check the connection and try again.', issues: [] };
	}
	const parsed: unknown = await response.json().catch(() => null);
	if (response.ok && parsed !== null) return { ok: true, body: parsed as T };
	const refusal = (parsed as { error?: { message?: string; issues?: RefusalIssue[] }; message?: string } | null) ?? null;
	return {
		ok: false,
		status: response.status,
		message: refusal?.error?.message ?? refusal?.message ?? `The server answered ${response.status}.`,
		issues: refusal?.error?.issues ?? []
	};
}
