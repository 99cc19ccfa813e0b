/**
 * Taking in an uploaded file: parse it with the parser for its kind and store
 * it only when every row is good. A bad file answers the parser's row and
 * column errors and leaves the database untouched.
 */
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { storeUpload, type UploadRecord } from '../db/uploads';
import type { UploadKind } from '../../schemas/workbench';
import { DEFAULT_MAX_BYTES, UPLOAD_KINDS, type UploadError, type UploadResult } from '../uploads';
import { parseUploadOnPool } from '../compute/pool';

/** The largest upload taken in (the parsers refuse anything above it with a named error). */
export const MAX_UPLOAD_BYTES = DEFAULT_MAX_BYTES;

/** Parses here, on the calling thread (scripts and tests; requests use the compute pool). */
export function parseUpload(kind: UploadKind, bytes: Uint8Array): UploadResult<unknown, unknown> {
	return UPLOAD_KINDS[kind].parse(bytes);
}

/** Parses an upload of one kind: on the compute pool unless given (a 20 MB file takes seconds). */
export type UploadParser = (kind: UploadKind, bytes: Uint8Array) => UploadResult<unknown, unknown> | Promise<UploadResult<unknown, unknown>>;

export interface IncomingUpload {
	projectId: string;
	kind: UploadKind;
	fileName: string;
	contentType: string;
	bytes: Uint8Array;
	userId: string | null;
}

export type ReceiveUploadResult = { ok: true; upload: UploadRecord } | { ok: false; errors: UploadError[] };

export async function receiveUpload(incoming: IncomingUpload, knex: Knex = db(), parse: UploadParser = parseUploadOnPool): Promise<ReceiveUploadResult> {
	const parsed = await parse(incoming.kind, incoming.bytes);
	if (!parsed.ok) return { ok: false, errors: parsed.errors };
	const upload = await storeUpload(
		{
			projectId: incoming.projectId,
			kind: incoming.kind,
			fileName: incoming.fileName,
			contentType: incoming.contentType,
			content: incoming.bytes,
			parsed: { data: parsed.data, summary: parsed.summary, warnings: parsed.warnings },
			userId: incoming.userId
		},
		knex
	);
	return { ok: true, upload };
}
