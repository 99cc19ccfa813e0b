import { describe, expect, it } from 'vitest';
import { noteBlocks, plainText } from './markdown';

describe('noteBlocks', () => {
	it('drops the leading title, keeps later headings, paragraphs with their bold runs and formula blocks', () => {
		const blocks = noteBlocks('# The title\n\nA **real** rate.\n\n```\nLCOE = C / E\n  aligned\n```\n\n## Sources\n\nA book.');
		expect(blocks).toEqual([
			{ kind: 'paragraph', runs: [{ text: 'A ', bold: false }, { text: 'real', bold: true }, { text: ' rate.', bold: false }] },
			{ kind: 'formula', lines: ['LCOE = C / E', '  aligned'] },
			{ kind: 'heading', level: 2, text: 'Sources' },
			{ kind: 'paragraph', runs: [{ text: 'A book.', bold: false }] }
		]);
	});

	it('numbers ordered lists, bullets the others and indents nested items', () => {
		const blocks = noteBlocks('1. first\n2. second\n   - inner\n\n- alone');
		expect(blocks.map((b) => (b.kind === 'item' ? [b.marker, b.depth, plainText(b.runs)] : b.kind))).toEqual([
			['1.', 0, 'first'],
			['2.', 0, 'second'],
			['•', 1, 'inner'],
			['•', 0, 'alone']
		]);
	});

	it('keeps the words of links and inline code, and drops tables, rules and raw HTML tags as markup', () => {
		const blocks = noteBlocks('See [the NPV note](npv.md) and `CRF(r, N)`.\n\n| a | b |\n|---|---|\n| 1 | 2 |\n\n---\n\nEnd.');
		expect(blocks.map((b) => (b.kind === 'paragraph' ? plainText(b.runs) : b.kind))).toEqual(['See the NPV note and CRF(r, N).', 'End.']);
	});

	it('keeps a first-level heading that comes after text', () => {
		expect(noteBlocks('Intro.\n\n# Later')).toContainEqual({ kind: 'heading', level: 1, text: 'Later' });
	});
});

describe('plainText', () => {
	it('joins the runs', () => {
		expect(plainText([{ text: 'a ', bold: false }, { text: 'b', bold: true }])).toBe('a b');
	});
});
