import { fail } from '@sveltejs/kit';
import { forgotPasswordForm } from '$lib/schemas/account';
import { requestPasswordReset } from '$lib/server/auth/accounts';
import { fieldErrors, readForm, requestContext } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const fields = await readForm(event.request);
		const parsed = forgotPasswordForm.safeParse(fields);
		if (!parsed.success) return fail(400, { email: fields.email ?? '', errors: fieldErrors(parsed.error), sent: false });
		await requestPasswordReset(parsed.data.email, requestContext(event));
		return { email: parsed.data.email, errors: {} as Record<string, string>, sent: true };
	}
};
