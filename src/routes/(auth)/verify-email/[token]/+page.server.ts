import { fail } from '@sveltejs/kit';
import { verifyEmail } from '$lib/server/auth/accounts';
import { peekEmailToken, tokenProblemWords } from '$lib/server/auth/email-tokens';
import type { Actions, PageServerLoad } from './$types';

// The link only opens this page; the address is confirmed by the button's POST,
// so link scanners that fetch URLs cannot spend the token.
export const load: PageServerLoad = async ({ params, locals }) => {
	const check = await peekEmailToken(params.token, 'verify-email');
	return { tokenProblem: check.ok ? null : tokenProblemWords[check.reason], email: check.ok ? check.email : null, signedIn: locals.user !== null };
};

export const actions: Actions = {
	default: async (event) => {
		const outcome = await verifyEmail(event.params.token, event.getClientAddress());
		if (!outcome.ok) return fail(400, { verified: false, message: outcome.message });
		return { verified: true, message: null };
	}
};
