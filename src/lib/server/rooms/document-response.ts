/**
 * A room document as the browser receives it: its checked content type, the
 * file name in Content-Disposition (inline to view, attachment to download),
 * nosniff, no caching by shared caches, and a policy that lets the document
 * run nothing and be framed by nobody.
 */
import type { RoomDocument } from '../db/rooms';

/** Kinds a browser can show by itself; others are always downloads. */
export const VIEWABLE_KINDS = new Set(['pdf', 'png', 'jpeg', 'csv']);

function contentDisposition(type: 'inline' | 'attachment', fileName: string): string {
	const ascii = fileName.replace(/[^\x20-\x7e]|["\\]/g, '_');
	return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

export function documentResponse(document: RoomDocument & { content: Buffer }, disposition: 'inline' | 'attachment'): Response {
	// A CSV shown in the browser is plain text: never a page that could run anything.
	const contentType = disposition === 'inline' && document.kind === 'csv' ? 'text/plain; charset=utf-8' : document.contentType;
	return new Response(new Uint8Array(document.content), {
		headers: {
			'content-type': contentType,
			'content-length': String(document.byteSize),
			'content-disposition': contentDisposition(disposition, document.fileName),
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, no-store',
			'content-security-policy': document.kind === 'pdf' ? "default-src 'none'; frame-ancestors 'none'; form-action 'none'" : "default-src 'none'; frame-ancestors 'none'; form-action 'none'; sandbox",
			'cross-origin-resource-policy': 'same-origin'
		}
	});
}

/** View-only documents are shown inline; the rest are downloads. */
export function dispositionOf(document: RoomDocument): 'inline' | 'attachment' {
	return document.access === 'view' && VIEWABLE_KINDS.has(document.kind) ? 'inline' : 'attachment';
}
