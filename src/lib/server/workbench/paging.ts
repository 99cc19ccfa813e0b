/**
 * Keyset paging for the API's lists. A page is asked for with `?limit=` and
 * `?cursor=`; the cursor is the sort key of the last item handed out, with
 * the list's name, as base64url JSON. It is opaque to callers: a cursor that
 * does not decode to a key of the same list is refused (422, `cursor`), so a
 * page never starts anywhere a previous page did not end.
 */
import { z } from 'zod';
import { DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE } from '../../schemas/paging';
import type { KeysetRequest } from '../db/keyset';
import { ApiProblem } from './api-route';

export function encodeCursor(list: string, key: unknown): string {
	return Buffer.from(JSON.stringify([list, key]), 'utf8').toString('base64url');
}

function decodeCursor<K>(list: string, cursor: string, keySchema: z.ZodType<K>): K | null {
	if (!/^[A-Za-z0-9_-]{1,2000}$/.test(cursor)) return null;
	let decoded: unknown;
	try {
		decoded = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'));
	} catch {
		return null;
	}
	if (!Array.isArray(decoded) || decoded.length !== 2 || decoded[0] !== list) return null;
	const key = keySchema.safeParse(decoded[1]);
	return key.success ? key.data : null;
}

/** `?limit=` and `?cursor=` of a list request, each refused by name when it is not one this list takes. */
export function readPageRequest<K>(url: URL, list: string, keySchema: z.ZodType<K>): KeysetRequest<K> {
	const issues: { path: string; message: string }[] = [];
	const limitText = url.searchParams.get('limit');
	let limit = DEFAULT_PAGE_SIZE;
	if (limitText !== null) {
		limit = /^\d{1,6}$/.test(limitText) ? Number(limitText) : Number.NaN;
		if (!(limit >= 1 && limit <= MAX_PAGE_SIZE)) issues.push({ path: 'limit', message: `a whole number from 1 to ${MAX_PAGE_SIZE}` });
	}
	const cursor = url.searchParams.get('cursor');
	let after: K | null = null;
	if (cursor !== null) {
		after = decodeCursor(list, cursor, keySchema);
		if (after === null) issues.push({ path: 'cursor', message: 'not a cursor this list gave out: send the nextCursor of the previous page as it came, or leave it out to start again' });
	}
	if (issues.length > 0) throw new ApiProblem(422, 'The paging parameters need attention.', issues);
	return { limit, after };
}

/** The cursor to answer for the key to go on after, null on the last page. */
export function nextCursor(list: string, key: unknown): string | null {
	return key === null ? null : encodeCursor(list, key);
}
