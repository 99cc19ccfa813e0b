/**
 * The content check for a document attached to an investor data room.
 *
 * The kind is decided from the bytes, never from the name: the name's
 * extension must then agree with what the bytes are. Every refusal is one
 * plain sentence that names the file and says why, fit to show the person
 * who uploaded it. Pure: no file system, no database, no network.
 *
 * Order of the checks: the name, the size, what the content is, whether the
 * extension agrees, then what is inside (scripts in a PDF, macros in a
 * workbook, a cut-short image, text that is not clean UTF-8).
 */
import { createHash } from 'node:crypto';
import { inflateSync } from 'node:zlib';

/** 50 MB: a board pack of scanned PDFs fits; a video does not. */
export const ROOM_DOCUMENT_MAX_BYTES = 50 * 1024 * 1024;

/** Longest file name accepted, in characters. */
export const ROOM_DOCUMENT_NAME_MAX_LENGTH = 200;

export interface RoomDocumentKindInfo {
	/** Short name used in lists: "PDF". */
	label: string;
	/** What one such file is called in a sentence: "a PDF". */
	noun: string;
	/** The one content type the document is stored and served with. */
	contentType: string;
	/** Extensions the name may end with, lower case, the usual one first. */
	extensions: readonly string[];
}

/** The kinds a data room accepts, in the order they are listed to users. */
export const ROOM_DOCUMENT_KINDS = {
	pdf: { label: 'PDF', noun: 'a PDF', contentType: 'application/pdf', extensions: ['pdf'] },
	xlsx: {
		label: 'XLSX',
		noun: 'an Excel workbook (XLSX)',
		contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		extensions: ['xlsx']
	},
	// The charset is part of the type so a browser never guesses another encoding.
	csv: { label: 'CSV', noun: 'a CSV file', contentType: 'text/csv; charset=utf-8', extensions: ['csv'] },
	docx: {
		label: 'DOCX',
		noun: 'a Word document (DOCX)',
		contentType: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document',
		extensions: ['docx']
	},
	png: { label: 'PNG', noun: 'a PNG image', contentType: 'image/png', extensions: ['png'] },
	jpeg: { label: 'JPEG', noun: 'a JPEG image', contentType: 'image/jpeg', extensions: ['jpg', 'jpeg'] }
} as const satisfies Record<string, RoomDocumentKindInfo>;

export type RoomDocumentKind = keyof typeof ROOM_DOCUMENT_KINDS;

export interface RoomDocumentInput {
	fileName: string;
	bytes: Uint8Array;
}

export type RoomDocumentCheck =
	| {
			ok: true;
			kind: RoomDocumentKind;
			contentType: string;
			/** The name to store and to offer on download: conservative characters, extension in lower case. */
			safeFileName: string;
			byteSize: number;
			/** SHA-256 of the bytes, lower-case hex. */
			sha256: string;
	  }
	| { ok: false; reason: string };

const KIND_ORDER = Object.keys(ROOM_DOCUMENT_KINDS) as RoomDocumentKind[];
const ALLOWED_LIST = KIND_ORDER.map((kind) => ROOM_DOCUMENT_KINDS[kind].label).join(', ');
const ALLOWED = `allowed: ${ALLOWED_LIST}`;

/**
 * Decides whether `bytes`, uploaded under `fileName`, may be attached to a
 * data room, and if so as which kind.
 *
 * Example: a 1x1 PNG named "Kestle Array.PNG" gives
 * `{ ok: true, kind: 'png', contentType: 'image/png', safeFileName: 'Kestle Array.png', ... }`;
 * the same bytes named "kestle.pdf" give
 * `{ ok: false, reason: 'kestle.pdf is a PNG image: rename it .png or upload the PDF.' }`.
 */
