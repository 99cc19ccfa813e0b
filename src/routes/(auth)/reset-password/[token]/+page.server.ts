import { fail, redirect } from '@sveltejs/kit';
import { resetPasswordForm } from '$lib/schemas/account';
import { resetPassword } from '$lib/server/auth/accounts';
import { peekEmailToken, tokenProblemWords } from '$lib/server/auth/email-tokens';
import { rememberDevice, setDeviceCookie } from '$lib/server/auth/known-devices';
import { cookiesAreSecure } from '$lib/server/settings';
import { fieldErrors, readForm, requestContext } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const check = await peekEmailToken(params.token, 'reset-password');
	return { tokenProblem: check.ok ? null : tokenProblemWords[check.reason] };
};

export const actions: Actions = {
	default: async (event) => {
		const parsed = resetPasswordForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		const outcome = await resetPassword(event.params.token, parsed.data.password, requestContext(event));
		if (!outcome.ok) return fail(400, { errors: outcome.errors });
		// This browser proved the mailbox and knows the new password: let it sign in even while strangers' failures slow the account down.
		setDeviceCookie(event.cookies, await rememberDevice(outcome.userId, undefined), cookiesAreSecure(event.url));
		redirect(303, '/signin?notice=password-reset');
	}
};
