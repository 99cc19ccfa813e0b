import { afterEach, describe, expect, it, vi } from 'vitest';
import { LiveResults } from './live-results.svelte';

/** A fetch whose answers the test releases one by one, in any order. */
function heldFetch() {
	const pending: { body: unknown; release: (status: number, answer: unknown) => void }[] = [];
	const fetch = vi.fn((_url: string, init: RequestInit) => {
		const body = init.body ? JSON.parse(String(init.body)) : undefined;
		return new Promise<Response>((resolve, reject) => {
			init.signal?.addEventListener('abort', () => reject(new DOMException('aborted', 'AbortError')));
			pending.push({ body, release: (status, answer) => resolve(new Response(JSON.stringify(answer), { status })) });
		});
	});
	return { fetch, pending };
}

const answer = (lcoe: string) => ({ scenarioId: 's', revision: 1, source: 'draft', result: { metrics: { lcoeReal: lcoe } } });
const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

afterEach(() => {
	vi.useRealTimers();
	vi.unstubAllGlobals();
});

describe('LiveResults', () => {
	it('sends one request for a burst of edits, after the pause', async () => {
		vi.useFakeTimers();
		const held = heldFetch();
		vi.stubGlobal('fetch', held.fetch);
		const live = new LiveResults('s');
		live.request({ v: 1 });
		live.request({ v: 2 });
		live.request({ v: 3 });
		expect(live.updating).toBe(true);
		await vi.advanceTimersByTimeAsync(399);
		expect(held.fetch).not.toHaveBeenCalled();
		await vi.advanceTimersByTimeAsync(1);
		expect(held.fetch).toHaveBeenCalledTimes(1);
		expect(held.pending[0].body).toEqual({ document: { v: 3 } });
	});

	it('keeps the last results while a newer draft is out, and drops an older answer that comes back late', async () => {
		const held = heldFetch();
		vi.stubGlobal('fetch', held.fetch);
		const live = new LiveResults('s');
		live.request({ v: 1 }, 0);
		await settle();
		held.pending[0].release(200, answer('100'));
		await settle();
		await settle();
		expect(live.result?.metrics.lcoeReal).toBe('100');

		// Two drafts in flight: the second overtakes the first (which is aborted) and must win.
		live.request({ v: 2 }, 0);
		await settle();
		live.request({ v: 3 }, 0);
		expect(live.updating).toBe(true);
		expect(live.result?.metrics.lcoeReal).toBe('100');
		await settle();
		held.pending[2].release(200, answer('300'));
		held.pending[1].release(200, answer('200'));
		await settle();
		await settle();
		expect(live.result?.metrics.lcoeReal).toBe('300');
		expect(live.updating).toBe(false);
	});

	it('drops an answer to a draft edited again while it was out', async () => {
		const held = heldFetch();
		vi.stubGlobal('fetch', held.fetch);
		const live = new LiveResults('s');
		live.request({ v: 1 }, 0);
		await settle();
		live.request({ v: 2 }, 50); // still waiting out its pause: the first request is not aborted yet
		held.pending[0].release(200, answer('stale'));
		await settle();
		await settle();
		expect(live.result).toBeNull();
		expect(live.updating).toBe(true);
		await new Promise((resolve) => setTimeout(resolve, 60));
		held.pending[1].release(200, answer('fresh'));
		await settle();
		await settle();
		expect(live.result?.metrics.lcoeReal).toBe('fresh');
		expect(live.updating).toBe(false);
	});

	it('keeps the last results and names the fields when a draft is refused', async () => {
		const held = heldFetch();
		vi.stubGlobal('fetch', held.fetch);
		const live = new LiveResults('s');
		live.request({ v: 1 }, 0);
		await settle();
		held.pending[0].release(200, answer('100'));
		await settle();
		await settle();
		live.request({ v: 'bad' }, 0);
		await settle();
		held.pending[1].release(422, { error: { message: 'The scenario document has problems in the fields listed.', issues: [{ path: 'document.v', message: 'Enter a number.' }] } });
		await settle();
		await settle();
		expect(live.result?.metrics.lcoeReal).toBe('100');
		expect(live.problem).toMatch(/problems/);
		expect(live.issues).toEqual([{ path: 'document.v', message: 'Enter a number.' }]);
	});
});
