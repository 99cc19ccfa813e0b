import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { nameField, passwordField } from '$lib/schemas/account';
import { getInvitationByToken } from '$lib/server/db/invitations';
import { acceptInvitationAs, invitationProblem } from '$lib/server/auth/invitations';
import { signUpInvited } from '$lib/server/auth/accounts';
import { setSessionCookie } from '$lib/server/auth/session';
import { cookiesAreSecure } from '$lib/server/settings';
import { getUserByEmail } from '$lib/server/db/users';
import { fieldErrors, readForm, requestContext } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const invitation = await getInvitationByToken(params.token);
	const problem = invitationProblem(invitation);
	if (problem || !invitation) return { problem, invitation: null, signedInAs: locals.user?.email ?? null, accountExists: false, here: url.pathname };
	const accountExists = Boolean(await getUserByEmail(invitation.email));
	return {
		problem: null,
		invitation: {
			workspaceName: invitation.workspaceName,
			role: invitation.role,
			email: invitation.email,
			inviterName: invitation.inviterName
		},
		signedInAs: locals.user?.email ?? null,
		accountExists,
		here: url.pathname
	};
};

const joinForm = z.object({ name: nameField, password: passwordField });

export const actions: Actions = {
	accept: async (event) => {
		const { user, session } = event.locals;
		if (!user || !session) redirect(303, `/signin?next=${encodeURIComponent(event.url.pathname)}`);
		const outcome = await acceptInvitationAs(event.params.token, user, session.id, event.getClientAddress());
		if (!outcome.ok) return fail(400, { message: outcome.message, errors: {} as Record<string, string>, name: '' });
		redirect(303, `/app/w/${outcome.invitation.workspaceId}`);
	},
	join: async (event) => {
		const invitation = await getInvitationByToken(event.params.token);
		const problem = invitationProblem(invitation);
		if (problem || !invitation) return fail(400, { message: problem, errors: {} as Record<string, string>, name: '' });
		const fields = await readForm(event.request);
		const parsed = joinForm.safeParse(fields);
		if (!parsed.success) return fail(400, { message: null, errors: fieldErrors(parsed.error), name: fields.name ?? '' });

		// The invitation reached this mailbox, so the address counts as confirmed.
		const created = await signUpInvited({ email: invitation.email, name: parsed.data.name, password: parsed.data.password }, requestContext(event));
		if (!created.ok) return fail(400, { message: created.errors.email ?? null, errors: created.errors as Record<string, string>, name: parsed.data.name });
		setSessionCookie(event.cookies, created.sessionToken, created.session.expiresAt, cookiesAreSecure(event.url));
		const user = { id: created.userId, email: invitation.email, name: parsed.data.name, emailVerified: true };
		const outcome = await acceptInvitationAs(event.params.token, user, created.session.id, event.getClientAddress());
		if (!outcome.ok) return fail(400, { message: outcome.message, errors: {} as Record<string, string>, name: '' });
		redirect(303, `/app/w/${outcome.invitation.workspaceId}`);
	}
};
