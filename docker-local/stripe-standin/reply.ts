/** An answer a route gives, written out by the server in one place. */
export interface Reply {
	status: number;
	headers: Record<string, string>;
	body: string;
}

export function json(status: number, value: unknown, headers: Record<string, string> = {}): Reply {
	return { status, headers: { 'content-type': 'application/json; charset=utf-8', ...headers }, body: JSON.stringify(value, null, 2) };
}

export function html(status: number, body: string): Reply {
	return { status, headers: { 'content-type': 'text/html; charset=utf-8' }, body };
}

/** 303 See Other: after a form post the browser follows with a GET. */
export function redirect(location: string): Reply {
	return { status: 303, headers: { location, 'content-type': 'text/plain; charset=utf-8' }, body: `See ${location}` };
}
