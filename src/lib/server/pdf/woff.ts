/**
 * WOFF 1.0 to a plain TrueType/OpenType file (W3C WOFF File Format 1.0,
 * sections 3 to 5): the same tables, each inflated with Node's zlib. pdfkit's
 * font parser inflates every WOFF table again for each document with a
 * JavaScript inflater, which took most of a summary's time; a font unpacked
 * once per process costs nothing after.
 */
import { inflateSync } from 'node:zlib';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER_SIZE = 44;
const WOFF_ENTRY_SIZE = 20;
const SFNT_HEADER_SIZE = 12;
const SFNT_ENTRY_SIZE = 16;

const pad4 = (n: number) => (n + 3) & ~3;

export function woffToSfnt(woff: Uint8Array): Buffer {
	const input = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
	if (input.length < WOFF_HEADER_SIZE || input.readUInt32BE(0) !== WOFF_SIGNATURE) throw new Error('Not a WOFF 1.0 font file (its signature is not wOFF).');
	const flavor = input.readUInt32BE(4);
	const numTables = input.readUInt16BE(12);
	const tables = Array.from({ length: numTables }, (_, i) => {
		const at = WOFF_HEADER_SIZE + i * WOFF_ENTRY_SIZE;
		const tag = input.readUInt32BE(at);
		const offset = input.readUInt32BE(at + 4);
		const compLength = input.readUInt32BE(at + 8);
		const origLength = input.readUInt32BE(at + 12);
		const checksum = input.readUInt32BE(at + 16);
		const stored = input.subarray(offset, offset + compLength);
		const data = compLength < origLength ? inflateSync(stored) : stored;
		if (data.length !== origLength) throw new Error(`WOFF table ${tag.toString(16)} inflates to ${data.length} bytes, not ${origLength}.`);
		return { tag, checksum, data };
	});
	// The SFNT table directory is sorted by tag; WOFF keeps the same order, sorted here all the same.
	tables.sort((a, b) => a.tag - b.tag);

	const directorySize = SFNT_HEADER_SIZE + numTables * SFNT_ENTRY_SIZE;
	const total = tables.reduce((sum, t) => sum + pad4(t.data.length), directorySize);
	const out = Buffer.alloc(total);
	const power = 2 ** Math.floor(Math.log2(Math.max(1, numTables)));
	out.writeUInt32BE(flavor, 0);
	out.writeUInt16BE(numTables, 4);
	out.writeUInt16BE(power * 16, 6);
	out.writeUInt16BE(Math.log2(power), 8);
	out.writeUInt16BE(numTables * 16 - power * 16, 10);
	let offset = directorySize;
	tables.forEach((table, i) => {
		const at = SFNT_HEADER_SIZE + i * SFNT_ENTRY_SIZE;
		out.writeUInt32BE(table.tag, at);
		out.writeUInt32BE(table.checksum, at + 4);
		out.writeUInt32BE(offset, at + 8);
		out.writeUInt32BE(table.data.length, at + 12);
		table.data.copy(out, offset);
		offset += pad4(table.data.length);
	});
	return out;
}
