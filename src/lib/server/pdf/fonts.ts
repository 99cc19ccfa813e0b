/**
 * The summary's fonts, from the npm font packages the app already ships (no
 * font host, no system fonts): IBM Plex Sans for text, Fraunces for headings,
 * IBM Plex Mono for formulas. pdfkit reads .woff but not .woff2, so the .woff
 * files are used. The files are read once per process; each document
 * registers them once and embeds only the glyphs it uses.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { woffToSfnt } from './woff';

export const FONTS = {
	sans: '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff',
	sansBold: '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-700-normal.woff',
	display: '@fontsource/fraunces/files/fraunces-latin-600-normal.woff',
	mono: '@fontsource/ibm-plex-mono/files/ibm-plex-mono-latin-400-normal.woff'
} as const;

export type FontName = keyof typeof FONTS;

const require = createRequire(import.meta.url);
let files: Record<FontName, Buffer> | undefined;

/**
 * The fonts as plain TrueType, read and unpacked on first use (resolved
 * through node_modules, so a built app finds them too).
 */
export function fontFiles(): Record<FontName, Buffer> {
	files ??= Object.fromEntries(Object.entries(FONTS).map(([name, module]) => [name, woffToSfnt(readFileSync(require.resolve(module)))])) as Record<FontName, Buffer>;
	return files;
}

/** Registers every font under its name (`doc.font('display')`). */
export function registerFonts(doc: PDFKit.PDFDocument): void {
	for (const [name, bytes] of Object.entries(fontFiles())) doc.registerFont(name, bytes);
}

/**
 * Code points all four files draw: each is the Latin subset of its family
 * (measured from the files of the pinned @fontsource 5.3.0 packages).
 */
const COVERED_RANGES: readonly [number, number][] = [
	[0x20, 0x7e], [0xa0, 0xff], [0x131, 0x131], [0x152, 0x153], [0x2bc, 0x2bc], [0x2c6, 0x2c6], [0x2da, 0x2da], [0x2dc, 0x2dc],
	[0x2013, 0x2014], [0x2018, 0x201a], [0x201c, 0x201e], [0x2022, 0x2022], [0x2026, 0x2026], [0x2032, 0x2033], [0x2039, 0x203a],
	[0x2044, 0x2044], [0x20ac, 0x20ac], [0x2122, 0x2122], [0x2212, 0x2212], [0x2215, 0x2215]
];

function covered(cp: number): boolean {
	return COVERED_RANGES.some(([from, to]) => cp >= from && cp <= to);
}

/**
 * Text the fonts can draw: a letter they lack is written without its accent
 * when that helps (ő becomes o; ł, with no plain form, becomes ?), else as "?", so no
 * blank box appears in a name typed in another script. Line breaks and tabs
 * become spaces.
 */
export function printable(text: string): string {
	let out = '';
	for (const char of text.replace(/[\t\r\n]+/g, ' ')) {
		const cp = char.codePointAt(0)!;
		if (covered(cp)) {
			out += char;
			continue;
		}
		const base = char.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
		out += base !== '' && [...base].every((c) => covered(c.codePointAt(0)!)) ? base : '?';
	}
	return out;
}
