import { describe, expect, it } from 'vitest';
import { applyUploadToDocument } from './apply-upload';
import { parseScenario } from '../../schemas/scenario';
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
