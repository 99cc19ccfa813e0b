/**
 * The number and date styles the app reads and writes: a short list of
 * locales whose grouping and decimal marks differ, so a team can read
 * figures the way its reports are written. Safe in the browser.
 */
import { z } from 'zod';

export const NUMBER_LOCALES = ['en-GB', 'en-US', 'de-DE', 'fr-FR', 'es-ES', 'nl-NL', 'nb-NO'] as const;
export const numberLocaleSchema = z.enum(NUMBER_LOCALES);
export type NumberLocale = z.infer<typeof numberLocaleSchema>;

/** The house style where nobody has said otherwise: 1,234,567.8 and 9 Dec 2026. */
export const DEFAULT_LOCALE: NumberLocale = 'en-GB';

/** The supported locale closest to an Accept-Language header: an exact tag first, then the first language we write in; else the house style. */
export function localeFromAcceptLanguage(header: string | null | undefined): NumberLocale {
	if (!header) return DEFAULT_LOCALE;
	const wanted = header
		.split(',')
		.map((part, order) => {
			const [tag, ...params] = part.trim().split(';');
			const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
			return { tag: tag.trim().toLowerCase(), weight: q ? Number(q.slice(2)) : 1, order };
		})
		.filter((w) => w.tag !== '' && w.tag !== '*' && Number.isFinite(w.weight) && w.weight > 0)
		.sort((a, b) => b.weight - a.weight || a.order - b.order);
	for (const { tag } of wanted) {
		const exact = NUMBER_LOCALES.find((l) => l.toLowerCase() === tag);
		if (exact) return exact;
		const sameLanguage = NUMBER_LOCALES.find((l) => l.slice(0, 2).toLowerCase() === tag.slice(0, 2));
		if (sameLanguage) return sameLanguage;
	}
	return DEFAULT_LOCALE;
}

const marks = new Map<NumberLocale, { group: string; decimal: string }>();

/** The marks a locale writes: group ("," in 1,234) and decimal ("." in 0.5). */
export function numberMarks(locale: NumberLocale): { group: string; decimal: string } {
	let found = marks.get(locale);
	if (!found) {
		const parts = new Intl.NumberFormat(locale, { useGrouping: true }).formatToParts(1234567.5);
		found = {
			group: parts.find((p) => p.type === 'group')?.value ?? ',',
			decimal: parts.find((p) => p.type === 'decimal')?.value ?? '.'
		};
		marks.set(locale, found);
	}
	return found;
}

const languageNames = new Intl.DisplayNames(['en'], { type: 'language', languageDisplay: 'standard' });

/** A locale tag in words: "German (Germany)"; the tag itself when it names no language. */
export function localeName(tag: string): string {
	try {
		return languageNames.of(tag) ?? tag;
	} catch {
		return tag;
	}
}

/** "German (Germany): 1.234.567,89 · 9 Dec 2026 written 09.12.2026" style choice label. */
export function localeChoiceLabel(locale: NumberLocale): string {
	const number = new Intl.NumberFormat(locale, { minimumFractionDigits: 2 }).format(1234567.89);
	const date = new Intl.DateTimeFormat(locale, { dateStyle: 'medium' }).format(new Date(Date.UTC(2026, 11, 9, 12)));
	return `${localeName(locale)}: ${number} · ${date}`;
}
