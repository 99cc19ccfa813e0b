/**
 * Each request's own locale holder on the server, so that two pages
 * rendering at once in different locales never format each other's figures.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import type { Handle } from '@sveltejs/kit';
import { holdLocalePerRequest } from '$lib/locale/active';
import { DEFAULT_LOCALE, type NumberLocale } from '$lib/locale/locales';

const requestLocales = new AsyncLocalStorage<{ locale: NumberLocale }>();
holdLocalePerRequest(() => requestLocales.getStore());

/** Every request starts in the house style; the root layout switches its page to the reader's locale while it renders. */
export const scopeLocale: Handle = ({ event, resolve }) => requestLocales.run({ locale: DEFAULT_LOCALE }, () => resolve(event));
