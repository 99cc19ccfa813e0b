import { describe, expect, it } from 'vitest';
import { beyondScenarioLimit } from './limits';

describe('beyondScenarioLimit', () => {
	it('lets a file fill a list up to the scenario’s bound', () => {
		expect(beyondScenarioLimit('speedBins', 1000, 'rows')).toBeNull();
	});

	it('refuses one entry more, in the words the schema uses', () => {
		expect(beyondScenarioLimit('speedBins', 1001, 'rows')).toEqual({
			ok: false,
			errors: [{ row: null, column: null, message: 'The file has 1,001 rows; a scenario takes at most 1000 speed bins.' }]
		});
	});
});
