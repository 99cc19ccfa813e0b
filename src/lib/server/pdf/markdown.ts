/**
 * A method note's markdown as the few kinds of block the summary prints:
 * headings, paragraphs (with bold runs), list items and formula blocks (the
 * notes write their equations as code blocks). Everything else is dropped:
 * tables, rules, images, raw HTML; links keep their words, not their target.
 * The note's own "# " title is dropped too: the summary prints the title it is given.
 */
import MarkdownIt, { type Token } from 'markdown-it';

export interface TextRun {
	text: string;
	bold: boolean;
}

export type NoteBlock =
	| { kind: 'heading'; level: number; text: string }
	| { kind: 'paragraph'; runs: TextRun[] }
	| { kind: 'item'; depth: number; marker: string; runs: TextRun[] }
	| { kind: 'formula'; lines: string[] };

const markdown = new MarkdownIt({ html: false, linkify: false, typographer: false });

function runsOf(inline: Token | undefined): TextRun[] {
	const runs: TextRun[] = [];
	let bold = false;
	const add = (text: string) => {
		if (text === '') return;
		const last = runs[runs.length - 1];
		if (last && last.bold === bold) last.text += text;
		else runs.push({ text, bold });
	};
	for (const child of inline?.children ?? []) {
		if (child.type === 'strong_open') bold = true;
		else if (child.type === 'strong_close') bold = false;
		else if (child.type === 'text' || child.type === 'code_inline' || child.type === 'html_inline') add(child.content);
		else if (child.type === 'softbreak' || child.type === 'hardbreak') add(' ');
	}
	return runs;
}

export function plainText(runs: readonly TextRun[]): string {
	return runs.map((r) => r.text).join('');
}

/** The blocks of a note, its leading "# " title left out. */
export function noteBlocks(source: string): NoteBlock[] {
	const tokens = markdown.parse(source.replace(/^\uFEFF/, ''), {});
	const blocks: NoteBlock[] = [];
	/** Open lists, innermost last: ordered ones count their items. */
	const lists: { ordered: boolean; next: number }[] = [];
	let inItem = 0;
	let itemHasText = false;
	let sawContent = false;

	for (let i = 0; i < tokens.length; i++) {
		const token = tokens[i];
		switch (token.type) {
			case 'heading_open': {
				const level = Number(token.tag.slice(1));
				const text = plainText(runsOf(tokens[i + 1]));
				if (!(level === 1 && !sawContent)) blocks.push({ kind: 'heading', level, text });
				sawContent = true;
				i += 2;
				break;
			}
			case 'bullet_list_open':
			case 'ordered_list_open':
				lists.push({ ordered: token.type === 'ordered_list_open', next: Number(token.attrGet('start') ?? 1) });
				break;
			case 'bullet_list_close':
			case 'ordered_list_close':
				lists.pop();
				break;
			case 'list_item_open':
				inItem += 1;
				itemHasText = false;
				break;
			case 'list_item_close':
				inItem -= 1;
				break;
			case 'inline': {
				const runs = runsOf(token);
				sawContent = true;
				if (inItem > 0 && !itemHasText) {
					const list = lists[lists.length - 1];
					const marker = list?.ordered ? `${list.next++}.` : '•';
					blocks.push({ kind: 'item', depth: Math.max(0, lists.length - 1), marker, runs });
					itemHasText = true;
				} else if (runs.length > 0) blocks.push({ kind: 'paragraph', runs });
				break;
			}
			case 'fence':
			case 'code_block':
				sawContent = true;
				blocks.push({ kind: 'formula', lines: token.content.replace(/\n+$/, '').split('\n') });
				break;
			case 'table_open': {
				// Tables are not printed: skip to their end.
				while (i < tokens.length && tokens[i].type !== 'table_close') i++;
				sawContent = true;
				break;
			}
			default:
				break;
		}
	}
	return blocks;
}
