/**
 * Keyset pages: a list query asks for `limit + 1` rows after the last key
 * handed out, in a total order (the list's sort columns, then the id), so a
 * page never repeats or skips a row however many rows come before it.
 */

export interface KeysetPage<T, K> {
	items: T[];
	/** The sort key of the last item, to go on after; null when this page is the last. */
	nextKey: K | null;
}

export interface KeysetRequest<K> {
	limit: number;
	/** The sort key of the last item of the previous page; null for the first page. */
	after: K | null;
}

/** Splits the `limit + 1` rows a keyset query fetched into the page and the key to go on after. */
export function keysetPage<T, K>(rows: T[], limit: number, keyOf: (row: T) => K): KeysetPage<T, K> {
	if (rows.length <= limit) return { items: rows, nextKey: null };
	const items = rows.slice(0, limit);
	return { items, nextKey: keyOf(items[items.length - 1]) };
}

/**
 * A timestamp as Postgres stores it, to the microsecond (a JavaScript Date
 * keeps milliseconds only, so a key made from one could skip rows).
 */
export const exactTimestamp = (column: string) => `to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

/** The shape of an `exactTimestamp` key, for checking keys that come back in cursors. */
export const exactTimestampPattern = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;
