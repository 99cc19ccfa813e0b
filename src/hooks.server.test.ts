import { afterEach, describe, expect, it, vi } from 'vitest';
import { handleError } from './hooks.server';

type ErrorInput = Parameters<typeof handleError>[0];
const input = (status: number, error: unknown): ErrorInput => ({ error, status, message: 'Refused', event: {} as ErrorInput['event'] });

afterEach(() => vi.restoreAllMocks());

describe('handleError', () => {
	it('does not log refusals below 500 (404, 405, 413) as server errors', async () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		for (const status of [404, 405, 413]) {
			expect(await handleError(input(status, new Error(`status ${status}`)))).toEqual({ message: 'Refused' });
		}
		expect(log).not.toHaveBeenCalled();
	});

	it('logs a real failure with an id, and tells the user the database is down in words', async () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		const down = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54320'), { code: 'ECONNREFUSED' });
		const answer = await handleError(input(500, down));
		expect(answer).toMatchObject({ message: expect.stringContaining('database is not answering'), errorId: expect.any(String) });
		expect(log).toHaveBeenCalledOnce();
	});
});
