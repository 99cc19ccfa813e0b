/**
 * The stand-in's HTTP server: reads each request, sends `/v1` to the API
 * (test keys only, idempotency keys honoured), `/_standin` to the control
 * routes, the rest to the pages, and writes every answer, errors included,
 * in the shape its caller expects.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { createHash } from 'node:crypto';
import Stripe from 'stripe';
import { handleApiCall } from './api';
import type { StandinContext } from './context';
import { handleControlRoute } from './control-routes';
import { StandinError } from './errors';
import { parseFormBody, type FormObject } from './form-body';
import { messagePage } from './pages';
import { handlePageRoute } from './page-routes';
import { html, json, type Reply } from './reply';
import { newId } from './state';

const MAX_BODY_BYTES = 1024 * 1024;

function readBody(req: IncomingMessage): Promise<string> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		let size = 0;
		req.on('data', (chunk: Buffer) => {
			size += chunk.length;
			if (size > MAX_BODY_BYTES) {
				reject(new StandinError(400, 'Request body larger than 1 MB'));
				req.destroy();
				return;
			}
			chunks.push(chunk);
		});
		req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
		req.on('error', reject);
	});
}

function header(req: IncomingMessage, name: string): string | undefined {
	const value = req.headers[name];
	return Array.isArray(value) ? value[0] : value;
}

/** The secret key from `Bearer <key>` (the SDK) or `Basic base64(<key>:)` (curl -u key:). */
function apiKey(authorization: string): string | undefined {
	const bearer = /^Bearer (.+)$/.exec(authorization)?.[1];
	if (bearer) return bearer;
	const basic = /^Basic (.+)$/.exec(authorization)?.[1];
	return basic ? Buffer.from(basic, 'base64').toString('utf8').split(':')[0] || undefined : undefined;
}

/** Only test secret keys are accepted, so a live key pasted by mistake fails loudly here. */
function checkApiKey(req: IncomingMessage): void {
	const key = apiKey(header(req, 'authorization') ?? '');
	if (!key) {
		throw new StandinError(401, 'You did not provide an API key. The local Stripe stand-in takes any sk_test_ key, as a Bearer token or as the Basic user name.');
	}
	if (!key.startsWith('sk_test_')) {
		throw new StandinError(401, 'The local Stripe stand-in accepts test secret keys (sk_test_...) only.');
	}
}

function mergedParams(url: URL, body: string, contentType: string | undefined): FormObject {
	const query = parseFormBody(url.search.slice(1));
	if (body === '') return query;
	if (contentType && !contentType.startsWith('application/x-www-form-urlencoded')) {
		throw new StandinError(400, `Send parameters form-encoded, not as ${contentType}`);
	}
	return { ...query, ...parseFormBody(body) };
}

interface IdempotentEntry {
	fingerprint: string;
	reply: Promise<Reply>;
}

export function createStandinServer(context: StandinContext): Server {
	/** Answers by Idempotency-Key: a repeat gets the first answer, even while that one is still being made. */
	const idempotent = new Map<string, IdempotentEntry>();
	context.onReset(() => idempotent.clear());

	async function apiReply(req: IncomingMessage, url: URL, body: string): Promise<Reply> {
		const method = req.method ?? 'GET';
		const requestId = newId('req');
		const idempotencyKey = method === 'GET' ? undefined : header(req, 'idempotency-key');
		const answer = async (): Promise<Reply> => {
			try {
				checkApiKey(req);
				const params = mergedParams(url, body, header(req, 'content-type'));
				const result = await context.run({ requestId, idempotencyKey: idempotencyKey ?? null }, (emit) =>
					handleApiCall(context.state, { method, path: url.pathname, params, emit })
				);
				return json(200, result);
			} catch (error) {
				return errorReply(error);
			}
		};
		const stripeHeaders = {
			'request-id': requestId,
			'stripe-version': header(req, 'stripe-version') ?? Stripe.API_VERSION
		};
		if (!idempotencyKey) return withHeaders(await answer(), stripeHeaders);

		const fingerprint = createHash('sha256').update(`${method} ${url.pathname}?${url.search}\n${body}`).digest('hex');
		const earlier = idempotent.get(idempotencyKey);
		if (earlier && earlier.fingerprint !== fingerprint) {
			return withHeaders(
				errorReply(
					new StandinError(
						400,
						`Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
						undefined,
						undefined,
						'idempotency_error'
					)
				),
				stripeHeaders
			);
		}
		if (earlier) return withHeaders(await earlier.reply, { ...stripeHeaders, 'idempotent-replayed': 'true' });
		const reply = answer();
		idempotent.set(idempotencyKey, { fingerprint, reply });
		return withHeaders(await reply, { ...stripeHeaders, 'idempotency-key': idempotencyKey });
	}

	async function route(req: IncomingMessage): Promise<Reply> {
		const url = new URL(req.url ?? '/', 'http://127.0.0.1');
		const method = req.method ?? 'GET';
		const body = await readBody(req);
		if (url.pathname.startsWith('/v1/')) return apiReply(req, url, body);
		if (url.pathname.startsWith('/_standin/')) {
			try {
				return (await handleControlRoute(context, method, url.pathname, body)) ?? json(404, new StandinError(404, `No control route ${method} ${url.pathname}`));
			} catch (error) {
				return errorReply(error);
			}
		}
		try {
			const form = method === 'POST' ? parseFormBody(body) : {};
			return (await handlePageRoute(context, method, url, form)) ?? html(404, messagePage('Not found', `No page at ${url.pathname}`));
		} catch (error) {
			const standin = asStandinError(error);
			return html(standin.status, messagePage('Cannot do that', standin.message));
		}
	}

	return createServer((req: IncomingMessage, res: ServerResponse) => {
		route(req)
			.catch((error: unknown) => errorReply(error))
			.then((reply) => {
				res.writeHead(reply.status, { 'cache-control': 'no-store', ...reply.headers });
				res.end(reply.body);
			});
	});
}

function withHeaders(reply: Reply, headers: Record<string, string>): Reply {
	return { ...reply, headers: { ...reply.headers, ...headers } };
}

function asStandinError(error: unknown): StandinError {
	if (error instanceof StandinError) return error;
	console.error('[stripe stand-in]', error);
	const message = error instanceof Error ? error.message : String(error);
	return new StandinError(500, `The local Stripe stand-in failed: ${message}`, undefined, undefined, 'api_error');
}

function errorReply(error: unknown): Reply {
	const standin = asStandinError(error);
	return json(standin.status, standin);
}
