import { fail, redirect } from '@sveltejs/kit';
import { signUpForm } from '$lib/schemas/account';
import { signUp } from '$lib/server/auth/accounts';
import { setSessionCookie } from '$lib/server/auth/session';
import { cookiesAreSecure } from '$lib/server/settings';
import { fieldErrors, readForm, requestContext } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/app');
};

export const actions: Actions = {
	default: async (event) => {
		const fields = await readForm(event.request);
		const echo = { name: fields.name ?? '', email: fields.email ?? '', workspaceName: fields.workspaceName ?? '' };
		const parsed = signUpForm.safeParse(fields);
		if (!parsed.success) return fail(400, { ...echo, errors: fieldErrors(parsed.error) });

		const outcome = await signUp(parsed.data, requestContext(event));
		if (!outcome.ok) return fail(400, { ...echo, errors: outcome.errors });
		setSessionCookie(event.cookies, outcome.sessionToken, outcome.session.expiresAt, cookiesAreSecure(event.url));
		redirect(303, '/app?welcome=1');
	}
};
