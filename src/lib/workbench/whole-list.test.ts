import { describe, expect, it } from 'vitest';
import type { ApiAnswer } from './api-client';
import { fetchWholeList, pageUrl } from './whole-list';

describe('pageUrl', () => {
	it('adds the largest page and the cursor to the list’s own query', () => {
		expect(pageUrl('/api/v1/projects/p/scenarios', null)).toBe('/api/v1/projects/p/scenarios?limit=500');
		expect(pageUrl('/api/v1/projects/p/scenarios?archived=1', 'a+b/c=')).toBe('/api/v1/projects/p/scenarios?archived=1&limit=500&cursor=a%2Bb%2Fc%3D');
	});
});

describe('fetchWholeList', () => {
	/** A list of seven served three at a time, as the paged routes answer. */
	function threeAtATime(asked: string[]) {
		return async <B>(url: string): Promise<ApiAnswer<B>> => {
			asked.push(url);
			const start = Number(new URL(url, 'http://x').searchParams.get('cursor') ?? 0);
			const items = [1, 2, 3, 4, 5, 6, 7].slice(start, start + 3);
			const next = start + 3 < 7 ? String(start + 3) : null;
			return { ok: true, status: 200, body: { project: 'p', items, nextCursor: next } as B };
		};
	}

	it('joins every page in order and keeps the first page’s other fields', async () => {
		const asked: string[] = [];
		const answer = await fetchWholeList<{ project: string; items: number[]; nextCursor: string | null }, 'items'>('/list', 'items', threeAtATime(asked));
		expect(answer).toEqual({ ok: true, status: 200, body: { project: 'p', items: [1, 2, 3, 4, 5, 6, 7], nextCursor: null } });
		expect(asked).toEqual(['/list?limit=500', '/list?limit=500&cursor=3', '/list?limit=500&cursor=6']);
	});

	it('answers the first refusal as it came', async () => {
		const refusal = { ok: false as const, status: 422, message: 'The paging parameters need attention.', issues: [{ path: 'cursor', message: 'x' }], details: {} };
		const answer = await fetchWholeList<{ items: number[]; nextCursor: string | null }, 'items'>('/list', 'items', async () => refusal);
		expect(answer).toEqual(refusal);
	});
});
