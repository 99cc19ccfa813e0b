/** The JSON shapes the workbench API answers with, dates as ISO strings: what the browser receives, so pages can hand them on as they are. */
import type { ProjectRow } from '../db/projects';
import type { ScenarioRecord, ScenarioSummary } from '../db/scenarios';
import type { UploadRecord, UploadSummary } from '../db/uploads';
import { upgradeScenarioDocument } from '../../schemas/scenario-upgrades';
import type { ProjectJson, ScenarioJson, ScenarioSummaryJson, UploadSummaryJson } from '../../workbench/api-types';

const iso = (date: Date) => date.toISOString();
const isoOrNull = (date: Date | null) => (date === null ? null : date.toISOString());

export function projectJson(row: ProjectRow): ProjectJson {
	return {
		id: row.id,
		workspaceId: row.workspace_id,
		name: row.name,
		technology: row.technology,
		siteName: row.site_name,
		siteDescription: row.site_description,
		currency: row.currency,
		createdAt: iso(row.created_at),
		updatedAt: iso(row.updated_at),
		archivedAt: isoOrNull(row.archived_at)
	};
}

export function scenarioSummaryJson(s: ScenarioSummary): ScenarioSummaryJson {
	return {
		id: s.id,
		projectId: s.projectId,
		name: s.name,
		notes: s.notes,
		schemaVersion: s.schemaVersion,
		revision: s.revision,
		isBaseCase: s.isBaseCase,
		archivedAt: isoOrNull(s.archivedAt),
		createdAt: iso(s.createdAt),
		updatedAt: iso(s.updatedAt),
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

export function scenarioJson(s: ScenarioRecord): ScenarioJson {
	return { ...scenarioSummaryJson(s), ...documentJson(s.document), placeholderPaths: s.placeholderPaths };
}

export function uploadSummaryJson(u: UploadSummary): UploadSummaryJson {
	return {
		id: u.id,
		projectId: u.projectId,
		kind: u.kind,
		fileName: u.fileName,
		contentType: u.contentType,
		byteSize: u.byteSize,
		sha256: u.sha256,
		uploadedBy: u.uploadedBy,
		createdAt: iso(u.createdAt)
	};
}

export function uploadJson(u: UploadRecord) {
	return { ...uploadSummaryJson(u), data: u.parsed.data, summary: u.parsed.summary, warnings: u.parsed.warnings };
}
