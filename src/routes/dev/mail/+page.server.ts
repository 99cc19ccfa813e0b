import { error } from '@sveltejs/kit';
import { devInboxEnabled, listSinkMessages } from '$lib/server/mail/dev-inbox';
import type { PageServerLoad } from './$types';

// Only beside the local mail sink (hooks.server.ts answers 404 otherwise); it shows every message sent.
export const load: PageServerLoad = async () => {
	if (!devInboxEnabled()) error(404, 'Not found');
	return { messages: await listSinkMessages() };
};
