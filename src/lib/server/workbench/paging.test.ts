import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ApiProblem } from './api-route';
import { encodeCursor, nextCursor, readPageRequest } from './paging';

const key = z.tuple([z.string(), z.uuid()]);
const id = '00000000-0000-4000-8000-000000000001';
const url = (query: string) => new URL(`http://127.0.0.1/api/v1/x?${query}`);

function refusal(query: string): ApiProblem {
	try {
		readPageRequest(url(query), 'projects', key);
	} catch (e) {
		if (e instanceof ApiProblem) return e;
		throw e;
	}
	throw new Error(`?${query} was accepted`);
}

describe('readPageRequest', () => {
	it('reads 100 items from the start when nothing is asked', () => {
		expect(readPageRequest(url(''), 'projects', key)).toEqual({ limit: 100, after: null });
	});

	it('reads back the key a cursor of the same list carries', () => {
		const cursor = encodeCursor('projects', ['Ness, East', id]);
		expect(readPageRequest(url(`limit=500&cursor=${cursor}`), 'projects', key)).toEqual({ limit: 500, after: ['Ness, East', id] });
	});

	it('refuses a cursor of another list, or of the wrong shape, naming cursor', () => {
		for (const cursor of [encodeCursor('uploads', ['Ness', id]), encodeCursor('projects', ['Ness']), 'x'.repeat(2001), 'a%2Fb']) {
			const problem = refusal(`cursor=${cursor}`);
			expect(problem.status).toBe(422);
			expect(problem.issues.map((i) => i.path)).toEqual(['cursor']);
		}
	});

	it('refuses a limit out of 1 to 500, naming limit, together with a bad cursor', () => {
		expect(refusal('limit=501').issues.map((i) => i.path)).toEqual(['limit']);
		expect(refusal('limit=0&cursor=nope').issues.map((i) => i.path)).toEqual(['limit', 'cursor']);
	});
});

describe('nextCursor', () => {
	it('is null on the last page and a base64url cursor otherwise', () => {
		expect(nextCursor('projects', null)).toBeNull();
		expect(nextCursor('projects', ['Ness', id])).toMatch(/^[A-Za-z0-9_-]+$/);
	});
});
