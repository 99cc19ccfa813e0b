import { authorize } from '$lib/server/auth/access';
import { localeFromAcceptLanguage } from '$lib/locale/locales';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	// The workspace only: each page below checks its own project, scenario or room (and reads it with its data).
	const { membership } = await authorize(event, { workspaceId: event.params.workspaceId }, 'viewer');
	return {
		workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role },
		// The workspace's own number and date style overrides the reader's browser languages.
		locale: membership.numberLocale ?? localeFromAcceptLanguage(event.request.headers.get('accept-language'))
	};
};
