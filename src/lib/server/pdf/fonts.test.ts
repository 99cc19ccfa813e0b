import { describe, expect, it } from 'vitest';
import { fontFiles, printable } from './fonts';

describe('printable', () => {
	it('keeps what the fonts draw: Latin-1, dashes, quotes, the minus sign, ×, €', () => {
		expect(printable('Kestle Narrows – Ørsund “base” −6,441,517 € × ½ m³')).toBe('Kestle Narrows – Ørsund “base” −6,441,517 € × ½ m³');
	});

	it('writes a letter the fonts lack without its accent, else as a question mark, and lines as spaces', () => {
		expect(printable('Dőbrö\nŁódź ρ')).toBe('Dobrö ?ódz ?');
	});
});

describe('fontFiles', () => {
	it('unpacks each WOFF into a TrueType file pdfkit reads without inflating it again', () => {
		for (const [name, bytes] of Object.entries(fontFiles())) {
			expect(bytes.readUInt32BE(0), name).toBe(0x00010000);
		}
	});
});
