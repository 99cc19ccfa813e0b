import { SCHEMA_VERSION } from '../../schemas/scenario-upgrades';
import { describe, expect, it } from 'vitest';
import { scenarioJson } from './serialize';
import type { ScenarioRecord } from '../db/scenarios';
import { tidalDocument } from '../../../../tests/fixtures/scenario-documents';

const record = (document: unknown, schemaVersion: number): ScenarioRecord => ({
	id: '00000000-0000-4000-8000-000000000001',
	projectId: '00000000-0000-4000-8000-000000000002',
	name: 'Base',
	notes: '',
	schemaVersion,
	revision: 4,
	isBaseCase: true,
	archivedAt: null,
	createdAt: new Date('2026-01-01T00:00:00Z'),
	updatedAt: new Date('2026-01-01T00:00:00Z'),
	createdBy: null,
	updatedBy: null,
	document: document as ScenarioRecord['document'],
	placeholderPaths: []
});

describe('scenarioJson', () => {
	it('answers a document saved in version 1 in the current format, saying from which version and what moved', () => {
		const stored = { ...tidalDocument, schemaVersion: 1, decommissioning: { basis: 'percent-of-capex', amount: 0.05 } };
		const json = scenarioJson(record(stored, 1));
		expect(json.schemaVersion).toBe(1);
		expect(json.document.schemaVersion).toBe(SCHEMA_VERSION);
		expect(json.document.decommissioning).toEqual({ basis: 'percent-of-capex', fraction: 0.05 });
		expect(json.upgradedFrom).toBe(1);
		expect(json.upgradeNotes).toEqual(['decommissioning.amount moved to decommissioning.fraction (percent-of-capex)']);
		expect(stored.decommissioning).toEqual({ basis: 'percent-of-capex', amount: 0.05 });
	});

	it('answers a current document as it was saved', () => {
		const json = scenarioJson(record(tidalDocument, SCHEMA_VERSION));
		expect(json.document).toBe(tidalDocument);
		expect(json.upgradedFrom).toBeNull();
		expect(json.upgradeNotes).toEqual([]);
	});
});
