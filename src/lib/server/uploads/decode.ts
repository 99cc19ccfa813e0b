/**
 * Turns upload bytes into text, refusing what is not a UTF-8 CSV before any
 * parsing starts: too large, empty, UTF-16, invalid UTF-8, or binary (a
 * workbook, a PDF, an image). A UTF-8 byte-order mark is accepted and dropped.
 */
import { fileFailure, type UploadFailure } from './result';

/** 20 MB: a 10-year, 10-minute series (about 526,000 rows) fits with room to spare. */
export const DEFAULT_MAX_BYTES = 20 * 1024 * 1024;

export type DecodeResult = { ok: true; text: string } | UploadFailure;

const SAVE_AS_UTF8 = 'Save it from your spreadsheet as "CSV UTF-8 (comma delimited)" and upload that file.';

function startsWith(bytes: Uint8Array, signature: readonly number[]): boolean {
	if (bytes.length < signature.length) return false;
	return signature.every((b, i) => bytes[i] === b);
}

function formatMegabytes(byteCount: number): string {
	return `${(byteCount / (1024 * 1024)).toFixed(1)} MB`;
}

/** Names what a binary upload probably is, from its first bytes. */
function describeBinary(bytes: Uint8Array): string {
	if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) {
		return 'This file is a zip archive or an Excel workbook (.xlsx), not a CSV file.';
	}
	if (startsWith(bytes, [0xd0, 0xcf, 0x11, 0xe0])) {
		return 'This file is an old-style Excel workbook (.xls), not a CSV file.';
	}
	if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46])) return 'This file is a PDF, not a CSV file.';
	if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47]) || startsWith(bytes, [0xff, 0xd8, 0xff])) {
		return 'This file is an image, not a CSV file.';
	}
	return 'This file holds binary data, not CSV text.';
}

/** Zero bytes at every other position are the mark of UTF-16 text saved without a byte-order mark. */
function looksLikeUtf16WithoutBom(bytes: Uint8Array): boolean {
	const sample = Math.min(bytes.length, 512);
	if (sample < 4) return false;
	let evenZeros = 0;
	let oddZeros = 0;
	for (let i = 0; i < sample; i++) {
		if (bytes[i] !== 0) continue;
		if (i % 2 === 0) evenZeros++;
		else oddZeros++;
	}
	const half = sample / 2;
	return evenZeros > half * 0.8 || oddZeros > half * 0.8;
}

function rowOfOffset(text: string, offset: number): number {
	let row = 1;
	for (let i = 0; i < offset; i++) if (text.charCodeAt(i) === 10) row++;
	return row;
}

// C0 control characters other than tab, line feed and carriage return, and DEL.
const CONTROL_CHARACTER = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;

export function decodeCsvBytes(bytes: Uint8Array, maxBytes = DEFAULT_MAX_BYTES): DecodeResult {
	if (bytes.byteLength > maxBytes) {
		return fileFailure(
			`The file is ${formatMegabytes(bytes.byteLength)}, over the ${formatMegabytes(maxBytes)} limit for uploads. ` +
				'Split it into smaller files or average it to a longer interval.'
		);
	}
	if (startsWith(bytes, [0xff, 0xfe]) || startsWith(bytes, [0xfe, 0xff])) {
		return fileFailure(`The file is saved as UTF-16 ("Unicode text"), not UTF-8. ${SAVE_AS_UTF8}`);
	}
	const hasUtf8Bom = startsWith(bytes, [0xef, 0xbb, 0xbf]);
	const body = hasUtf8Bom ? bytes.subarray(3) : bytes;

	if (body.indexOf(0) !== -1) {
		if (looksLikeUtf16WithoutBom(body)) {
			return fileFailure(`The file looks like UTF-16 text, not UTF-8. ${SAVE_AS_UTF8}`);
		}
		return fileFailure(`${describeBinary(body)} ${SAVE_AS_UTF8}`);
	}
	if (startsWith(body, [0x50, 0x4b, 0x03, 0x04]) || startsWith(body, [0xd0, 0xcf, 0x11, 0xe0])) {
		return fileFailure(`${describeBinary(body)} ${SAVE_AS_UTF8}`);
	}

	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(body);
	} catch {
		// Decode again leniently only to say where the first bad byte sits.
		const lenient = new TextDecoder('utf-8').decode(body);
		const row = rowOfOffset(lenient, lenient.indexOf('\uFFFD'));
		return fileFailure(
			`The file is not valid UTF-8 text (the first bad character is on row ${row}); ` +
				`it was probably saved in an older encoding such as Windows-1252 or Latin-1. ${SAVE_AS_UTF8}`
		);
	}

	const control = CONTROL_CHARACTER.exec(text);
	if (control) {
		const row = rowOfOffset(text, control.index);
		return fileFailure(
			`This file holds binary data, not CSV text (a control character was found on row ${row}). ${SAVE_AS_UTF8}`
		);
	}
	if (text.trim() === '') return fileFailure('The file is empty.');
	return { ok: true, text };
}
