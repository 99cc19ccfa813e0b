import { describe, expect, it } from 'vitest';
import { ApiProblem } from './api-route';
import { requireLiveProject } from './live-project';

describe('requireLiveProject', () => {
	it('lets a live project through', () => {
		expect(() => requireLiveProject({ archived_at: null })).not.toThrow();
	});

	it('refuses an archived one with 409 in the one wording, saying since when', () => {
		const archivedAt = new Date('2026-04-02T08:00:00Z');
		let problem: unknown;
		try {
			requireLiveProject({ archived_at: archivedAt });
		} catch (e) {
			problem = e;
		}
		expect(problem).toBeInstanceOf(ApiProblem);
		expect(problem).toMatchObject({ status: 409, message: 'This project is archived: restore it first.', details: { archivedAt: '2026-04-02T08:00:00.000Z' } });
	});
});
