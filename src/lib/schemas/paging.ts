/**
 * Paging of the API's lists: `?limit=` (1 to 500, 100 when left out) and
 * `?cursor=` (opaque, from the previous page's `nextCursor`). Shared by the
 * routes, the OpenAPI description and the browser, which follows
 * `nextCursor` where a page shows a whole list.
 */
import { z } from 'zod';

export const DEFAULT_PAGE_SIZE = 100;
export const MAX_PAGE_SIZE = 500;

export const pageLimitSchema = z
	.int()
	.min(1)
	.max(MAX_PAGE_SIZE)
	.default(DEFAULT_PAGE_SIZE)
	.describe(`How many items a page holds at most (${DEFAULT_PAGE_SIZE} when left out)`);

export const pageCursorSchema = z
	.string()
	.describe("Where to go on: the previous page's nextCursor, as it came. Leave it out for the first page.");

export const nextCursorSchema = z
	.string()
	.nullable()
	.describe('Send it back as ?cursor= for the next page; null on the last page');