export function checkRoomDocument(input: RoomDocumentInput): RoomDocumentCheck {
	const { fileName, bytes } = input;

	const nameProblem = problemWithName(fileName);
	if (nameProblem !== null) return refuse(nameProblem);
	const name = fileName.trim();

	if (bytes.length === 0) return refuse(`${name} is empty (0 bytes).`);
	if (bytes.length > ROOM_DOCUMENT_MAX_BYTES) {
		return refuse(
			`${name} is ${megabytesRoundedUp(bytes.length)} MB, over the ${ROOM_DOCUMENT_MAX_BYTES / (1024 * 1024)} MB limit for a data-room document.`
		);
	}

	const extension = extensionOf(name);
	const claimed = kindOfExtension(extension);
	const identified = identifyContent(bytes);

	let kind: RoomDocumentKind;
	let zipEntries: ZipEntry[] = [];
	switch (identified.type) {
		case 'foreign':
			return refuse(identified.describe(name, claimed));
		case 'damaged':
			return refuse(`${name} ${identified.sentence}`);
		case 'kind':
			kind = identified.kind;
			zipEntries = identified.zipEntries;
			break;
		case 'unrecognised': {
			const markup = markupIn(bytes);
			if (markup !== null) return refuse(dangerousContent(name, claimed, `is ${markup}`));
			if (claimed !== 'csv') return refuse(unrecognisedContent(name, claimed, bytes));
			kind = 'csv';
			break;
		}
	}

	if (claimed !== kind) return refuse(renameSentence(name, kind, claimed));

	const inside = problemInside(kind, bytes, zipEntries);
	if (inside !== null) return refuse(`${name} ${inside}`);

	return {
		ok: true,
		kind,
		contentType: ROOM_DOCUMENT_KINDS[kind].contentType,
		safeFileName: safeFileNameOf(name, extension),
		byteSize: bytes.length,
		sha256: createHash('sha256').update(bytes).digest('hex')
	};
}

function refuse(reason: string): { ok: false; reason: string } {
	return { ok: false, reason };
}

// ---------------------------------------------------------------------------
// The name

/** Characters that change text direction or are invisible: a right-to-left override (U+202E) makes "invoice<U+202E>fdp.exe" read as "invoiceexe.pdf". */
const INVISIBLE_FORMATTING = /[\u00AD\u061C\u180E\u200B-\u200F\u202A-\u202E\u2060-\u2069\uFEFF]/u;
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001F\u007F-\u009F]/u;

function problemWithName(fileName: string): string | null {
	const shown = quotedForMessage(fileName);
	const trimmed = fileName.trim();
	if (trimmed === '') return 'The file has no name: give it a name ending in its extension, such as .pdf.';
	const length = [...fileName].length;
	if (length > ROOM_DOCUMENT_NAME_MAX_LENGTH) {
		return `The file name ${shown} is ${length} characters long; at most ${ROOM_DOCUMENT_NAME_MAX_LENGTH} are allowed: shorten it.`;
	}
	const control = CONTROL.exec(fileName);
	if (control !== null) {
		return `The file name ${shown} contains a control character (${codePointOf(control[0])}): rename the file without it.`;
	}
	const invisible = INVISIBLE_FORMATTING.exec(fileName);
	if (invisible !== null) {
		return `The file name ${shown} contains an invisible formatting character (${codePointOf(invisible[0])}), which can disguise its real extension: rename the file without it.`;
	}
	const separator = /[/\\]/.exec(fileName);
	if (separator !== null) {
		return `The file name ${shown} contains a path separator (${separator[0]}): upload the file under its own name, without folders.`;
	}
	if (fileName.includes('..')) {
		return `The file name ${shown} contains "..", which could point outside its folder: rename the file without it.`;
	}
	if (trimmed.startsWith('.')) return `The file name ${shown} starts with a dot, the mark of a hidden file: rename it.`;
	return null;
}

/** The name in quotes with control and invisible characters made visible, cut to a readable length. */
function quotedForMessage(fileName: string): string {
	const visible = [...fileName]
		.map((ch) => (CONTROL.test(ch) || INVISIBLE_FORMATTING.test(ch) ? `\\u{${ch.codePointAt(0)!.toString(16).toUpperCase()}}` : ch))
		.join('');
	const chars = [...visible];
	return `"${chars.length > 60 ? `${chars.slice(0, 60).join('')}…` : visible}"`;
}

