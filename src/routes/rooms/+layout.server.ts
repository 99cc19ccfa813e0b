import type { LayoutServerLoad } from './$types';

/** The room guest signed in, if any (guests have their own cookie, read only under /rooms). */
export const load: LayoutServerLoad = async ({ locals }) => {
	const principal = locals.principal;
	return { guest: principal?.kind === 'guest' ? { email: principal.guest.email, name: principal.guest.name } : null };
};
