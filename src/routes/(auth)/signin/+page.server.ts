import { fail, redirect } from '@sveltejs/kit';
import { signInForm } from '$lib/schemas/account';
import { signIn } from '$lib/server/auth/accounts';
import { setSessionCookie } from '$lib/server/auth/session';
import { DEVICE_COOKIE, setDeviceCookie } from '$lib/server/auth/known-devices';
import { cookiesAreSecure } from '$lib/server/settings';
import { fieldErrors, readForm, requestContext, safeNextPath } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const next = safeNextPath(url.searchParams.get('next'), url.origin);
	if (locals.user) redirect(303, next);
	return { next, notice: url.searchParams.get('notice') };
};

export const actions: Actions = {
	default: async (event) => {
		const fields = await readForm(event.request);
		const echo = { email: fields.email ?? '', next: safeNextPath(fields.next, event.url.origin) };
		const parsed = signInForm.safeParse(fields);
		if (!parsed.success) return fail(400, { ...echo, errors: fieldErrors(parsed.error), message: null });

		// The device cookie lets this browser's right password through while strangers' failures slow the account down.
		const outcome = await signIn(parsed.data, requestContext(event), event.cookies.get(DEVICE_COOKIE));
		if (!outcome.ok) return fail(400, { ...echo, errors: {} as Record<string, string>, message: outcome.message });
		const secure = cookiesAreSecure(event.url);
		setSessionCookie(event.cookies, outcome.sessionToken, outcome.session.expiresAt, secure);
		setDeviceCookie(event.cookies, outcome.device, secure);
		redirect(303, echo.next);
	}
};
