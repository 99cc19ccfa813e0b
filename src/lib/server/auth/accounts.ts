/**
 * The account journeys (sign up, sign in, verify, reset, change password),
 * independent of the pages that call them. Each returns a typed outcome the
 * form action turns into words beside the field.
 */
import { db } from '../db/knex';
import {
	createUser,
	getPasswordHash,
	getUserById,
	getUserCredentialsByEmail,
	getUserByEmail,
	isUniqueViolation,
	markEmailVerified,
	updatePasswordHash
} from '../db/users';
import { createWorkspaceWithOwner } from '../db/workspaces';
import { recordAuditEvent } from '../db/audit';
import { sendMail } from '../mail/mailer';
import { passwordResetMessage, verifyEmailMessage } from '../mail/templates';
import { consumeEmailToken, createEmailToken, peekEmailToken, tokenLifetimesMs, tokenProblemWords } from './email-tokens';
import { decoyPasswordHash, hashPassword, passwordProblem, verifyPasswordHash } from './password';
import { clearSignInFailures, mayRequestResetMail, reserveSignInAttempt, signInSucceeded } from './rate-limit';
import { createSession, generateSessionToken, invalidateUserSessions, type Session } from './session';

export interface RequestContext {
	ip: string;
	userAgent: string;
	origin: string;
}

export type FieldErrors = Partial<Record<string, string>>;

export const SIGN_IN_REFUSED = 'That e-mail and password do not match an account.';

async function sendVerificationMail(userId: string, email: string, name: string, origin: string) {
	const token = await createEmailToken(userId, email, 'verify-email');
	await sendMail(
		email,
		verifyEmailMessage({ name, url: `${origin}/verify-email/${token}`, hoursValid: tokenLifetimesMs['verify-email'] / 3_600_000 })
	);
}

export async function signUp(
	input: { email: string; name: string; password: string; workspaceName?: string },
	context: RequestContext,
	options: { emailAlreadyVerified?: boolean; createWorkspace?: boolean } = {}
): Promise<{ ok: true; userId: string; sessionToken: string; session: Session } | { ok: false; errors: FieldErrors }> {
	const problem = passwordProblem(input.password, { email: input.email, name: input.name });
	if (problem) return { ok: false, errors: { password: problem } };

	const passwordHash = await hashPassword(input.password);
	let userId: string;
	// The address as stored (lower case): the verification token must carry the same one.
	let email: string;
	try {
		const user = await createUser({
			email: input.email,
			name: input.name,
			passwordHash,
			emailVerified: options.emailAlreadyVerified
		});
		userId = user.id;
		email = user.email;
	} catch (error) {
		if (isUniqueViolation(error)) {
			return { ok: false, errors: { email: 'An account with this e-mail already exists. Sign in, or reset its password.' } };
		}
		throw error;
	}
	let workspaceId: string | null = null;
	if (options.createWorkspace !== false) {
		const workspace = await createWorkspaceWithOwner(input.workspaceName?.trim() || `${input.name.trim()}’s workspace`, userId);
		workspaceId = workspace.id;
	}
	await recordAuditEvent({ event: 'sign-up', actorUserId: userId, actorEmail: email, ip: context.ip, workspaceId });
	if (!options.emailAlreadyVerified) await sendVerificationMail(userId, email, input.name, context.origin);

	const sessionToken = generateSessionToken();
	const session = await createSession(sessionToken, userId, { ...context, workspaceId });
	return { ok: true, userId, sessionToken, session };
}

export type SignInOutcome =
	| { ok: true; userId: string; sessionToken: string; session: Session }
	| { ok: false; message: string };

export async function signIn(input: { email: string; password: string }, context: RequestContext): Promise<SignInOutcome> {
	const email = input.email.trim().toLowerCase();
	const limit = await reserveSignInAttempt(email, context.ip);
	if (limit.blocked) {
		await recordAuditEvent({ event: 'sign-in-blocked', actorEmail: email, ip: context.ip });
		const minutes = Math.max(1, Math.ceil(limit.retryAfterSeconds / 60));
		return { ok: false, message: `Too many failed attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.` };
	}
	const credentials = await getUserCredentialsByEmail(email);
	// Verify against a decoy when the address is unknown so both answers take as long.
	const valid = await verifyPasswordHash(credentials?.password_hash ?? (await decoyPasswordHash()), input.password);
	if (!credentials || !valid) {
		await recordAuditEvent({ event: 'sign-in-failed', actorUserId: credentials?.id ?? null, actorEmail: email, ip: context.ip });
		return { ok: false, message: SIGN_IN_REFUSED };
	}
	await signInSucceeded(email, context.ip);
	const sessionToken = generateSessionToken();
	const session = await createSession(sessionToken, credentials.id, context);
	await recordAuditEvent({ event: 'sign-in', actorUserId: credentials.id, actorEmail: credentials.email, ip: context.ip });
	return { ok: true, userId: credentials.id, sessionToken, session };
}

