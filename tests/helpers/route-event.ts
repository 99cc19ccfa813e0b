/**
 * Calls a route's handler directly, as SvelteKit would after `hooks.server.ts`
 * resolved a signed-in member, so integration tests reach the route's own
 * checks and the real database without a running server.
 */
import type { RequestEvent } from '@sveltejs/kit';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { createUser } from '../../src/lib/server/db/users';
import type { Knex } from 'knex';

export interface RouteCall {
	method?: string;
	/** Path and query, such as `/api/v1/projects/<id>?limit=5`. */
	path: string;
	params: Record<string, string>;
	/** A JSON value, or FormData sent as multipart. */
	body?: unknown;
}

export function memberEvent(user: SessionUser, call: RouteCall): RequestEvent {
	const url = new URL(call.path, 'http://127.0.0.1');
	const session = { id: 'unused', userId: user.id, expiresAt: new Date(Date.now() + 60_000), workspaceId: null };
	let body: BodyInit | undefined;
	const headers: Record<string, string> = {};
	if (call.body instanceof FormData) body = call.body;
	else if (call.body !== undefined) {
		body = JSON.stringify(call.body);
		headers['content-type'] = 'application/json';
	}
	return {
		params: call.params,
		url,
		request: new Request(url, { method: call.method ?? 'GET', body, headers }),
		locals: { principal: { kind: 'member', user, session }, user, session },
		getClientAddress: () => '127.0.0.1',
		setHeaders: () => {},
		cookies: { get: () => undefined, getAll: () => [], set: () => {}, delete: () => {}, serialize: () => '' }
	} as unknown as RequestEvent;
}

type Handler = (event: never) => Promise<Response> | Response;

/** Runs the handler for a signed-in member and answers its response. */
export function callRoute(handler: Handler, user: SessionUser, call: RouteCall): Promise<Response> {
	return Promise.resolve(handler(memberEvent(user, call) as never));
}

let counter = 0;

export async function newSessionUser(knex: Knex, prefix = 'member'): Promise<SessionUser> {
	counter += 1;
	const row = await createUser({ email: `${prefix}-${counter}-${Date.now()}@test.example`, name: `${prefix} ${counter}`, passwordHash: 'unused' }, knex);
	return { id: row.id, email: row.email, name: row.name, emailVerified: true };
}
