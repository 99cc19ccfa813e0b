import { authorize } from '$lib/server/auth/access';
import { localeFromAcceptLanguage } from '$lib/locale/locales';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	return {
		workspace: { id: membership.workspaceId, name: membership.workspaceName, role: membership.role },
		// The workspace's own number and date style overrides the reader's browser languages.
		locale: membership.numberLocale ?? localeFromAcceptLanguage(event.request.headers.get('accept-language'))
	};
};
