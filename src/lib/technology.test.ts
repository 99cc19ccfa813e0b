import { describe, expect, it } from 'vitest';
import { technologyLabels } from './technology';

describe('technologyLabels', () => {
	it('names the three technologies the database accepts', () => {
		// Must match the CHECK constraint in migrations/20261201000001_workspaces_and_projects.ts.
		expect(Object.keys(technologyLabels).sort()).toEqual(['ocean-current', 'tidal-stream', 'wave']);
	});
});
