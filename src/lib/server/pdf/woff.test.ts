import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { woffToSfnt } from './woff';

const require = createRequire(import.meta.url);
const woff = readFileSync(require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'));

/** Tag -> length from an SFNT table directory (OpenType spec, "Table directory"). */
function sfntTables(font: Buffer): Map<string, number> {
	const count = font.readUInt16BE(4);
	return new Map(Array.from({ length: count }, (_, i) => [font.toString('latin1', 12 + i * 16, 16 + i * 16), font.readUInt32BE(12 + i * 16 + 12)]));
}

describe('woffToSfnt', () => {
	it('gives an SFNT with every WOFF table at its original length (W3C WOFF 1.0, table directory)', () => {
		const sfnt = woffToSfnt(woff);
		const count = woff.readUInt16BE(12);
		const expected = new Map(Array.from({ length: count }, (_, i) => [woff.toString('latin1', 44 + i * 20, 48 + i * 20), woff.readUInt32BE(44 + i * 20 + 12)]));
		expect(sfnt.readUInt32BE(0)).toBe(woff.readUInt32BE(4));
		expect(sfntTables(sfnt)).toEqual(expected);
		expect(sfnt.readUInt32BE(0)).toBe(0x00010000);
		// The directory's binary-search fields, from the table count (OpenType spec): searchRange = 16 x 2^floor(log2 n).
		expect(sfnt.readUInt16BE(6)).toBe(16 * 2 ** Math.floor(Math.log2(count)));
	});

	it('refuses a file that is not WOFF 1.0', () => {
		expect(() => woffToSfnt(Buffer.from('wOF2 and more bytes than a header needs, padded out to forty-four'))).toThrow(/not a WOFF 1.0/i);
	});
});
