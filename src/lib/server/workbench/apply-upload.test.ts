import { describe, expect, it } from 'vitest';
import { applyUploadToDocument } from './apply-upload';
import { ApiProblem, validateDocument } from './api-route';
import { parseScenario, SCHEMA_VERSION } from '../../schemas/scenario';
import { tidalDocument, waveDocument } from '../../../../tests/fixtures/scenario-documents';

const histogram = { kind: 'speed-histogram', occurrenceBasis: 'hours', bins: [{ speedMPerS: 1.05, occurrence: 4000 }, { speedMPerS: 2.05, occurrence: 4760 }] };
const curve = { kind: 'power-curve', points: [{ speedMPerS: 0.5, powerKW: 0 }, { speedMPerS: 2.5, powerKW: 1000 }] };

describe('applyUploadToDocument', () => {
	it('replaces the resource with an uploaded histogram and leaves everything else alone', () => {
		const applied = applyUploadToDocument(tidalDocument, 'speed-histogram', histogram);
		expect(applied.ok).toBe(true);
		if (!applied.ok) return;
		expect(applied.section).toBe('resource');
		expect(applied.document.resource).toEqual(histogram);
		expect({ ...applied.document, resource: tidalDocument.resource }).toEqual(tidalDocument);
		expect(parseScenario(applied.document).ok).toBe(true);
	});

	it('replaces a rotor with a measured power curve', () => {
		const applied = applyUploadToDocument(tidalDocument, 'power-curve', curve);
		expect(applied.ok && applied.document.device).toEqual(curve);
		expect(applied.ok && parseScenario(applied.document).ok).toBe(true);
	});

	it('refuses a kind that does not fit the technology', () => {
		const applied = applyUploadToDocument(waveDocument, 'power-curve', curve);
		expect(applied).toEqual({ ok: false, message: 'A power curve fits tidal-stream or ocean-current scenarios; this scenario is wave.' });
	});

	it("keeps the scenario's own Te/Tp ratio when a sea-state table of the same kind replaces it", () => {
		const withRatio = { ...waveDocument, resource: { ...waveDocument.resource, teOverTp: 0.86 } } as typeof waveDocument;
		const table = { kind: 'sea-state-table', periodType: 'peak-period', teOverTp: 0.9, occurrenceBasis: 'hours', states: [{ hsM: 1, periodS: 8, occurrence: 8760 }] };
		const applied = applyUploadToDocument(withRatio, 'sea-state-table', table);
		expect(applied.ok && (applied.document.resource as { teOverTp: number }).teOverTp).toBe(0.86);
	});
});

describe('applyUploadToDocument, then validateDocument (the apply route)', () => {
	const refusal = (document: unknown): ApiProblem => {
		try {
			validateDocument(document, { technology: 'tidal-stream' });
		} catch (e) {
			if (e instanceof ApiProblem) return e;
			throw e;
		}
		throw new Error('the document was accepted');
	};

	it('refuses an upload that holds more speed bins than a scenario takes, naming the field and the bound', () => {
		const tooMany = { ...histogram, bins: Array.from({ length: 1001 }, (_, i) => ({ speedMPerS: i * 0.01, occurrence: 1 })) };
		const applied = applyUploadToDocument(tidalDocument, 'speed-histogram', tooMany);
		if (!applied.ok) throw new Error(applied.message);
		const problem = refusal(applied.document);
		expect(problem.status).toBe(422);
		expect(problem.issues).toEqual([{ path: 'document.resource.bins', message: 'at most 1000 speed bins' }]);
	});

	it('refuses upload data with a key the schema does not know, with the key probably meant', () => {
		const applied = applyUploadToDocument(tidalDocument, 'power-curve', { ...curve, ratedPowerKw: 1000 });
		if (!applied.ok) throw new Error(applied.message);
		expect(refusal(applied.document).issues).toEqual([
			{ path: 'document.device.ratedPowerKw', message: '"ratedPowerKw" is not a field here; did you mean "ratedPowerKW"?' }
		]);
	});

	it('applies an upload to a scenario stored in version 1, saving it in the current version', () => {
		const stored = {
			...tidalDocument,
			schemaVersion: 1,
			decommissioning: { basis: 'percent-of-capex', amount: 0.05 }
		} as unknown as typeof tidalDocument;
		const applied = applyUploadToDocument(stored, 'speed-histogram', histogram);
		if (!applied.ok) throw new Error(applied.message);
		const document = validateDocument(applied.document, { technology: 'tidal-stream' });
		expect(document.schemaVersion).toBe(SCHEMA_VERSION);
		expect(document.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		expect(document.resource).toEqual(histogram);
	});
});
