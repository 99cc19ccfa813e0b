import { authorize } from '$lib/server/auth/access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await authorize(event, event.params, 'viewer');
	return { welcome: event.url.searchParams.has('welcome') };
};
