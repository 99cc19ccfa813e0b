import { SCHEMA_VERSION } from '../../schemas/scenario-upgrades';
import { describe, expect, it } from 'vitest';
import { ApiProblem, fieldIssues, validateBody, validateDocument } from './api-route';
import { createScenarioBody, updateScenarioBody } from '../../schemas/workbench';
import { tidalInput } from '../../../../tests/fixtures/scenario-documents';

function problemOf(run: () => unknown): ApiProblem {
	try {
		run();
	} catch (e) {
		if (e instanceof ApiProblem) return e;
		throw e;
	}
	throw new Error('accepted');
}

describe('fieldIssues', () => {
	it('writes each path with dots and indices, under a prefix when one is given', () => {
		expect(fieldIssues([{ path: ['capex', 'lines', 2, 'amount'], message: 'm' }], 'document')).toEqual([{ path: 'document.capex.lines[2].amount', message: 'm' }]);
		expect(fieldIssues([{ path: [], message: 'm' }])).toEqual([{ path: '(body)', message: 'm' }]);
	});
});

describe('validateBody', () => {
	it('refuses an unknown key in a request body in the same words as in a document, with the key probably meant', () => {
		const problem = problemOf(() => validateBody(updateScenarioBody, { revison: 3, notes: 'x' }));
		expect(problem.status).toBe(422);
		expect(problem.issues).toEqual(
			expect.arrayContaining([{ path: 'revison', message: '"revison" is not a field here; did you mean "revision"?' }])
		);
	});

	it('lists the fields of a small body when no key is near', () => {
		const problem = problemOf(() => validateBody(createScenarioBody, { name: 'Base', extra: 1 }));
		expect(problem.issues).toEqual([{ path: 'extra', message: '"extra" is not a field here; the fields here are name, notes, document, placeholderPaths' }]);
	});
});

describe('validateDocument', () => {
	it('names each problem under document., unknown keys with the key probably meant', () => {
		const problem = problemOf(() =>
			validateDocument({ ...tidalInput, array: { ...tidalInput.array, availabilty: 0.5 } }, { technology: 'tidal-stream' })
		);
		expect(problem.status).toBe(422);
		expect(problem.message).toBe('The scenario document has problems in the fields listed.');
		expect(problem.issues).toEqual([
			{ path: 'document.array.availabilty', message: '"availabilty" is not a field here; did you mean "availability"?' }
		]);
	});

	it('says when the document was read after an upgrade from an older version', () => {
		const version1 = { ...tidalInput, schemaVersion: 1, decommissioning: { basis: 'percent-of-capex', amount: 1.5 } };
		const problem = problemOf(() => validateDocument(version1, { technology: 'tidal-stream' }));
		expect(problem.message).toBe(`The scenario document has problems in the fields listed (read as schema version ${SCHEMA_VERSION}, upgraded from version 1).`);
		expect(problem.issues.map((i) => i.path)).toEqual(['document.decommissioning.fraction']);
	});

	it('refuses a document newer than this code reads', () => {
		const problem = problemOf(() => validateDocument({ ...tidalInput, schemaVersion: SCHEMA_VERSION + 1 }, { technology: 'tidal-stream' }));
		expect(problem.issues).toEqual([{ path: 'document.schemaVersion', message: expect.stringMatching(new RegExp(`^schemaVersion ${SCHEMA_VERSION + 1} is newer`)) }]);
	});

	it('checks the document against the project’s technology', () => {
		const problem = problemOf(() => validateDocument(tidalInput, { technology: 'wave' }));
		expect(problem.issues).toEqual([{ path: 'document.technology', message: 'this project is wave; the document is tidal-stream' }]);
	});
});
