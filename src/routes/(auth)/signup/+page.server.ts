import { fail, redirect } from '@sveltejs/kit';
import { signUpForm } from '$lib/schemas/account';
import { CONFIRMATION_HOURS, signUp } from '$lib/server/auth/accounts';
import { fieldErrors, readForm, requestContext } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/app');
};

export const actions: Actions = {
	// The same answer whether or not the address has an account: the account, or a note to its owner, follows by mail.
	default: async (event) => {
		const fields = await readForm(event.request);
		const echo = { name: fields.name ?? '', email: fields.email ?? '', workspaceName: fields.workspaceName ?? '' };
		const parsed = signUpForm.safeParse(fields);
		if (!parsed.success) return fail(400, { ...echo, errors: fieldErrors(parsed.error), message: null, sentTo: null });

		const outcome = await signUp(parsed.data, requestContext(event));
		if (!outcome.ok) return fail(outcome.limited ? 429 : 400, { ...echo, errors: outcome.errors, message: outcome.message, sentTo: null });
		return { ...echo, errors: {} as Record<string, string>, message: null, sentTo: outcome.email, hoursValid: CONFIRMATION_HOURS };
	}
};
