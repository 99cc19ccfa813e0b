/**
 * A whole list from a paged API route, for pages that show all of it: asks
 * for the largest pages and follows `nextCursor` until it is null.
 */
import { callApi, type ApiAnswer } from './api-client';
import { MAX_PAGE_SIZE } from '../schemas/paging';

type PagedBody = { nextCursor: string | null };
type GetPage = <B>(url: string) => Promise<ApiAnswer<B>>;

const get: GetPage = (url) => callApi('GET', url);

/** The URL of one page: the list's own query (such as `?archived=1`) plus limit and cursor. */
export function pageUrl(url: string, cursor: string | null): string {
	const query = `limit=${MAX_PAGE_SIZE}${cursor === null ? '' : `&cursor=${encodeURIComponent(cursor)}`}`;
	return `${url}${url.includes('?') ? '&' : '?'}${query}`;
}

/**
 * Every page of the list in `field` joined in order, with the other fields of
 * the first page; the first refusal met is answered as it came.
 */
export async function fetchWholeList<B extends PagedBody, F extends keyof B>(url: string, field: F, getPage: GetPage = get): Promise<ApiAnswer<B>> {
	const first = await getPage<B>(pageUrl(url, null));
	if (!first.ok) return first;
	const items = [...(first.body[field] as unknown[])];
	let cursor = first.body.nextCursor;
	while (cursor !== null) {
		const next: ApiAnswer<B> = await getPage<B>(pageUrl(url, cursor));
		if (!next.ok) return next;
		items.push(...(next.body[field] as unknown[]));
		cursor = next.body.nextCursor;
	}
	return { ok: true, status: first.status, body: { ...first.body, [field]: items, nextCursor: null } };
}
