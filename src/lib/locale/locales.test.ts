import { afterEach, describe, expect, it } from 'vitest';
import { DEFAULT_LOCALE, localeChoiceLabel, localeFromAcceptLanguage, numberMarks } from './locales';
import { activeLocale, useLocale } from './active';
import { formatDate, formatNumber, formatPercent } from '$lib/workbench/format';
import { formatEntry, parseEntry } from '$lib/workbench/number-entry';
import { groupDigits } from '$lib/metrics/format';

afterEach(() => useLocale(DEFAULT_LOCALE));

describe('localeFromAcceptLanguage', () => {
	// Header syntax and q-weights: RFC 9110 §12.5.4 (Accept-Language).
	it('takes the best-weighted language we write in, an exact tag before a same-language one', () => {
		expect(localeFromAcceptLanguage('de-DE,de;q=0.9,en;q=0.8')).toBe('de-DE');
		expect(localeFromAcceptLanguage('fr-CA,fr;q=0.9')).toBe('fr-FR');
		expect(localeFromAcceptLanguage('en-US')).toBe('en-US');
		expect(localeFromAcceptLanguage('en-AU,en;q=0.9')).toBe('en-GB');
		expect(localeFromAcceptLanguage('ja;q=0.4, nl-BE;q=0.7')).toBe('nl-NL');
		expect(localeFromAcceptLanguage('en;q=0.1, de;q=0.9')).toBe('de-DE');
	});

	it('falls back to the house style for nothing, a wildcard, unknown or refused languages', () => {
		for (const header of [null, '', '*', 'ja,zh;q=0.9', 'de;q=0']) expect(localeFromAcceptLanguage(header)).toBe(DEFAULT_LOCALE);
	});
});

describe('numberMarks', () => {
	// Group and decimal symbols of the Unicode CLDR locale data, as Intl reports them.
	it('reads the marks of each style', () => {
		expect(numberMarks('en-GB')).toEqual({ group: ',', decimal: '.' });
		expect(numberMarks('de-DE')).toEqual({ group: '.', decimal: ',' });
		expect(numberMarks('fr-FR')).toEqual({ group: '\u202f', decimal: ',' });
		expect(numberMarks('nb-NO')).toEqual({ group: '\u00a0', decimal: ',' });
	});

	it('labels a choice with a sample figure and date', () => {
		expect(localeChoiceLabel('de-DE')).toBe('German (Germany): 1.234.567,89 · 09.12.2026');
	});
});

describe('the active locale on screens', () => {
	it('writes figures, percentages and dates in the chosen style', () => {
		useLocale('de-DE');
		expect(activeLocale()).toBe('de-DE');
		expect(formatNumber('1234567.891', 2)).toBe('1.234.567,89');
		expect(formatPercent('0.0691')).toBe('6,91 %');
		expect(groupDigits('-1234567.891', 2)).toBe('−1.234.567,89');
		expect(formatDate('2026-12-09T12:00:00Z')).toBe('09.12.2026');
		useLocale('en-US');
		expect(formatDate('2026-12-09T12:00:00Z')).toBe('Dec 9, 2026');
		useLocale('en-GB');
		expect(formatNumber('1234567.891', 2)).toBe('1,234,567.89');
		expect(formatDate('2026-12-09T12:00:00Z')).toBe('9 Dec 2026');
	});

	it('reads typed numbers in the style shown, and a point in a decimal-comma style is a group mark', () => {
		expect(parseEntry('12.000.000', 1, 'de-DE')).toBe(12_000_000);
		expect(parseEntry('87,5', 100, 'de-DE')).toBe(0.875);
		expect(parseEntry('1\u202f234,5', 1, 'fr-FR')).toBe(1234.5);
		expect(parseEntry('1 234,5', 1, 'fr-FR')).toBe(1234.5);
		expect(parseEntry('12,000,000.5', 1, 'en-GB')).toBe(12_000_000.5);
		expect(parseEntry('1,5,', 1, 'de-DE')).toBeNaN();
		expect(formatEntry(0.875, 100, 4, 'de-DE')).toBe('87,5');
		expect(formatEntry(12_000_000, 1, 4, 'de-DE')).toBe('12.000.000');
		// What is shown reads back to the same value in every style.
		for (const locale of ['en-GB', 'en-US', 'de-DE', 'fr-FR', 'es-ES', 'nl-NL', 'nb-NO'] as const) {
			expect(parseEntry(formatEntry(-1234567.25, 1, 4, locale), 1, locale), locale).toBe(-1234567.25);
		}
	});
});
