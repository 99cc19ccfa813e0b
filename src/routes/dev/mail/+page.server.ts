import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/access';
import { devInboxEnabled, listSinkMessages } from '$lib/server/mail/dev-inbox';
import type { PageServerLoad } from './$types';

// A local demo's inbox: only beside the local mail sink on loopback (404 otherwise), only to a signed-in user.
export const load: PageServerLoad = async (event) => {
	if (!devInboxEnabled()) error(404, 'Not found');
	requireUser(event);
	return { messages: await listSinkMessages() };
};
