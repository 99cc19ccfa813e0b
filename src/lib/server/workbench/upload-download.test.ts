import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { uploadDownload } from './upload-download';

const bytes = (text: string) => new TextEncoder().encode(text);
const text = (data: Uint8Array) => new TextDecoder('utf-8', { ignoreBOM: true }).decode(data);

describe('uploadDownload', () => {
	it('gives a file without formula cells back byte for byte', () => {
		const template = new Uint8Array(readFileSync('static/templates/power-curve.csv'));
		const download = uploadDownload(template);
		expect(download).toMatchObject({ contentType: 'text/csv; charset=utf-8', neutralisedCells: 0 });
		expect(Buffer.compare(Buffer.from(download.bytes), Buffer.from(template))).toBe(0);
	});

	it('defuses each cell a spreadsheet would run as a formula and leaves numbers, negative ones included, alone', () => {
		const download = uploadDownload(bytes('speed_m_s,power_kW,note\r\n0.5,-0.0,=1+1\r\n1.0,100,@SUM(A1)\r\n1.5,+3,"=HYPERLINK(""x"",""y"")"\r\n'));
		expect(text(download.bytes)).toBe(
			"speed_m_s,power_kW,note\r\n0.5,-0.0,'=1+1\r\n1.0,100,'@SUM(A1)\r\n1.5,'+3,\"'=HYPERLINK(\"\"x\"\",\"\"y\"\")\"\r\n"
		);
		expect(download.neutralisedCells).toBe(4);
	});

	it('keeps the file’s own delimiter, line ends and byte-order mark', () => {
		const download = uploadDownload(bytes('\uFEFFspeed_m_s;power_kW;note\n0,5;0;-x\n1,0;100;a;b\n'));
		expect(text(download.bytes)).toBe("\uFEFFspeed_m_s;power_kW;note\n0,5;0;'-x\n1,0;100;a;b\n");
	});

	it('quotes a defused cell that holds the delimiter', () => {
		const download = uploadDownload(bytes('a\tb\n=1+1\t"x\ty"\n'));
		expect(text(download.bytes)).toBe('a\tb\n\'=1+1\t"x\ty"\n');
	});

	it('answers what is not CSV text unchanged, as an opaque attachment', () => {
		const pdf = new Uint8Array([0x25, 0x50, 0x44, 0x46, 0x00, 0x3d, 0x31]);
		expect(uploadDownload(pdf)).toEqual({ bytes: pdf, contentType: 'application/octet-stream', neutralisedCells: 0 });
	});
});
