/**
 * Text PostgreSQL cannot store: a NUL character (text and jsonb refuse it) or
 * an unpaired UTF-16 surrogate (not a character at all; the driver would
 * silently turn it into U+FFFD). Found before anything is written, so the
 * caller can name the field instead of failing with a server error.
 */
// eslint-disable-next-line no-control-regex
const unstorable = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export const UNSTORABLE_TEXT_MESSAGE = 'holds a character that cannot be stored (a NUL or an unpaired surrogate): remove it and try again';

export function isStorableText(text: string): boolean {
	return !unstorable.test(text);
}

/** Paths (`document.capex.lines[0].name`) of every string, or object key, in a JSON value that cannot be stored. */
export function unstorableTextPaths(value: unknown, path = ''): string[] {
	if (typeof value === 'string') return isStorableText(value) ? [] : [path === '' ? '(body)' : path];
	if (Array.isArray(value)) return value.flatMap((item, i) => unstorableTextPaths(item, `${path}[${i}]`));
	if (value !== null && typeof value === 'object') {
		return Object.entries(value).flatMap(([key, item]) => {
			const here = path === '' ? key : `${path}.${key}`;
			return isStorableText(key) ? unstorableTextPaths(item, here) : [here];
		});
	}
	return [];
}
