import { fail } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { actorOf } from '$lib/server/workbench/audit-trail';
import { READERS_OWN, changeNumberLocale, numberLocaleForm } from '$lib/server/workbench/workspace-settings';
import { fieldErrors, readForm } from '$lib/server/forms';
import { NUMBER_LOCALES, localeChoiceLabel, localeFromAcceptLanguage } from '$lib/locale/locales';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { membership } = await authorize(event, event.params, 'viewer');
	const readersOwn = localeFromAcceptLanguage(event.request.headers.get('accept-language'));
	return {
		canChange: membership.role === 'owner',
		numberLocale: membership.numberLocale ?? READERS_OWN,
		localeChoices: [
			{ value: READERS_OWN, label: `Each reader's own, from the browser's languages (yours: ${localeChoiceLabel(readersOwn)})` },
			...NUMBER_LOCALES.map((locale) => ({ value: locale, label: localeChoiceLabel(locale) }))
		]
	};
};

export const actions: Actions = {
	numberLocale: async (event) => {
		const access = await authorize(event, event.params, 'owner');
		const parsed = numberLocaleForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		const changed = await changeNumberLocale(actorOf(event, access), parsed.data.numberLocale);
		return { saved: changed ? 'The number and date style is saved: every page of this workspace now writes figures and dates that way.' : 'Nothing changed: that is the style already in use.' };
	}
};
