/** The JSON the workbench API answers with, as the browser receives it (dates as ISO strings). */
import type { Scenario } from '../schemas/scenario';
import type { UploadKind } from '../schemas/workbench';
import type { Technology } from '../technology';

export interface PersonJson {
	id: string;
	name: string;
}

export interface ProjectJson {
	id: string;
	workspaceId: string;
	name: string;
	technology: Technology;
	siteName: string;
	siteDescription: string;
	currency: string;
	createdAt: string;
	updatedAt: string;
	archivedAt: string | null;
}

export interface ScenarioSummaryJson {
	id: string;
	projectId: string;
	name: string;
	notes: string;
	schemaVersion: number;
	revision: number;
	isBaseCase: boolean;
	archivedAt: string | null;
	createdAt: string;
	updatedAt: string;
	createdBy: PersonJson | null;
	updatedBy: PersonJson | null;
	/** Stored figures of this revision (lists only); null when not evaluated by the current engine. */
	keyFigures?: KeyFiguresJson | null;
}

export interface KeyFiguresJson {
	currency: string;
	values: { lcoeReal: string | null; equityIrr: string | null; minDscr: string | null; netAepMWh: string | null };
}

export interface ScenarioJson extends ScenarioSummaryJson {
	/** In the current format: a document saved in an older schemaVersion comes upgraded (the stored copy is unchanged until the next save). */
	document: Scenario;
	/** The schemaVersion the document was saved in, when older than the current one; else null. */
	upgradedFrom: number | null;
	/** What the upgrade moved, one line each. */
	upgradeNotes: string[];
	/** Values still a template's placeholders (`capex.lines[0].amount`), marked in the editor until edited. */
	placeholderPaths: string[];
}

export interface RevisionJson {
	revision: number;
	name: string;
	changedSections: string[];
	summary: string;
	changedAt: string;
	changedBy: PersonJson | null;
}

export interface UploadSummaryJson {
	id: string;
	projectId: string;
	kind: UploadKind;
	fileName: string;
	contentType: string;
	byteSize: number;
	sha256: string;
	uploadedBy: PersonJson | null;
	createdAt: string;
}

export interface UploadJson extends UploadSummaryJson {
	data: unknown;
	summary: Record<string, unknown>;
	warnings: string[];
}

/** A server value as the API would send it: Dates become ISO strings, as the pages expect. */
export function asJson<T>(value: unknown): T {
	return JSON.parse(JSON.stringify(value)) as T;
}
