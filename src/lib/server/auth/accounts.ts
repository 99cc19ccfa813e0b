/**
 * The account journeys (sign up, sign in, verify, reset, change password),
 * independent of the pages that call them. Each returns a typed outcome the
 * form action turns into words beside the field.
 *
 * Nothing a stranger can ask tells whether an address has an account.
 * Sign-up and forgot-password answer the same words after the same work for
 * any address; what differs (a new account and its confirmation link, a note
 * to the address's owner, a reset link or nothing) happens after the answer
 * (after-response.ts). A new account signs in once its address is confirmed,
 * so signing in with the password just chosen tells nothing either.
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
	normaliseEmail,
	updatePasswordHash
} from '../db/users';
import { createWorkspaceWithOwner } from '../db/workspaces';
import { recordAuditEvent } from '../db/audit';
import { sendMail } from '../mail/mailer';
import { existingAccountMessage, passwordResetMessage, verifyEmailMessage } from '../mail/templates';
import { afterResponse } from '../after-response';
import { consumeEmailToken, createEmailToken, peekEmailToken, tokenLifetimesMs, tokenProblemWords } from './email-tokens';
import { decoyPasswordHash, hashPassword, passwordProblem, verifyPasswordHash } from './password';
import { waitInWords } from './rate-limit';
import { clearSignInLimits, reserveSignInAttempt, signInSucceeded, type SignInRefusal } from './sign-in-limits';
import { takeConfirmationMailAllowance, takeResetMailAllowance, takeSignUpAllowance } from './mail-limits';
import { knownDeviceOf, rememberDevice } from './known-devices';
import { createSession, generateSessionToken, invalidateUserSessions, type Session } from './session';

export interface RequestContext {
	ip: string;
	userAgent: string;
	origin: string;
}

export type FieldErrors = Partial<Record<string, string>>;

export const SIGN_IN_REFUSED =
	'That e-mail and password do not match a confirmed account. Made the account just now? Open the link we mailed you first.';

export const CONFIRMATION_HOURS = tokenLifetimesMs['verify-email'] / 3_600_000;

async function sendVerificationMail(userId: string, email: string, name: string, origin: string) {
	const token = await createEmailToken(userId, email, 'verify-email');
	await sendMail(email, verifyEmailMessage({ name, url: `${origin}/verify-email/${token}`, hoursValid: CONFIRMATION_HOURS }));
}

type NewAccount = { email: string; name: string; passwordHash: string; workspaceName?: string };

/** Makes the user (and, unless told not to, a workspace it owns); `exists` when the address already has an account. */
async function createAccount(
	input: NewAccount,
	context: RequestContext,
	options: { emailVerified: boolean; createWorkspace: boolean }
): Promise<{ ok: true; userId: string; email: string; workspaceId: string | null } | { ok: false; exists: true }> {
	let user;
	try {
		user = await createUser({ email: input.email, name: input.name, passwordHash: input.passwordHash, emailVerified: options.emailVerified });
	} catch (error) {
		if (isUniqueViolation(error)) return { ok: false, exists: true };
		throw error;
	}
	let workspaceId: string | null = null;
	if (options.createWorkspace) {
		const workspace = await createWorkspaceWithOwner(input.workspaceName?.trim() || `${input.name.trim()}’s workspace`, user.id);
		workspaceId = workspace.id;
	}
	await recordAuditEvent({ event: 'sign-up', actorUserId: user.id, actorEmail: user.email, ip: context.ip, workspaceId });
	return { ok: true, userId: user.id, email: user.email, workspaceId };
}

export type SignUpOutcome =
	| { ok: true; email: string; delivery: Promise<void> }
	| { ok: false; errors: FieldErrors; message: string | null; limited: boolean };

/**
 * Asks for an account. The answer, and the work before it (the limits, the
 * password hash), are the same whether or not the address has an account.
 * After the answer, either the account is made, unconfirmed, with its
 * confirmation link, or the address's owner is told someone tried. The
 * returned `delivery` settles when that is done.
 */
export async function signUp(input: { email: string; name: string; password: string; workspaceName?: string }, context: RequestContext): Promise<SignUpOutcome> {
	const problem = passwordProblem(input.password, { email: input.email, name: input.name });
	if (problem) return { ok: false, errors: { password: problem }, message: null, limited: false };
	const allowance = await takeSignUpAllowance(input.email, context.ip);
	if (!allowance.allowed) {
		const message = `Too many sign-ups for this address or from this network. Try again in ${waitInWords(allowance.retryAfterSeconds)}.`;
		return { ok: false, errors: {}, message, limited: true };
	}
	const account: NewAccount = {
		email: normaliseEmail(input.email),
		name: input.name,
		passwordHash: await hashPassword(input.password),
		workspaceName: input.workspaceName
	};
	return { ok: true, email: account.email, delivery: afterResponse('Sign-up', () => completeSignUp(account, context)) };
}

async function completeSignUp(account: NewAccount, context: RequestContext): Promise<void> {
	const created = await createAccount(account, context, { emailVerified: false, createWorkspace: true });
	if (created.ok) {
		// The address as stored (lower case): the verification token must carry the same one.
		await sendVerificationMail(created.userId, created.email, account.name, context.origin);
		return;
	}
	const owner = await getUserByEmail(account.email);
	if (!owner) return;
	await recordAuditEvent({ event: 'sign-up-existing-address', actorUserId: owner.id, actorEmail: owner.email, ip: context.ip });
	// Most likely its owner again, who lost the first link: a new one serves them best.
	if (!owner.email_verified_at) {
		await resendVerification(owner.id, context.origin);
		return;
	}
	await sendMail(
		owner.email,
		existingAccountMessage({ name: owner.name, signInUrl: `${context.origin}/signin`, resetUrl: `${context.origin}/forgot-password` })
	);
}