export async function verifyEmail(token: string, ip: string): Promise<{ ok: true } | { ok: false; message: string }> {
	const outcome = await consumeEmailToken(token, 'verify-email');
	if (!outcome.ok) return { ok: false, message: tokenProblemWords[outcome.reason] };
	const user = await getUserById(outcome.userId);
	if (!user || user.email !== outcome.email) return { ok: false, message: tokenProblemWords.unknown };
	await markEmailVerified(outcome.userId);
	await recordAuditEvent({ event: 'email-verified', actorUserId: outcome.userId, actorEmail: outcome.email, ip });
	return { ok: true };
}

export async function resendVerification(userId: string, origin: string): Promise<void> {
	const user = await getUserById(userId);
	if (!user || user.email_verified_at) return;
	await sendVerificationMail(user.id, user.email, user.name, origin);
}

/** Sends a reset link when the address has an account; answers the same either way. */
export async function requestPasswordReset(email: string, context: RequestContext): Promise<void> {
	const user = await getUserByEmail(email);
	await recordAuditEvent({ event: 'password-reset-requested', actorUserId: user?.id ?? null, actorEmail: email.trim().toLowerCase(), ip: context.ip });
	if (!user || !(await mayRequestResetMail(user.email))) return;
	const token = await createEmailToken(user.id, user.email, 'reset-password');
	await sendMail(
		user.email,
		passwordResetMessage({
			name: user.name,
			url: `${context.origin}/reset-password/${token}`,
			minutesValid: tokenLifetimesMs['reset-password'] / 60_000
		})
	);
}

export async function resetPassword(
	token: string,
	newPassword: string,
	context: RequestContext
): Promise<{ ok: true } | { ok: false; errors: FieldErrors; tokenDead?: boolean }> {
	const peek = await peekEmailToken(token, 'reset-password');
	if (!peek.ok) return { ok: false, errors: { token: tokenProblemWords[peek.reason] }, tokenDead: true };
	const problem = passwordProblem(newPassword, { email: peek.email });
	if (problem) return { ok: false, errors: { password: problem } };
	const passwordHash = await hashPassword(newPassword);

	const outcome = await db().transaction(async (trx) => {
		const spent = await consumeEmailToken(token, 'reset-password', trx);
		if (!spent.ok) return spent;
		await updatePasswordHash(spent.userId, passwordHash, trx);
		await invalidateUserSessions(spent.userId, undefined, trx);
		// The mail reached its owner, so the address is proven too.
		await markEmailVerified(spent.userId, trx);
		await recordAuditEvent({ event: 'password-reset', actorUserId: spent.userId, actorEmail: spent.email, ip: context.ip }, trx);
		return spent;
	});
	if (!outcome.ok) return { ok: false, errors: { token: tokenProblemWords[outcome.reason] }, tokenDead: true };
	await clearSignInFailures(outcome.email);
	return { ok: true };
}

export async function changePassword(
	userId: string,
	email: string,
	currentSessionId: string,
	input: { currentPassword: string; newPassword: string },
	ip: string
): Promise<{ ok: true } | { ok: false; errors: FieldErrors }> {
	const hash = await getPasswordHash(userId);
	if (!hash || !(await verifyPasswordHash(hash, input.currentPassword))) {
		return { ok: false, errors: { currentPassword: 'That is not your current password.' } };
	}
	const problem = passwordProblem(input.newPassword, { email });
	if (problem) return { ok: false, errors: { newPassword: problem } };
	await updatePasswordHash(userId, await hashPassword(input.newPassword));
	await invalidateUserSessions(userId, currentSessionId);
	await recordAuditEvent({ event: 'password-changed', actorUserId: userId, actorEmail: email, ip });
	return { ok: true };
}
