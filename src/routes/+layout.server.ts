import { localeFromAcceptLanguage } from '$lib/locale/locales';
import type { LayoutServerLoad } from './$types';

/** The reader's locale from the browser's languages; a workspace's own setting overrides it in the workspace layout. */
export const load: LayoutServerLoad = ({ request }) => ({ locale: localeFromAcceptLanguage(request.headers.get('accept-language')) });