/**
 * An invited person's new account. The invitation reached this mailbox, so the
 * address counts as confirmed and the account is signed in at once; only the
 * holder of the invitation link learns whether the address had an account.
 */
export async function signUpInvited(
	input: { email: string; name: string; password: string },
	context: RequestContext
): Promise<{ ok: true; userId: string; sessionToken: string; session: Session } | { ok: false; errors: FieldErrors }> {
	const problem = passwordProblem(input.password, { email: input.email, name: input.name });
	if (problem) return { ok: false, errors: { password: problem } };
	const passwordHash = await hashPassword(input.password);
	const created = await createAccount({ email: input.email, name: input.name, passwordHash }, context, { emailVerified: true, createWorkspace: false });
	if (!created.ok) return { ok: false, errors: { email: 'An account with this e-mail already exists. Sign in, or reset its password.' } };
	const sessionToken = generateSessionToken();
	const session = await createSession(sessionToken, created.userId, { ...context, workspaceId: created.workspaceId });
	return { ok: true, userId: created.userId, sessionToken, session };
}

export type SignInOutcome =
	| { ok: true; userId: string; sessionToken: string; session: Session; device: { token: string; expiresAt: Date } }
	| { ok: false; message: string; delivery?: Promise<void> };

function refusalWords(refusal: SignInRefusal): string {
	const wait = waitInWords(refusal.retryAfterSeconds);
	if (refusal.limit === 'account') {
		return `Too many failed attempts on this account. Try again in ${wait}; a browser you signed in with before is not held up.`;
	}
	return `Too many failed attempts. Try again in ${wait}.`;
}

/**
 * Signs in with a password. `deviceToken` is the browser's device cookie, if
 * any: a browser the account signed in with before is limited on its own, so
 * strangers' failures elsewhere never hold it up (sign-in-limits.ts). An
 * account whose address is not confirmed yet is refused in the same words as
 * a wrong password, and its right password sends a new confirmation link.
 */
export async function signIn(input: { email: string; password: string }, context: RequestContext, deviceToken?: string): Promise<SignInOutcome> {
	const email = normaliseEmail(input.email);
	const credentials = await getUserCredentialsByEmail(email);
	const knownDevice = await knownDeviceOf(deviceToken, credentials?.id ?? null);
	const refusal = await reserveSignInAttempt(email, context.ip, knownDevice);
	if (refusal) {
		await recordAuditEvent({ event: 'sign-in-blocked', actorUserId: credentials?.id ?? null, actorEmail: email, ip: context.ip, detail: { limit: refusal.limit } });
		return { ok: false, message: refusalWords(refusal) };
	}
	// Verify against a decoy when the address is unknown so both answers take as long.
	const valid = await verifyPasswordHash(credentials?.password_hash ?? (await decoyPasswordHash()), input.password);
	if (!credentials || !valid || credentials.email_verified_at === null) {
		const unconfirmed = credentials !== undefined && valid;
		await recordAuditEvent({
			event: 'sign-in-failed',
			actorUserId: credentials?.id ?? null,
			actorEmail: email,
			ip: context.ip,
			detail: { reason: unconfirmed ? 'address not confirmed' : 'wrong e-mail or password' }
		});
		if (!unconfirmed) return { ok: false, message: SIGN_IN_REFUSED };
		const delivery = afterResponse('Confirmation link after sign-in', async () => {
			await resendVerification(credentials.id, context.origin);
		});
		return { ok: false, message: SIGN_IN_REFUSED, delivery };
	}
	await signInSucceeded(email, context.ip, knownDevice);
	const device = await rememberDevice(credentials.id, deviceToken);
	const sessionToken = generateSessionToken();
	const session = await createSession(sessionToken, credentials.id, context);
	await recordAuditEvent({ event: 'sign-in', actorUserId: credentials.id, actorEmail: credentials.email, ip: context.ip });
	return { ok: true, userId: credentials.id, sessionToken, session, device };
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

/** A new confirmation link, at most three an hour; the words say how long to wait when the allowance is used up. */
export async function resendVerification(userId: string, origin: string): Promise<{ ok: true } | { ok: false; message: string }> {
	const user = await getUserById(userId);
	if (!user || user.email_verified_at) return { ok: true };
	const allowance = await takeConfirmationMailAllowance(user.id);
	if (!allowance.allowed) {
		return { ok: false, message: `You asked for a new link three times in the last hour. Use the newest one, or ask again in ${waitInWords(allowance.retryAfterSeconds)}.` };
	}
	await sendVerificationMail(user.id, user.email, user.name, origin);
	return { ok: true };
}

/**
 * Asks for a reset link. Answers at once, the same for any address: looking
 * the address up, the audit record, the allowance, the token and the mail all
 * happen after the answer. The returned `delivery` settles when they are done.
 */
export function requestPasswordReset(email: string, context: RequestContext): { delivery: Promise<void> } {
	const typed = normaliseEmail(email);
	return { delivery: afterResponse('Password reset request', () => deliverPasswordReset(typed, context)) };
}

async function deliverPasswordReset(email: string, context: RequestContext): Promise<void> {
	const user = await getUserByEmail(email);
	await recordAuditEvent({ event: 'password-reset-requested', actorUserId: user?.id ?? null, actorEmail: email, ip: context.ip });
	const allowance = await takeResetMailAllowance(email);
	if (!user || !allowance.allowed) return;
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
): Promise<{ ok: true; userId: string } | { ok: false; errors: FieldErrors; tokenDead?: boolean }> {
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
	// The mailbox's owner chose this password: no stranger's failures hold the account back any more.
	await clearSignInLimits(outcome.email);
	return { ok: true, userId: outcome.userId };
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
