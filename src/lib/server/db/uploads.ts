/**
 * Uploaded files, kept in Postgres with what was parsed from them. Only files
 * that parsed without a single bad row are stored (the route parses first),
 * and the file and its parsed data go in as one row, so neither exists alone.
 */
import type { Knex } from 'knex';
import { createHash } from 'node:crypto';
import { db } from './knex';
import { exactTimestamp, keysetPage, type KeysetPage, type KeysetRequest } from './keyset';
import type { UploadKind } from '../../schemas/workbench';
import type { PersonRef } from './scenarios';

/** What the parser produced: a scenario fragment, its summary for the preview, and warnings. */
export interface ParsedUpload {
	data: unknown;
	summary: unknown;
	warnings: string[];
}

export interface UploadSummary {
	id: string;
	projectId: string;
	kind: UploadKind;
	fileName: string;
	contentType: string;
	byteSize: number;
	sha256: string;
	uploadedBy: PersonRef | null;
	createdAt: Date;
}

export interface UploadRecord extends UploadSummary {
	parsed: ParsedUpload;
}

const summaryColumns = [
	'uploads.id',
	'uploads.project_id',
	'uploads.kind',
	'uploads.file_name',
	'uploads.content_type',
	'uploads.byte_size',
	'uploads.sha256',
	'uploads.uploaded_by',
	'uploads.created_at',
	'users.name as uploaded_by_name'
] as const;

interface SummaryDbRow {
	id: string;
	project_id: string;
	kind: UploadKind;
	file_name: string;
	content_type: string;
	byte_size: number;
	sha256: string;
	uploaded_by: string | null;
	uploaded_by_name: string | null;
	created_at: Date;
}

function toSummary(row: SummaryDbRow): UploadSummary {
	return {
		id: row.id,
		projectId: row.project_id,
		kind: row.kind,
		fileName: row.file_name,
		contentType: row.content_type,
		byteSize: row.byte_size,
		sha256: row.sha256,
		uploadedBy: row.uploaded_by === null ? null : { id: row.uploaded_by, name: row.uploaded_by_name ?? '' },
		createdAt: row.created_at
	};
}

function withUploader(knex: Knex) {
	return knex('uploads').leftJoin('users', 'users.id', 'uploads.uploaded_by');
}

export function sha256Hex(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

export interface NewUpload {
	projectId: string;
	kind: UploadKind;
	fileName: string;
	contentType: string;
	content: Uint8Array;
	parsed: ParsedUpload;
	userId: string | null;
}

export async function storeUpload(input: NewUpload, knex: Knex = db()): Promise<UploadRecord> {
	const [row] = await knex('uploads')
		.insert({
			project_id: input.projectId,
			kind: input.kind,
			file_name: input.fileName,
			content_type: input.contentType,
			byte_size: input.content.byteLength,
			sha256: sha256Hex(input.content),
			content: Buffer.from(input.content.buffer, input.content.byteOffset, input.content.byteLength),
			parsed: JSON.stringify(input.parsed),
			uploaded_by: input.userId
		})
		.returning('id');
	return (await getUploadById(row.id, knex))!;
}

/** Newest first, then by id (both descending, so one row comparison pages through them). */
const uploadOrder = [
	{ column: 'uploads.created_at', order: 'desc' },
	{ column: 'uploads.id', order: 'desc' }
];

/** The uploads of the project `projectId` names (an id, or a reference to an outer query's column), newest first, without file contents or parsed data. */
export function uploadsInProjectQuery(projectId: string | Knex.Ref<string, Record<string, string>>, knex: Knex = db()) {
	return withUploader(knex).select(summaryColumns).where('uploads.project_id', projectId).orderBy(uploadOrder);
}

/** A row of uploadsInProjectQuery read back from json_agg (its timestamp arrives as text). */
export function uploadSummaryFromJson(row: SummaryDbRow): UploadSummary {
	return toSummary({ ...row, created_at: new Date(row.created_at) });
}

/** Where an upload sits in the list: when it came, to the microsecond, and its id. */
export type UploadListKey = [createdAt: string, id: string];

/** One page of the project's uploads, newest first, after `after`. */
export async function listUploadsPage(
	projectId: string,
	request: KeysetRequest<UploadListKey>,
	knex: Knex = db()
): Promise<KeysetPage<UploadSummary, UploadListKey>> {
	const query = withUploader(knex)
		.select([...summaryColumns, knex.raw(`${exactTimestamp('uploads.created_at')} as created_at_key`)])
		.where('uploads.project_id', projectId);
	if (request.after) query.whereRaw('(uploads.created_at, uploads.id) < (?::timestamptz, ?::uuid)', request.after);
	const rows: (SummaryDbRow & { created_at_key: string })[] = await query.orderBy(uploadOrder).limit(request.limit + 1);
	const page = keysetPage(rows, request.limit, (row): UploadListKey => [row.created_at_key, row.id]);
	return { items: page.items.map(toSummary), nextKey: page.nextKey };
}

/** An upload with its parsed data, without the file contents. */
export async function getUploadById(id: string, knex: Knex = db()): Promise<UploadRecord | undefined> {
	const row = await withUploader(knex).select([...summaryColumns, 'uploads.parsed']).where('uploads.id', id).first();
	return row && { ...toSummary(row), parsed: row.parsed };
}

/** The file as it was uploaded, for download. */
export async function getUploadContent(
	id: string,
	knex: Knex = db()
): Promise<{ fileName: string; contentType: string; content: Buffer } | undefined> {
	const row = await knex('uploads').select('file_name', 'content_type', 'content').where({ id }).first();
	return row && { fileName: row.file_name, contentType: row.content_type, content: row.content };
}

/** Where an upload sits, for authorization. */
export async function getUploadPlace(
	id: string,
	knex: Knex = db()
): Promise<{ uploadId: string; projectId: string; workspaceId: string } | undefined> {
	const row = await knex('uploads')
		.join('projects', 'projects.id', 'uploads.project_id')
		.select('uploads.id', 'uploads.project_id', 'projects.workspace_id')
		.where('uploads.id', id)
		.first();
	return row && { uploadId: row.id, projectId: row.project_id, workspaceId: row.workspace_id };
}

export async function countUploadsInProject(projectId: string, knex: Knex = db()): Promise<number> {
	const [row] = await knex('uploads').where({ project_id: projectId }).count<{ count: string }[]>({ count: '*' });
	return Number(row.count);
}
