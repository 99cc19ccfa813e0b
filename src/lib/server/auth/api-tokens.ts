/**
 * Personal API tokens: `tw_` and 160 random bits in base32, shown once; the
 * database keeps only the sha256. A token acts for its member in one
 * workspace with exactly the member's current role there, never more, and a
 * read-only token at most as a viewer. Its use is rate-limited per token and
 * written to the workspace's audit log.
 */
import type { RateLimiterPostgres } from 'rate-limiter-flexible';
import { z } from 'zod';
import { findTokenHolder, insertApiToken, recordTokenUse, revokeTokenOfUser, type TokenAccess } from '../db/api-tokens';
import { getMembership } from '../db/memberships';
import { recordAuditEvent } from '../db/audit';
import { generateRandomToken, hashToken } from './tokens';
import { storedLimiter, take, type Take } from './rate-limit';
import type { ApiTokenPrincipal } from './principal';

export const API_TOKEN_PREFIX = 'tw_';
const tokenPattern = /^tw_[a-z2-7]{32}$/;
const DAY_MS = 24 * 60 * 60 * 1000;
export const tokenLifetimesDays = [7, 30, 90, 365] as const;
/** Requests a token may make per minute before it gets 429. */
export const TOKEN_REQUESTS_PER_MINUTE = 240;

export const newTokenForm = z.object({
	name: z.string().trim().min(1, 'Give the token a name, such as the script that will use it.').max(80, 'At most 80 characters.'),
	workspaceId: z.uuid('Choose a workspace.'),
	access: z.enum(['read', 'read-write'], { message: 'Choose read-only or read and write.' }),
	lifetimeDays: z.coerce
		.number()
		.refine((days) => (tokenLifetimesDays as readonly number[]).includes(days), 'Choose how long the token lasts.')
});
export type NewTokenForm = z.output<typeof newTokenForm>;

export type CreateTokenOutcome =
	| { ok: true; token: string; id: string; expiresAt: Date }
	| { ok: false; field: 'workspaceId' | 'access'; message: string };

export async function createApiToken(userId: string, form: NewTokenForm, now = new Date()): Promise<CreateTokenOutcome> {
	const membership = await getMembership(form.workspaceId, userId);
	if (!membership) return { ok: false, field: 'workspaceId', message: 'You are not a member of that workspace.' };
	if (form.access === 'read-write' && membership.role === 'viewer') {
		return { ok: false, field: 'access', message: `You are a viewer in ${membership.workspaceName}: a token there can only read.` };
	}
	const token = API_TOKEN_PREFIX + generateRandomToken();
	const expiresAt = new Date(now.getTime() + form.lifetimeDays * DAY_MS);
	const id = await insertApiToken({
		userId,
		workspaceId: form.workspaceId,
		name: form.name,
		tokenHash: hashToken(token),
		hint: token.slice(0, 7),
		access: form.access,
		expiresAt
	});
	return { ok: true, token, id, expiresAt };
}

export async function revokeApiToken(userId: string, tokenId: string): Promise<{ workspaceId: string; name: string } | undefined> {
	if (!z.uuid().safeParse(tokenId).success) return undefined;
	return revokeTokenOfUser(userId, tokenId);
}

/** `Authorization: Bearer <token>` -> the token; null when the header is absent or another scheme. */
export function bearerToken(request: Request): string | null {
	const header = request.headers.get('authorization');
	if (!header) return null;
	const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
	return match ? match[1] : '';
}

/** A refusal of a token the database knows (revoked, expired, orphaned) names it, so the refusal can be logged. */
export type TokenAuthentication =
	| { ok: true; principal: ApiTokenPrincipal }
	| { ok: false; message: string; known?: { tokenId: string; tokenName: string; workspaceId: string; userId: string; email: string; reason: string } };

export async function authenticateApiToken(token: string, now = new Date()): Promise<TokenAuthentication> {
	const invalid = { ok: false as const, message: 'This API token is not valid. Create one on your account page and send it in the header Authorization: Bearer tw_...' };
	if (!tokenPattern.test(token)) return invalid;
	const holder = await findTokenHolder(hashToken(token));
	if (!holder) return invalid;
	const known = (reason: string) => ({
		tokenId: holder.tokenId,
		tokenName: holder.tokenName,
		workspaceId: holder.workspaceId,
		userId: holder.user.id,
		email: holder.user.email,
		reason
	});
	if (holder.revokedAt) return { ok: false, message: 'This API token was revoked.', known: known('revoked') };
	if (now.getTime() >= new Date(holder.expiresAt).getTime()) {
		return { ok: false, message: 'This API token has expired. Create a new one on your account page.', known: known('expired') };
	}
	if (!holder.role) return { ok: false, message: 'The owner of this API token is no longer a member of its workspace.', known: known('member left') };
	return {
		ok: true,
		principal: {
			kind: 'token',
			user: holder.user,
			token: { id: holder.tokenId, name: holder.tokenName, access: holder.access as TokenAccess, workspaceId: holder.workspaceId }
		}
	};
}

let limiter: RateLimiterPostgres | undefined;

/** Takes one request from the token's allowance; answers the seconds to wait when it is used up. */
export async function takeTokenRequest(tokenId: string): Promise<Take> {
	limiter ??= storedLimiter('api-token', TOKEN_REQUESTS_PER_MINUTE, 60);
	return take(limiter, tokenId);
}

/** A refused call with a token the workspace once issued: worth a line in its security log. */
export async function recordRefusedToken(
	known: NonNullable<Extract<TokenAuthentication, { ok: false }>['known']>,
	request: { method: string; path: string; ip: string }
): Promise<void> {
	await recordAuditEvent({
		event: 'api-token-refused',
		workspaceId: known.workspaceId,
		actorUserId: known.userId,
		actorEmail: known.email,
		ip: request.ip,
		detail: { token: known.tokenName, tokenId: known.tokenId, reason: known.reason, method: request.method, path: request.path, status: 401 }
	});
}

/** The audit line for one token request, and the token's last use. */
export async function recordTokenRequest(
	principal: ApiTokenPrincipal,
	request: { method: string; path: string; status: number; ip: string }
): Promise<void> {
	await recordAuditEvent({
		event: 'api-token-used',
		workspaceId: principal.token.workspaceId,
		actorUserId: principal.user.id,
		actorEmail: principal.user.email,
		ip: request.ip,
		detail: { token: principal.token.name, tokenId: principal.token.id, method: request.method, path: request.path, status: request.status }
	});
	await recordTokenUse(principal.token.id, request.ip);
}
