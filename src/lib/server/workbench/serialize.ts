/** The JSON shapes the workbench API answers with (dates become ISO strings in JSON). */
import type { ProjectRow } from '../db/projects';
import type { ScenarioRecord, ScenarioSummary } from '../db/scenarios';
import type { UploadRecord, UploadSummary } from '../db/uploads';
import { upgradeScenarioDocument } from '../../schemas/scenario-upgrades';

export function projectJson(row: ProjectRow) {
	return {
		id: row.id,
		workspaceId: row.workspace_id,
		name: row.name,
		technology: row.technology,
		siteName: row.site_name,
		siteDescription: row.site_description,
		currency: row.currency,
		createdAt: row.created_at,
		updatedAt: row.updated_at,
		archivedAt: row.archived_at
	};
}

export function scenarioSummaryJson(s: ScenarioSummary) {
	return {
		id: s.id,
		projectId: s.projectId,
		name: s.name,
		notes: s.notes,
		schemaVersion: s.schemaVersion,
		revision: s.revision,
		isBaseCase: s.isBaseCase,
		archivedAt: s.archivedAt,
		createdAt: s.createdAt,
		updatedAt: s.updatedAt,
		createdBy: s.createdBy,
		updatedBy: s.updatedBy
	};
}

/**
 * The saved document in the current format. One saved in an older
 * schemaVersion is upgraded in memory (the stored copy is never rewritten; the
 * next save writes the current version), and says from which version and what
 * moved, so the editor can tell the user.
 */
function documentJson(document: ScenarioRecord['document']) {
	const upgraded = upgradeScenarioDocument(document);
	if (!upgraded.ok || upgraded.upgradedFrom === null) return { document, upgradedFrom: null, upgradeNotes: [] as string[] };
	return { document: upgraded.document as ScenarioRecord['document'], upgradedFrom: upgraded.upgradedFrom, upgradeNotes: upgraded.notes };
}

export function scenarioJson(s: ScenarioRecord) {
	return { ...scenarioSummaryJson(s), ...documentJson(s.document), placeholderPaths: s.placeholderPaths };
}

export function uploadSummaryJson(u: UploadSummary) {
	return {
		id: u.id,
		projectId: u.projectId,
		kind: u.kind,
		fileName: u.fileName,
		contentType: u.contentType,
		byteSize: u.byteSize,
		sha256: u.sha256,
		uploadedBy: u.uploadedBy,
		createdAt: u.createdAt
	};
}

export function uploadJson(u: UploadRecord) {
	return { ...uploadSummaryJson(u), data: u.parsed.data, summary: u.parsed.summary, warnings: u.parsed.warnings };
}
