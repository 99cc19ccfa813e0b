import { redirect, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { randomUUID } from 'node:crypto';
import { SESSION_COOKIE, deleteSessionCookie, setSessionCookie, sessionForRequest } from '$lib/server/auth/session';
import { authenticateApiToken, bearerToken, recordRefusedToken, recordTokenRequest, takeTokenRequest } from '$lib/server/auth/api-tokens';
import { anonymous } from '$lib/server/auth/principal';
import { apiError } from '$lib/server/api';
import { SettingsError, billingSettings, checkSettings, cookiesAreSecure, databaseSettings, webSettings } from '$lib/server/settings';
import { crossSiteRefusal } from '$lib/server/cross-site';
import { closeComputePool, computePool } from '$lib/server/compute/pool';
import { getRequestEvent } from '$app/server';
import { closeDb, db } from '$lib/server/db/knex';
import { requestFinished, startCachedReads, stopCachedReads } from '$lib/server/db/cached-reads';
import { DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from '$lib/server/db/errors';
import { devInboxEnabled } from '$lib/server/mail/dev-inbox';
import { afterResponse } from '$lib/server/after-response';
import { GUEST_COOKIE, deleteGuestCookie, validateGuestSession } from '$lib/server/rooms/guest-sessions';
import { isBillingPage, withFormActionOrigins } from '$lib/server/csp-form-action';
import { scopeLocale } from '$lib/server/request-locale';

/** Stops the start when a setting is missing or malformed, naming each one. */
export const init: ServerInit = () => {
	try {
		checkSettings();
	} catch (e) {
		if (!(e instanceof SettingsError)) throw e;
		console.error(e.message);
		process.exit(78); // EX_CONFIG: a configuration error, not a crash
	}
	// The compute threads load the engine off the request thread; start them now rather than on the first evaluation.
	void computePool().catch((e: unknown) => console.error('[compute] the worker pool did not start:', e));
	// Pages read again are served from kept reads, which PostgreSQL's change feed keeps honest (db/cached-reads.ts).
	startCachedReads(db(), databaseSettings().url, currentRequestKey);
	// adapter-node stops taking requests on SIGTERM/SIGINT, then says so: close what keeps the process alive.
	process.once('sveltekit:shutdown', () => {
		void Promise.allSettled([closeComputePool(), stopCachedReads().then(closeDb)]);
	});
};

/** The request a database statement runs in (its locals), or undefined for work outside any request. */
function currentRequestKey(): object | undefined {
	try {
		return getRequestEvent().locals;
	} catch {
		return undefined;
	}
}

/** A request that wrote has committed when it ends: kept reads are forgotten then (see db/cached-reads.ts). */
const settleOwnWrites: Handle = async ({ event, resolve }) => {
	try {
		return await resolve(event);
	} finally {
		requestFinished(event.locals);
	}
};

function isRoomsPath(path: string) {
	return path === '/rooms' || path.startsWith('/rooms/');
}

function isApiPath(path: string) {
	return path === '/api/v1' || path.startsWith('/api/v1/');
}

/** The API answers in its one error shape even when the database fails under the request's own checks (sessions, tokens). */
const apiFailuresAsJson: Handle = async ({ event, resolve }) => {
	if (!isApiPath(event.url.pathname)) return resolve(event);
	try {
		return await resolve(event);
	} catch (e) {
		if (isDatabaseUnavailable(e)) return apiError(503, DATABASE_UNAVAILABLE_MESSAGE);
		throw e;
	}
};

/**
 * Resolves the principal. On /api/v1 a `Authorization: Bearer` token decides
 * (the cookie is then ignored): a bad one answers 401, one over its allowance
 * 429, and every call it makes goes to the audit log. Elsewhere the session
 * cookie decides, sliding its expiry.
 */
const authenticate: Handle = async ({ event, resolve }) => {
	event.locals.principal = anonymous;
	event.locals.user = null;
	event.locals.session = null;

	const bearer = isApiPath(event.url.pathname) ? bearerToken(event.request) : null;
	if (bearer !== null) {
		const outcome = await authenticateApiToken(bearer);
		if (!outcome.ok) {
			if (outcome.known) {
				await recordRefusedToken(outcome.known, { method: event.request.method, path: event.url.pathname, ip: event.getClientAddress() });
			}
			const response = apiError(401, outcome.message);
			response.headers.set('www-authenticate', 'Bearer error="invalid_token"');
			return response;
		}
		const allowance = await takeTokenRequest(outcome.principal.token.id);
		if (!allowance.allowed) {
			const response = apiError(429, `This API token made too many requests; try again in ${allowance.retryAfterSeconds} s.`);
			response.headers.set('retry-after', String(allowance.retryAfterSeconds));
			return response;
		}
		event.locals.principal = outcome.principal;
		const response = await resolve(event);
		// The audit line goes out after the answer, so a script's calls do not wait on two writes each.
		const call = { method: event.request.method, path: event.url.pathname, status: response.status, ip: event.getClientAddress() };
		void afterResponse('Recording an API token call', () => recordTokenRequest(outcome.principal, call));
		return response;
	}

	// Under /rooms only the room guest's own cookie counts: investors are never workspace members.
	if (isRoomsPath(event.url.pathname)) {
		const guestToken = event.cookies.get(GUEST_COOKIE);
		if (guestToken) {
			const validated = await validateGuestSession(guestToken);
			if (validated) event.locals.principal = { kind: 'guest', guest: { id: validated.guest.id, email: validated.guest.email, name: validated.guest.name }, session: validated.session };
			else deleteGuestCookie(event.cookies, cookiesAreSecure(event.url));
		}
		return resolve(event);
	}

	const token = event.cookies.get(SESSION_COOKIE);
	if (token) {
		const { session, user, memberships, extended } = await sessionForRequest(token);
		const secure = cookiesAreSecure(event.url);
		if (session) {
			if (extended) setSessionCookie(event.cookies, token, session.expiresAt, secure);
			event.locals.principal = { kind: 'member', user, session, memberships };
			event.locals.user = user;
			event.locals.session = session;
		} else {
			deleteSessionCookie(event.cookies, secure);
		}
	}
	return resolve(event);
};

/**
 * Every state-changing request from a browser page must come from the app's
 * own origin; a token-authenticated API call (no cookie rides along) is the
 * one exception. See cross-site.ts.
 */
const refuseCrossSite: Handle = async ({ event, resolve }) => {
	if (event.locals.principal.kind === 'token') return resolve(event);
	const refusal = crossSiteRefusal(event.request, webSettings().origin ?? event.url.origin);
	if (refusal === null) return resolve(event);
	if (isApiPath(event.url.pathname)) return apiError(403, refusal);
	return new Response(refusal, { status: 403, headers: { 'content-type': 'text/plain; charset=utf-8' } });
};

/** Whole areas: the workbench needs a signed-in user; the dev inbox exists only for a local demo on loopback, for signed-in users. */
const guardAreas: Handle = async ({ event, resolve }) => {
	const path = event.url.pathname;
	if ((path === '/app' || path.startsWith('/app/')) && !event.locals.user) {
		redirect(303, `/signin?next=${encodeURIComponent(path + event.url.search)}`);
	}
	if (path === '/dev' || path.startsWith('/dev/')) {
		if (!devInboxEnabled()) return new Response('Not found', { status: 404 });
		if (!event.locals.user) redirect(303, `/signin?next=${encodeURIComponent(path + event.url.search)}`);
	}
	return resolve(event);
};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	response.headers.set('x-frame-options', 'DENY');
	const policy = response.headers.get('content-security-policy');
	if (policy && isBillingPage(event.url.pathname) && billingSettings().enabled) {
		response.headers.set('content-security-policy', withFormActionOrigins(policy, billingSettings().pageOrigins));
	}
	return response;
};

export const handle = sequence(scopeLocale, settleOwnWrites, securityHeaders, apiFailuresAsJson, authenticate, refuseCrossSite, guardAreas);

/**
 * Log the real failure on the server; show the user a safe message with an id
 * to quote. Refusals below 500 (404, 405, 413 for a body over the limit...)
 * are answers, not server errors, and are not logged as such.
 */
export const handleError: HandleServerError = ({ error, status, message }) => {
	if (status < 500) return { message };
	const errorId = randomUUID();
	console.error(`[error ${errorId}]`, error);
	return {
		message: isDatabaseUnavailable(error) ? DATABASE_UNAVAILABLE_MESSAGE : 'Something went wrong on our side.',
		errorId
	};
};
