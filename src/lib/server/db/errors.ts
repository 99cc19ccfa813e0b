/** What a database failure means to the person asking, decided in one place for pages and the API. */

/** The database cannot be reached (down, restarting, pool exhausted). */
export function isDatabaseUnavailable(error: unknown): boolean {
	const text = error instanceof Error ? `${error.name} ${error.message} ${(error as { code?: string }).code ?? ''}` : '';
	return /ECONNREFUSED|ECONNRESET|KnexTimeoutError|57P01|57P03|Connection terminated/i.test(text);
}

/** PostgreSQL refused the bytes of a text (22021: invalid byte sequence, 22P05: untranslatable character such as NUL in jsonb). */
export function isUnstorableTextError(error: unknown): boolean {
	const code = (error as { code?: string } | null)?.code;
	return code === '22021' || code === '22P05';
}

export const DATABASE_UNAVAILABLE_MESSAGE = 'The database is not answering right now. Your saved work is safe; try again in a moment.';
