import { describe, expect, it } from 'vitest';
import { chooseRevisions } from './revision-choice';

const params = (query: string) => new URLSearchParams(query);

describe('chooseRevisions', () => {
	it('compares the current revision with the one before it by default', () => {
		expect(chooseRevisions(params(''), [5, 4, 3, 2, 1], 5)).toEqual({ from: 4, to: 5, notice: null });
	});

	it('takes any two revisions from the address, in either order', () => {
		expect(chooseRevisions(params('from=1&to=4'), [1, 2, 3, 4, 5], 5)).toEqual({ from: 1, to: 4, notice: null });
		expect(chooseRevisions(params('from=4&to=2'), [1, 2, 3, 4, 5], 5)).toEqual({ from: 4, to: 2, notice: null });
	});

	it('compares against the revision just before the chosen newer one when only `to` is given', () => {
		expect(chooseRevisions(params('to=3'), [1, 2, 3, 4], 4)).toEqual({ from: 2, to: 3, notice: null });
		// The first revision has none before it: the next one after it stands in.
		expect(chooseRevisions(params('to=1'), [1, 2, 3], 3)).toEqual({ from: 2, to: 1, notice: null });
	});

	it('falls back and says so for a revision that does not exist or is not a number', () => {
		expect(chooseRevisions(params('from=9&to=2'), [1, 2, 3], 3)).toEqual({ from: 1, to: 2, notice: 'This scenario has no older revision 9: showing revisions 1 and 2 instead.' });
		expect(chooseRevisions(params('from=x'), [1, 2], 2)?.notice).toBe('This scenario has no older revision x: showing revisions 1 and 2 instead.');
	});

	it('has nothing to compare while there is one revision', () => {
		expect(chooseRevisions(params('from=1&to=1'), [1], 1)).toBeNull();
	});
});
