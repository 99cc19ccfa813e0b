/**
 * A workspace's own settings, changed by an owner with a line in the audit
 * log: for now how its pages write numbers and dates.
 */
import { z } from 'zod';
import { setWorkspaceNumberLocale } from '../db/memberships';
import { NUMBER_LOCALES, type NumberLocale } from '../../locale/locales';
import { recordWorkspaceEvent, type Actor } from './audit-trail';

/** The form's value: a locale tag, or "reader" for each reader's own browser languages. */
export const READERS_OWN = 'reader';

export const numberLocaleForm = z.object({
	numberLocale: z.enum([READERS_OWN, ...NUMBER_LOCALES], { error: 'Choose one of the number and date styles listed.' })
});

/** Sets the style; records the change (from and to, as tags or "reader") only when it is one. */
export async function changeNumberLocale(actor: Actor, chosen: NumberLocale | typeof READERS_OWN): Promise<boolean> {
	const before = actor.access.membership.numberLocale;
	const after = chosen === READERS_OWN ? null : chosen;
	if (before === after) return false;
	await setWorkspaceNumberLocale(actor.access.membership.workspaceId, after);
	await recordWorkspaceEvent(actor, 'workspace-settings-changed', { setting: 'numberLocale', from: before ?? READERS_OWN, to: after ?? READERS_OWN });
	return true;
}
