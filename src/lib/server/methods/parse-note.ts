/**
 * One method note from its markdown: the title (the first "# " heading), a
 * one-line summary (the first paragraph) and the body rendered to HTML.
 * Raw HTML in the markdown is escaped, not passed through; links to a
 * sibling note (`npv.md`) lead to that note's page.
 */
import MarkdownIt from 'markdown-it';
import { methodNoteHref } from '../../methods';

export interface ParsedNote {
	slug: string;
	title: string;
	summary: string;
	html: string;
}

const markdown = new MarkdownIt({ html: false, linkify: false, typographer: false });

const siblingNote = /^(?:\.\/)?([a-z0-9]+(?:-[a-z0-9]+)*)\.md(#[\w-]*)?$/;

const defaultLinkOpen = markdown.renderer.rules.link_open ?? ((tokens, idx, options, _env, self) => self.renderToken(tokens, idx, options));
markdown.renderer.rules.link_open = (tokens, idx, options, env, self) => {
	const token = tokens[idx];
	const href = String(token.attrGet('href') ?? '');
	const sibling = siblingNote.exec(href);
	if (sibling) token.attrSet('href', methodNoteHref(sibling[1]) + (sibling[2] ?? ''));
	else if (/^https?:\/\//i.test(href)) token.attrSet('rel', 'noopener noreferrer');
	return defaultLinkOpen(tokens, idx, options, env, self);
};

/** Drops a leading `---` front-matter block, if the note has one. */
function withoutFrontMatter(text: string): string {
	const match = /^---\r?\n[\s\S]*?\r?\n---\r?\n/.exec(text);
	return match ? text.slice(match[0].length) : text;
}

/** Markdown inline text as plain words: no emphasis marks, code ticks or link targets. */
function plainText(inline: string): string {
	return inline
		.replace(/\[([^\]]*)\]\([^)]*\)/g, '$1')
		.replace(/[*_`]/g, '')
		.replace(/\s+/g, ' ')
		.trim();
}

export function parseNote(slug: string, raw: string, fallbackTitle = slug): ParsedNote {
	const text = withoutFrontMatter(raw.replace(/^\uFEFF/, ''));
	const lines = text.split(/\r?\n/);
	const headingAt = lines.findIndex((line) => line.trim() !== '');
	const heading = headingAt >= 0 ? /^#\s+(.+?)\s*#*\s*$/.exec(lines[headingAt]) : null;
	const title = heading ? plainText(heading[1]) : fallbackTitle;
	const body = heading ? lines.slice(headingAt + 1).join('\n') : text;

	const tokens = markdown.parse(body, {});
	const firstParagraph = tokens.findIndex((t) => t.type === 'paragraph_open');
	const summary = firstParagraph >= 0 ? plainText(tokens[firstParagraph + 1]?.content ?? '') : '';

	return { slug, title, summary, html: markdown.render(body) };
}
