import { describe, expect, it } from 'vitest';
import { decodeCsvBytes, DEFAULT_MAX_BYTES } from './decode';

const utf8 = (text: string) => new TextEncoder().encode(text);
const bytes = (...values: number[]) => Uint8Array.from(values);
const concat = (...parts: Uint8Array[]) => Uint8Array.from(parts.flatMap((p) => [...p]));

function messageOf(result: ReturnType<typeof decodeCsvBytes>): string {
	if (result.ok) throw new Error('expected a failure');
	expect(result.errors).toHaveLength(1);
	return result.errors[0].message;
}

describe('decodeCsvBytes: size', () => {
	it('defaults to a 20 MB limit', () => {
		expect(DEFAULT_MAX_BYTES).toBe(20 * 1024 * 1024);
	});

	it('refuses a file over the limit by its byte length, before reading it', () => {
		// 21 MB of zero bytes would be "binary" if it were read: the size message proves the check comes first.
		const huge = new Uint8Array(21 * 1024 * 1024);
		expect(messageOf(decodeCsvBytes(huge))).toBe(
			'The file is 21.0 MB, over the 20.0 MB limit for uploads. Split it into smaller files or average it to a longer interval.'
		);
	});

	it('takes the limit as a parameter', () => {
		expect(messageOf(decodeCsvBytes(utf8('a,b\n1,2\n'), 4))).toMatch(/over the 0\.0 MB limit/);
		expect(decodeCsvBytes(utf8('a,b\n'), 4).ok).toBe(true);
	});
});

describe('decodeCsvBytes: emptiness', () => {
	it('refuses zero bytes', () => {
		expect(messageOf(decodeCsvBytes(new Uint8Array(0)))).toBe('The file is empty.');
	});

	it('refuses a file of blank lines and spaces', () => {
		expect(messageOf(decodeCsvBytes(utf8('\n  \r\n\t\n')))).toBe('The file is empty.');
	});

	it('refuses a file holding only a UTF-8 byte-order mark', () => {
		expect(messageOf(decodeCsvBytes(bytes(0xef, 0xbb, 0xbf)))).toBe('The file is empty.');
	});
});

describe('decodeCsvBytes: encodings', () => {
	it('accepts a UTF-8 byte-order mark and drops it', () => {
		// The UTF-8 BOM is EF BB BF (Unicode Standard, ch. 23.8; WHATWG Encoding Standard).
		const result = decodeCsvBytes(concat(bytes(0xef, 0xbb, 0xbf), utf8('speed_m_s,hours\n')));
		expect(result).toEqual({ ok: true, text: 'speed_m_s,hours\n' });
	});

	it('accepts multi-byte UTF-8 such as a degree sign', () => {
		expect(decodeCsvBytes(utf8('direction_°,speed_m_s\n')).ok).toBe(true);
	});

	it('refuses UTF-16 little-endian (BOM FF FE) with a hint to save as UTF-8', () => {
		const le = concat(bytes(0xff, 0xfe), Uint8Array.from(Buffer.from('hs_m,te_s\n', 'utf16le')));
		expect(messageOf(decodeCsvBytes(le))).toBe(
			'The file is saved as UTF-16 ("Unicode text"), not UTF-8. Save it from your spreadsheet as "CSV UTF-8 (comma delimited)" and upload that file.'
		);
	});

	it('refuses UTF-16 big-endian (BOM FE FF)', () => {
		expect(messageOf(decodeCsvBytes(bytes(0xfe, 0xff, 0x00, 0x61)))).toMatch(/saved as UTF-16/);
	});

	it('refuses UTF-16 without a byte-order mark (a zero byte beside every character)', () => {
		const le = Uint8Array.from(Buffer.from('speed_m_s,hours\n0.1,20\n', 'utf16le'));
		expect(messageOf(decodeCsvBytes(le))).toMatch(/^The file looks like UTF-16 text, not UTF-8\./);
	});

	it('refuses invalid UTF-8 and names the row of the first bad byte', () => {
		// 0xE9 is "é" in Windows-1252 / Latin-1; alone it is not a valid UTF-8 sequence (RFC 3629 section 3).
		const latin1 = concat(utf8('timestamp,speed_m_s\n2025-01-01T00:00Z,1.0\ncaf'), bytes(0xe9), utf8(',1\n'));
		expect(messageOf(decodeCsvBytes(latin1))).toMatch(
			/^The file is not valid UTF-8 text \(the first bad character is on row 3\); it was probably saved in an older encoding/
		);
	});

	it('refuses an overlong UTF-8 encoding', () => {
		// C0 AF is an overlong "/" that RFC 3629 forbids decoders to accept.
		expect(messageOf(decodeCsvBytes(concat(utf8('a,b\n'), bytes(0xc0, 0xaf))))).toMatch(/not valid UTF-8/);
	});
});

describe('decodeCsvBytes: binary content', () => {
	it('names an Excel workbook (a zip: local file header PK 03 04, PKWARE APPNOTE 4.3.7)', () => {
		const xlsx = concat(bytes(0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00), utf8('[Content_Types].xml'));
		expect(messageOf(decodeCsvBytes(xlsx))).toBe(
			'This file is a zip archive or an Excel workbook (.xlsx), not a CSV file. Save it from your spreadsheet as "CSV UTF-8 (comma delimited)" and upload that file.'
		);
	});

	it('names an old Excel workbook (compound file signature D0 CF 11 E0)', () => {
		expect(messageOf(decodeCsvBytes(bytes(0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1)))).toMatch(/old-style Excel/);
	});

	it('names a PDF (it starts with "%PDF", ISO 32000-1 section 7.5.2)', () => {
		const pdf = concat(utf8('%PDF-1.7\n'), bytes(0x25, 0xe2, 0xe3, 0xcf, 0xd3, 0x00));
		expect(messageOf(decodeCsvBytes(pdf))).toMatch(/^This file is a PDF, not a CSV file\./);
	});

	it('refuses text with a zero byte in it', () => {
		expect(messageOf(decodeCsvBytes(concat(utf8('speed_m_s,hours\n0.1,'), bytes(0), utf8('2\n'))))).toMatch(
			/^This file holds binary data, not CSV text\./
		);
	});

	it('refuses control characters and names their row', () => {
		expect(messageOf(decodeCsvBytes(utf8('speed_m_s,hours\n0.1,2\n0.2,\u00073\n')))).toMatch(
			/binary data, not CSV text \(a control character was found on row 3\)/
		);
	});

	it('keeps tabs and both line endings as text', () => {
		expect(decodeCsvBytes(utf8('a\tb\r\n1\t2\r3\t4\n'))).toEqual({ ok: true, text: 'a\tb\r\n1\t2\r3\t4\n' });
	});
});