function codePointOf(ch: string): string {
	return `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
}

function extensionOf(name: string): string {
	const dot = name.lastIndexOf('.');
	return dot <= 0 ? '' : name.slice(dot + 1).toLowerCase();
}

function kindOfExtension(extension: string): RoomDocumentKind | null {
	return KIND_ORDER.find((kind) => (ROOM_DOCUMENT_KINDS[kind].extensions as readonly string[]).includes(extension)) ?? null;
}

/**
 * The stored name: accents dropped, runs of whitespace made one space, every
 * character outside letters, digits, space, ( ) . _ - replaced by '-', the
 * extension in lower case. Only called once the name has passed its checks.
 */
function safeFileNameOf(name: string, extension: string): string {
	const stem = name.slice(0, name.length - extension.length - 1);
	const cleaned = stem
		.normalize('NFKD')
		.replace(/\p{M}/gu, '')
		.replace(/\s+/gu, ' ')
		.replace(/[^A-Za-z0-9 ()._-]/g, '-')
		.replace(/-{2,}/g, '-')
		.replace(/^[\s.-]+|[\s.-]+$/g, '');
	const room = ROOM_DOCUMENT_NAME_MAX_LENGTH - extension.length - 1;
	const bounded = cleaned.slice(0, room).trimEnd();
	return `${bounded === '' ? 'document' : bounded}.${extension}`;
}

function megabytesRoundedUp(byteCount: number): string {
	// Rounded up, so a file one byte over 50 MB never reads as "50.0 MB".
	return (Math.ceil((byteCount / (1024 * 1024)) * 10) / 10).toFixed(1);
}

// ---------------------------------------------------------------------------
// What the content is

type Identified =
	| { type: 'kind'; kind: RoomDocumentKind; zipEntries: ZipEntry[] }
	| { type: 'foreign'; describe: (name: string, claimed: RoomDocumentKind | null) => string }
	| { type: 'damaged'; sentence: string }
	| { type: 'unrecognised' };

interface Signature {
	bytes: readonly number[];
	at?: number;
}

/** Content that must never be served from a data room, however it is named. */
const DANGEROUS_SIGNATURES: { signature: Signature; what: string; unless?: (bytes: Uint8Array) => boolean }[] = [
	// "MZ" alone could begin a CSV cell; a program's header is binary, a CSV is text.
	{ signature: { bytes: [0x4d, 0x5a] }, what: 'a Windows program (MZ)', unless: isPlainText },
	{ signature: { bytes: [0x7f, 0x45, 0x4c, 0x46] }, what: 'a Linux program (ELF)' },
	{ signature: { bytes: [0xfe, 0xed, 0xfa, 0xce] }, what: 'a macOS program (Mach-O)' },
	{ signature: { bytes: [0xfe, 0xed, 0xfa, 0xcf] }, what: 'a macOS program (Mach-O)' },
	{ signature: { bytes: [0xce, 0xfa, 0xed, 0xfe] }, what: 'a macOS program (Mach-O)' },
	{ signature: { bytes: [0xcf, 0xfa, 0xed, 0xfe] }, what: 'a macOS program (Mach-O)' },
	{ signature: { bytes: [0xca, 0xfe, 0xba, 0xbe] }, what: 'a macOS or Java program (CAFEBABE)' },
	{ signature: { bytes: [0x00, 0x61, 0x73, 0x6d] }, what: 'a WebAssembly program' },
	{ signature: { bytes: [0x23, 0x21] }, what: 'a script (#!)' }
];

/** Harmless kinds that a data room still does not accept. */
const OTHER_SIGNATURES: { signature: Signature; what: string }[] = [
	{ signature: { bytes: [0x47, 0x49, 0x46, 0x38] }, what: 'a GIF image' },
	{ signature: { bytes: [0x57, 0x45, 0x42, 0x50], at: 8 }, what: 'a WebP image' },
	{ signature: { bytes: [0x49, 0x49, 0x2a, 0x00] }, what: 'a TIFF image' },
	{ signature: { bytes: [0x4d, 0x4d, 0x00, 0x2a] }, what: 'a TIFF image' },
	{ signature: { bytes: [0x66, 0x74, 0x79, 0x70], at: 4 }, what: 'a video or HEIC image (ISO media)' },
	{ signature: { bytes: [0x1f, 0x8b] }, what: 'a gzip archive' },
	{ signature: { bytes: [0x52, 0x61, 0x72, 0x21, 0x1a, 0x07] }, what: 'a RAR archive' },
	{ signature: { bytes: [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c] }, what: 'a 7-Zip archive' },
	{ signature: { bytes: [0x25, 0x21, 0x50, 0x53] }, what: 'a PostScript file' },
	{ signature: { bytes: [0x7b, 0x5c, 0x72, 0x74, 0x66] }, what: 'an RTF document' }
];

const PDF_SIGNATURE = [0x25, 0x50, 0x44, 0x46, 0x2d]; // %PDF-
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const JPEG_SIGNATURE = [0xff, 0xd8, 0xff];
const ZIP_SIGNATURE = [0x50, 0x4b, 0x03, 0x04]; // PK\x03\x04
const OLE_SIGNATURE = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];

function matches(bytes: Uint8Array, signature: Signature): boolean {
	const at = signature.at ?? 0;
	if (bytes.length < at + signature.bytes.length) return false;
	return signature.bytes.every((b, i) => bytes[at + i] === b);
}

function identifyContent(bytes: Uint8Array): Identified {
	if (matches(bytes, { bytes: PDF_SIGNATURE })) return found('pdf');
	if (matches(bytes, { bytes: PNG_SIGNATURE })) return found('png');
	if (matches(bytes, { bytes: JPEG_SIGNATURE })) return found('jpeg');
	if (matches(bytes, { bytes: ZIP_SIGNATURE })) return identifyZip(bytes);
	if (matches(bytes, { bytes: OLE_SIGNATURE })) {
		return {
			type: 'foreign',
			describe: (name, claimed) =>
				`${name} ${claimed === null ? 'is' : `is not ${ROOM_DOCUMENT_KINDS[claimed].noun}: it is`} an old-format or password-protected Office file (OLE, as .doc and .xls are): save it as .docx or .xlsx without a password and upload that.`
		};
	}
	for (const { signature, what, unless } of DANGEROUS_SIGNATURES) {
		if (matches(bytes, signature) && !unless?.(bytes)) {
			return { type: 'foreign', describe: (name, claimed) => dangerousContent(name, claimed, `starts like ${what}`) };
		}
	}
	for (const { signature, what } of OTHER_SIGNATURES) {
		if (matches(bytes, signature)) return { type: 'foreign', describe: (name) => `${name} is ${what}; ${ALLOWED}.` };
	}
	return { type: 'unrecognised' };
}

function found(kind: RoomDocumentKind, zipEntries: ZipEntry[] = []): Identified {
	return { type: 'kind', kind, zipEntries };
}

function dangerousContent(name: string, claimed: RoomDocumentKind | null, contentPhrase: string): string {
	if (claimed === null) return `${name} is refused: its content ${contentPhrase}; ${ALLOWED}.`;
	return `${name} is not ${ROOM_DOCUMENT_KINDS[claimed].noun}: its content ${contentPhrase}.`;
}

function renameSentence(name: string, kind: RoomDocumentKind, claimed: RoomDocumentKind | null): string {
	const actual = ROOM_DOCUMENT_KINDS[kind];
	const rename = `rename it .${actual.extensions[0]}`;
	if (claimed === null) return `${name} is ${actual.noun}: ${rename}.`;
	return `${name} is ${actual.noun}: ${rename} or upload the ${ROOM_DOCUMENT_KINDS[claimed].label}.`;
}

function unrecognisedContent(name: string, claimed: RoomDocumentKind | null, bytes: Uint8Array): string {
	const text = isPlainText(bytes);
	if (claimed === null) {
		return text
			? `${name} is plain text, which a data room takes only as a CSV named .csv; ${ALLOWED}.`
			: `${name} is of a kind a data room does not accept; ${ALLOWED}.`;
	}
	const noun = ROOM_DOCUMENT_KINDS[claimed].noun;
	return text
		? `${name} is not ${noun}: its content is plain text.`
		: `${name} is not ${noun}: its content matches none of the allowed kinds (${ALLOWED_LIST}).`;
}

function isPlainText(bytes: Uint8Array): boolean {
	if (bytes.includes(0)) return false;
	try {
		new TextDecoder('utf-8', { fatal: true }).decode(bytes);
		return true;
	} catch {
		return false;
	}
}

/**
 * Names HTML, SVG or XML in text that matched no binary signature, or null.
 * Looks at the start of the file, where a browser that sniffs content looks.
 */
function markupIn(bytes: Uint8Array): string | null {
	const head = latin1(bytes.subarray(0, 1024))
		.replace(/^\u00EF\u00BB\u00BF/, '')
		.toLowerCase();
	const start = head.trimStart();
	const hasScript = /<script/.test(head);
	if (/<svg/.test(head)) return hasScript ? 'an SVG image with a script (<svg, <script)' : 'an SVG image (<svg)';
	if (/<!doctype\s+html|<html|<script|<iframe|<body|<head\b/.test(head)) return 'an HTML page';
	if (start.startsWith('<?xml')) return 'an XML document (<?xml)';
	if (start.startsWith('<')) return 'markup such as HTML or XML (it starts with <)';
	return null;
}

function latin1(bytes: Uint8Array): string {
	return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('latin1');
}

// ---------------------------------------------------------------------------
// ZIP: XLSX and DOCX are ZIP archives; which one is decided from the central
// directory's entry names (APPNOTE.TXT, PKWARE's .ZIP File Format Specification, 4.3).

interface ZipEntry {
	/** As stored, with forward slashes. */
	name: string;
	encrypted: boolean;
}

type ZipListing = { ok: true; entries: ZipEntry[] } | { ok: false; problem: string };

const EOCD_SIGNATURE = 0x06054b50;
const EOCD_LENGTH = 22;
const CENTRAL_ENTRY_SIGNATURE = 0x02014b50;
const CENTRAL_ENTRY_LENGTH = 46;
const LOCAL_HEADER_SIGNATURE = 0x04034b50;
const LOCAL_HEADER_LENGTH = 30;
const MAX_ZIP_COMMENT = 0xffff;

/**
 * Lists a ZIP's entries from its central directory. The end-of-central-
 * directory record is searched from the end; it must close the file exactly
 * (its comment running to the last byte), every entry must lie inside the
 * directory, and every entry's local header must be where the directory says.
 */
function readZipCentralDirectory(bytes: Uint8Array): ZipListing {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const unreadable = (problem: string): ZipListing => ({ ok: false, problem });

	let eocd = -1;
	const lowest = Math.max(0, bytes.length - EOCD_LENGTH - MAX_ZIP_COMMENT);
	for (let at = bytes.length - EOCD_LENGTH; at >= lowest; at--) {
		if (view.getUint32(at, true) !== EOCD_SIGNATURE) continue;
		if (at + EOCD_LENGTH + view.getUint16(at + 20, true) === bytes.length) {
			eocd = at;
			break;
		}
	}
	if (eocd < 0) return unreadable('its end-of-archive record is missing, so it may be cut short');

	const disk = view.getUint16(eocd + 4, true);
	const directoryDisk = view.getUint16(eocd + 6, true);
	const entriesOnDisk = view.getUint16(eocd + 8, true);
	const entryCount = view.getUint16(eocd + 10, true);
	const directorySize = view.getUint32(eocd + 12, true);
	const directoryOffset = view.getUint32(eocd + 16, true);
	if (entryCount === 0xffff || directorySize === 0xffffffff || directoryOffset === 0xffffffff) {
		return unreadable('it uses the ZIP64 layout, which this check does not read');
	}
	if (disk !== 0 || directoryDisk !== 0 || entriesOnDisk !== entryCount) {
		return unreadable('it is split over several parts');
	}
	const directoryEnd = directoryOffset + directorySize;
	if (directoryEnd > eocd) return unreadable('its list of contents points past the end of the file');

	const entries: ZipEntry[] = [];
	const names = new TextDecoder('utf-8');
	let at = directoryOffset;
	for (let i = 0; i < entryCount; i++) {
		if (at + CENTRAL_ENTRY_LENGTH > directoryEnd || view.getUint32(at, true) !== CENTRAL_ENTRY_SIGNATURE) {
			return unreadable(`entry ${i + 1} of its list of contents is damaged`);
		}
		const flags = view.getUint16(at + 8, true);
		const nameLength = view.getUint16(at + 28, true);
		const extraLength = view.getUint16(at + 30, true);
		const commentLength = view.getUint16(at + 32, true);
		const localHeader = view.getUint32(at + 42, true);
		const next = at + CENTRAL_ENTRY_LENGTH + nameLength + extraLength + commentLength;
		if (next > directoryEnd) return unreadable(`entry ${i + 1} of its list of contents runs past the list`);
		if (localHeader + LOCAL_HEADER_LENGTH > directoryOffset || view.getUint32(localHeader, true) !== LOCAL_HEADER_SIGNATURE) {
			return unreadable(`entry ${i + 1} points at data that is not there`);
		}
		const start = at + CENTRAL_ENTRY_LENGTH;
		entries.push({ name: names.decode(bytes.subarray(start, start + nameLength)), encrypted: (flags & 0x1) !== 0 });
		at = next;
	}
	if (at !== directoryEnd) return unreadable('its list of contents is longer than its entries');
	return { ok: true, entries };
}

function identifyZip(bytes: Uint8Array): Identified {
	const listing = readZipCentralDirectory(bytes);
	if (!listing.ok) {
		return {
			type: 'damaged',
			sentence: `starts like a ZIP archive (as XLSX and DOCX files are) but cannot be read: ${listing.problem}. Save it again and upload the new copy.`
		};
	}
	const names = new Set(listing.entries.map((entry) => entry.name.toLowerCase()));
	if (names.size !== listing.entries.length) {
		return { type: 'damaged', sentence: 'is a ZIP archive that lists the same entry twice, so readers may disagree on its content.' };
	}
	const isOpenXml = names.has('[content_types].xml');
	const isWorkbook = isOpenXml && names.has('xl/workbook.xml');
	const isDocument = isOpenXml && names.has('word/document.xml');
	if (isWorkbook && !isDocument) return found('xlsx', listing.entries);
	if (isDocument && !isWorkbook) return found('docx', listing.entries);

	let what = 'a ZIP archive of another kind';
	if (isWorkbook && isDocument) what = 'a ZIP archive that claims to be both a workbook and a document';
	else if (isOpenXml && names.has('ppt/presentation.xml')) what = 'a PowerPoint presentation (PPTX)';
	else if (isOpenXml) what = 'an Office file of another kind';
	else if (names.has('mimetype')) what = 'an OpenDocument file';
	else if (names.has('meta-inf/manifest.mf')) what = 'a Java archive (JAR)';
	return { type: 'foreign', describe: (name) => `${name} is ${what}; ${ALLOWED}.` };
}

/** The first part of an XLSX or DOCX that can run code or carry another file, or null. */
function activeOfficeContent(entries: ZipEntry[]): string | null {
	for (const { name } of entries) {
		const lower = name.toLowerCase();
		const file = lower.slice(lower.lastIndexOf('/') + 1);
		if (file === 'vbaproject.bin') return `macros (${name})`;
		if (lower.startsWith('xl/macrosheets/')) return `Excel 4.0 macro sheets (${name})`;
		if (lower.includes('/activex/')) return `ActiveX controls (${name})`;
		if (lower.includes('/embeddings/') && file.endsWith('.bin')) return `an embedded object (${name})`;
	}
	return null;
}

// ---------------------------------------------------------------------------
// What is inside a document of an accepted kind

function problemInside(kind: RoomDocumentKind, bytes: Uint8Array, zipEntries: ZipEntry[]): string | null {
	switch (kind) {
		case 'pdf':
			return problemInPdf(bytes);
		case 'png':
			return problemInPng(bytes);
		case 'jpeg':
			return problemInJpeg(bytes);
		case 'csv':
			return problemInCsv(bytes);
		case 'xlsx':
		case 'docx':
			return problemInOfficeZip(kind, zipEntries);
	}
}

function problemInOfficeZip(kind: 'xlsx' | 'docx', entries: ZipEntry[]): string | null {
	const encrypted = entries.find((entry) => entry.encrypted);
	if (encrypted !== undefined) {
		return `has encrypted parts (${encrypted.name}), so its content cannot be checked: save it without a password and upload that.`;
	}
	const active = activeOfficeContent(entries);
	if (active === null) return null;
	const plain = kind === 'xlsx' ? 'an Excel Workbook (.xlsx)' : 'a Word Document (.docx)';
	return `contains ${active}, which a data room does not accept: save it as ${plain} without macros or embedded objects and upload that.`;
}

// --- PDF (ISO 32000-1:2008, sections 7.2-7.5 on tokens, streams and file structure)
//
// The scan is lexical, as malware triage tools scan PDFs: every name token
// outside stream bodies, plus the unpacked object streams, where further
// dictionaries hide compressed. Stream bodies (page drawings, images, fonts)
// are binary data in which "/JS" turns up by chance, so they are skipped, but
// only when they look like data: a "body" holding an object header or a
// trailer is a disguise, and is scanned like the rest of the file.

/** Names whose presence means the PDF can run code, start a program or carry another file. */
const PDF_ACTIVE_NAMES: Record<string, string> = {
	JavaScript: 'JavaScript (/JavaScript)',
	JS: 'JavaScript (/JS)',
	Launch: 'an action that launches a program (/Launch)',
	EmbeddedFile: 'an embedded file (/EmbeddedFile)',
	EmbeddedFiles: 'embedded files (/EmbeddedFiles)',
	RichMedia: 'embedded rich media (/RichMedia)'
};

/** Stream filters (7.4), long and inline-image short forms: one of them on an object stream that does not inflate means it cannot be read. */
const PDF_FILTERS = new Set([
	'FlateDecode', 'Fl', 'LZWDecode', 'LZW', 'ASCIIHexDecode', 'AHx', 'ASCII85Decode', 'A85', 'RunLengthDecode', 'RL',
	'CCITTFaxDecode', 'CCF', 'JBIG2Decode', 'DCTDecode', 'DCT', 'JPXDecode', 'Crypt'
]);

const PDF_WHITE = '[\\x00\\t\\n\\f\\r ]';
/** A name token: '/' then regular characters up to the next white-space or delimiter (7.2.2, 7.3.5). */
const PDF_NAME = /\/([^\x00\t\n\f\r ()<>[\]{}/%]*)/g; // eslint-disable-line no-control-regex
/** A stream's body starts after the keyword and its end-of-line, following the dictionary's ">>" (7.3.8). */
const PDF_STREAM_START = new RegExp(`>>${PDF_WHITE}*stream(?:\\r\\n|\\n|\\r)`, 'g');
/** File structure that has no business inside a stream's data: "12 0 obj", a trailer, startxref (7.3.10, 7.5). */
const PDF_STRUCTURE = new RegExp(`\\d${PDF_WHITE}+\\d+${PDF_WHITE}*obj|trailer|startxref`);
const PDF_HEADER = /^%PDF-\d\.\d/;
/** Readers look for %%EOF within the last 1024 bytes (PDF Reference 1.7, Appendix H, implementation note 18). */
const PDF_EOF_WINDOW = 1024;
/** An object stream that inflates beyond this is refused rather than read. */
const PDF_OBJECT_STREAM_MAX_BYTES = 32 * 1024 * 1024;

function problemInPdf(bytes: Uint8Array): string | null {
	const text = latin1(bytes);
	if (!PDF_HEADER.test(text)) return 'starts with %PDF- but has no version number after it, so it is not a readable PDF.';
	if (!text.slice(-PDF_EOF_WINDOW).includes('%%EOF')) {
		return 'is an incomplete PDF: it has no %%EOF marker near its end, so the upload may have been cut short.';
	}

	const { outsideStreams, objectStreams } = pdfLayout(text);
	const namesOutside = pdfNames(outsideStreams);
	if (namesOutside.has('Encrypt')) {
		return 'is a password-protected or encrypted PDF, so its content cannot be checked: upload a copy without protection.';
	}
	const active = firstActive(namesOutside);
	if (active !== null) return activePdfSentence(active);

	for (const objectStream of objectStreams) {
		const unpacked = unpackObjectStream(objectStream);
		if (!unpacked.ok) return unpacked.problem;
		const inner = firstActive(pdfNames(unpacked.text));
		if (inner !== null) return activePdfSentence(inner);
	}
	return null;
}

function activePdfSentence(active: string): string {
	return `contains ${active}, which a data room does not accept: save or print it to a new PDF without scripts, actions or attachments and upload that.`;
}

interface PdfStream {
	/** The text from the end of the previous stream body up to this stream's ">>": its dictionary and any objects before it. */
	dictionary: string;
	body: string;
}

/**
 * Splits the file into the text outside stream bodies and the object streams
 * (/Type /ObjStm, 7.5.7). The next "endstream" and the next piece of file
 * structure are each searched once and reused while the scan moves forward,
 * so a file of many stream keywords costs one pass, not one pass per keyword.
 */
function pdfLayout(text: string): { outsideStreams: string; objectStreams: PdfStream[] } {
	const outside: string[] = [];
	const objectStreams: PdfStream[] = [];
	const streamStart = new RegExp(PDF_STREAM_START.source, 'g');
	const structure = new RegExp(PDF_STRUCTURE.source, 'g');
	let nextEnd = -1;
	let nextStructure = -1;
	let from = 0;
	for (let match = streamStart.exec(text); match !== null; match = streamStart.exec(text)) {
		const bodyStart = match.index + match[0].length;
		if (nextEnd < bodyStart) nextEnd = text.indexOf('endstream', bodyStart);
		if (nextEnd < 0) break;
		const bodyEnd = nextEnd;
		if (nextStructure < bodyStart) {
			structure.lastIndex = bodyStart;
			nextStructure = structure.exec(text)?.index ?? text.length;
		}
		if (nextStructure < bodyEnd) continue;
		const dictionary = text.slice(from, match.index + 2);
		outside.push(dictionary);
		if (pdfNames(dictionary).has('ObjStm')) objectStreams.push({ dictionary, body: text.slice(bodyStart, bodyEnd) });
		from = bodyEnd;
		streamStart.lastIndex = bodyEnd;
	}
	outside.push(text.slice(from));
	return { outsideStreams: outside.join('\n'), objectStreams };
}

/** Every name token in `text`, with #xx escapes decoded (so /J#61vaScript is /JavaScript). */
function pdfNames(text: string): Set<string> {
	const names = new Set<string>();
	const name = new RegExp(PDF_NAME.source, 'g');
	for (let match = name.exec(text); match !== null; match = name.exec(text)) {
		names.add(match[1].replace(/#([0-9A-Fa-f]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16))));
	}
	return names;
}

function firstActive(names: Set<string>): string | null {
	for (const [name, description] of Object.entries(PDF_ACTIVE_NAMES)) if (names.has(name)) return description;
	return null;
}

/**
 * The object stream's text to scan: its raw body, plus the body inflated
 * when it inflates. A body that declares a filter and does not inflate, or
 * that is stored with a predictor (which scrambles the inflated bytes), is
 * refused: its objects cannot be checked.
 */
function unpackObjectStream(stream: PdfStream): { ok: true; text: string } | { ok: false; problem: string } {
	const names = pdfNames(stream.dictionary);
	const unreadable = {
		ok: false as const,
		problem: 'stores objects in a compressed form this check cannot read, so it cannot be checked: save it again as a standard PDF and upload that.'
	};
	if (names.has('DecodeParms') || names.has('DP')) return unreadable;
	try {
		const inflated = inflateSync(Buffer.from(stream.body, 'latin1'), { maxOutputLength: PDF_OBJECT_STREAM_MAX_BYTES });
		return { ok: true, text: `${stream.body}\n${inflated.toString('latin1')}` };
	} catch {
		if ([...names].some((name) => PDF_FILTERS.has(name))) return unreadable;
		return { ok: true, text: stream.body };
	}
}

// --- PNG (ISO/IEC 15948:2004 / W3C PNG specification, 5.2-5.6)

const PNG_IHDR = 0x49484452;
const PNG_IDAT = 0x49444154;
const PNG_IEND = 0x49454e44;

function isAsciiLetter(byte: number): boolean {
	return (byte >= 0x41 && byte <= 0x5a) || (byte >= 0x61 && byte <= 0x7a);
}

function problemInPng(bytes: Uint8Array): string | null {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const cutShort = 'is a PNG image that is cut short: the upload may have been interrupted, so upload it again.';
	let at = PNG_SIGNATURE.length;
	let sawImageData = false;
	for (let index = 0; ; index++) {
		if (at + 12 > bytes.length) return cutShort;
		const length = view.getUint32(at);
		const type = view.getUint32(at + 4);
		if (![4, 5, 6, 7].every((i) => isAsciiLetter(bytes[at + i]))) {
			return 'is a damaged PNG image: one of its chunks has no valid type.';
		}
		if (index === 0 && (type !== PNG_IHDR || length !== 13)) {
			return 'is a damaged PNG image: it does not begin with an IHDR header chunk.';
		}
		const next = at + 12 + length;
		if (next > bytes.length) return cutShort;
		if (index === 0 && (view.getUint32(at + 8) === 0 || view.getUint32(at + 12) === 0)) {
			return 'is a damaged PNG image: its header gives a width or height of zero.';
		}
		if (type === PNG_IDAT) sawImageData = true;
		if (type === PNG_IEND) {
			if (!sawImageData) return 'is a damaged PNG image: it holds no image data (IDAT).';
			if (next !== bytes.length) return 'is a PNG image with other data after its end (IEND): save it again as a plain PNG.';
			return null;
		}
		at = next;
	}
}

// --- JPEG (ITU-T T.81, Annex B: SOI is FF D8, EOI is FF D9)

function problemInJpeg(bytes: Uint8Array): string | null {
	const n = bytes.length;
	if (n < 4 || bytes[n - 2] !== 0xff || bytes[n - 1] !== 0xd9) {
		return 'is a JPEG image that is cut short: it does not end with the JPEG end marker (FF D9), so upload it again.';
	}
	return null;
}

// --- CSV: text, recognised by elimination once no binary signature matched

// eslint-disable-next-line no-control-regex
const CSV_FORBIDDEN_CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
const SAVE_AS_CSV_UTF8 = 'save it from your spreadsheet as "CSV UTF-8" and upload that';

function problemInCsv(bytes: Uint8Array): string | null {
	if (matches(bytes, { bytes: [0xff, 0xfe] }) || matches(bytes, { bytes: [0xfe, 0xff] })) {
		return `is saved as UTF-16 text: ${SAVE_AS_CSV_UTF8}.`;
	}
	if (bytes.includes(0)) return 'contains NUL bytes, so it is binary data, not CSV text.';
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
	} catch {
		return `is not valid UTF-8 text (it may be saved in an older encoding such as Windows-1252): ${SAVE_AS_CSV_UTF8}.`;
	}
	if (text.trim() === '') return 'holds no text.';
	const control = CSV_FORBIDDEN_CONTROL.exec(text);
	if (control !== null) {
		const line = text.slice(0, control.index).split('\n').length;
		return `contains a control character (${codePointOf(control[0])}) on line ${line}; a CSV holds only text, tabs and line breaks.`;
	}
	return null;
}
