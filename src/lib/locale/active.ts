/**
 * The locale the screens format numbers and dates in. In the browser it is
 * one value, set by the root layout from the page data (the workspace's
 * setting, else the reader's Accept-Language), which renders its pages anew
 * when it changes. On the server pages of several requests render in one
 * process, so hooks.server.ts gives each request its own holder; code outside
 * a page render (exports, PDFs, worker threads, scripts) keeps the house
 * style. Plain TypeScript: worker threads load it too.
 */
import { DEFAULT_LOCALE, type NumberLocale } from './locales';

interface LocaleHolder {
	locale: NumberLocale;
}

const browserHolder: LocaleHolder = { locale: DEFAULT_LOCALE };
let requestHolder: (() => LocaleHolder | undefined) | null = null;

/** Server only: where the current request's holder is found (an AsyncLocalStorage's store). */
export function holdLocalePerRequest(current: () => LocaleHolder | undefined): void {
	requestHolder = current;
}

function holder(): LocaleHolder {
	return requestHolder?.() ?? browserHolder;
}

export function activeLocale(): NumberLocale {
	return holder().locale;
}

export function useLocale(locale: NumberLocale): void {
	holder().locale = locale;
}
