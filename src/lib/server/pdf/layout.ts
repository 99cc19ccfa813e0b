/**
 * Pages of the summary: a cursor that moves down the page and turns to a new
 * one when the next block will not fit, and, once every page exists, the
 * frame each page gets (a header with the project and scenario after the
 * cover; a footer on every page with the cautions, the edition, "page n of N"
 * and an investor's stamp).
 */
import { printable } from './fonts';
import { colours, page, type } from './style';

export type Orientation = 'portrait' | 'landscape';

export class PageFlow {
	readonly doc: PDFKit.PDFDocument;
	readonly #frame: PageFrame;
	#margins: { top: number; bottom: number; left: number; right: number } = { ...page.margin };
	#footerMeasured = false;

	/** The frame its pages will get: the footer's height sets the bottom margin. */
	constructor(doc: PDFKit.PDFDocument, frame: PageFrame) {
		this.doc = doc;
		this.#frame = frame;
	}

	get left(): number {
		return this.doc.page.margins.left;
	}
	get right(): number {
		return this.doc.page.width - this.doc.page.margins.right;
	}
	get width(): number {
		return this.right - this.left;
	}
	get top(): number {
		return this.doc.page.margins.top;
	}
	get bottom(): number {
		return this.doc.page.height - this.doc.page.margins.bottom;
	}
	get y(): number {
		return this.doc.y;
	}
	set y(value: number) {
		this.doc.y = value;
	}
	get orientation(): Orientation {
		return this.doc.page.width > this.doc.page.height ? 'landscape' : 'portrait';
	}
	/** Room left on this page below the cursor. */
	get room(): number {
		return this.bottom - this.y;
	}

	newPage(orientation: Orientation = 'portrait'): void {
		this.doc.addPage({ size: page.size, layout: orientation, margins: this.#margins });
		if (!this.#footerMeasured) {
			// A long stamp or long cautions make the footer taller: the text above it keeps clear (measured once, on the narrower portrait width).
			const width = Math.min(this.doc.page.width, this.doc.page.height) - this.#margins.left - this.#margins.right;
			this.#margins = { ...this.#margins, bottom: Math.max(page.margin.bottom, footerLayout(this.doc, this.#frame, width).height + 14) };
			this.doc.page.margins.bottom = this.#margins.bottom;
			this.#footerMeasured = true;
		}
		this.doc.x = this.left;
		this.doc.y = this.top;
	}

	/** Turns the page unless `height` fits below the cursor (an empty page always takes the block). */
	ensure(height: number): void {
		if (this.y + height > this.bottom && this.y > this.top + 1) this.newPage(this.orientation);
	}

	/** A chapter heading in Fraunces, kept with at least `keepWith` points of what follows. */
	heading(text: string, keepWith = 80): void {
		this.ensure(30 + keepWith);
		this.doc.font('display').fontSize(type.heading).fillColor(colours.ink);
		this.doc.text(printable(text), this.left, this.y, { width: this.width });
		this.y += 8;
	}

	/** A section heading in bold sans, kept with at least `keepWith` points of what follows. */
	subheading(text: string, keepWith = 50): void {
		this.ensure(20 + keepWith);
		this.y += 4;
		this.doc.font('sansBold').fontSize(type.subheading).fillColor(colours.text);
		this.doc.text(printable(text), this.left, this.y, { width: this.width });
		this.y += 4;
	}

	/** Body text that flows over pages as it needs. */
	paragraph(text: string, options: { size?: number; colour?: string; font?: string; gap?: number; indent?: number } = {}): void {
		const size = options.size ?? type.body;
		const indent = options.indent ?? 0;
		this.doc.font(options.font ?? 'sans').fontSize(size).fillColor(options.colour ?? colours.text);
		this.ensure(size * 2.6);
		this.doc.text(printable(text), this.left + indent, this.y, { width: this.width - indent, lineGap: 2 });
		this.y += options.gap ?? 6;
	}
}

export interface PageFrame {
	/** Beside the page number: whose copy this is. */
	editionLabel: string;
	/** In the header of every page after the cover: "Project: scenario (revision 3)", each part shortened to fit when need be. */
	header: { project: string; scenario: string };
	/** The cautions, in small type in every footer. */
	cautions: readonly string[];
	/** An investor's copy: "Prepared for <email> on <time> UTC" in every footer. */
	stamp?: { email: string; at: Date };
}

/** "2026-03-14 09:05 UTC" */
export function utcMinute(at: Date): string {
	return `${at.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export function stampText(stamp: { email: string; at: Date }): string {
	return `Prepared for ${stamp.email} on ${utcMinute(stamp.at)}`;
}

/**
 * Draws the header and footer on every buffered page (the document must be
 * made with bufferPages: true). Writing in the margins must not start new
 * pages, so the bottom margin is lifted while a footer is drawn.
 */
export function drawPageFrames(doc: PDFKit.PDFDocument, frame: PageFrame): void {
	const { start, count } = doc.bufferedPageRange();
	for (let index = start; index < start + count; index++) {
		doc.switchToPage(index);
		const margins = { ...doc.page.margins };
		doc.page.margins.bottom = 0;
		doc.page.margins.top = 0;
		if (index > start) drawHeader(doc, frame);
		drawFooter(doc, frame, index - start + 1, count);
		doc.page.margins.bottom = margins.bottom;
		doc.page.margins.top = margins.top;
	}
}

/** The project and scenario across the top (the edition is named in the footer, beside the page number). */
function drawHeader(doc: PDFKit.PDFDocument, frame: PageFrame): void {
	const left = doc.page.margins.left;
	const right = doc.page.width - doc.page.margins.right;
	const y = page.headerY;
	doc.font('sans').fontSize(type.small).fillColor(colours.muted);
	// One line: a long name ends in an ellipsis rather than running into the rule.
	const oneLine = { lineBreak: false, ellipsis: true, height: doc.currentLineHeight(true) } as const;
	const room = right - left;
	const project = `${printable(frame.header.project)}: `;
	const scenario = printable(frame.header.scenario);
	// The project's name gives way first, down to half the room, so the scenario's name shows.
	const projectWidth = Math.min(doc.widthOfString(project) + 1, Math.max(room / 2, room - doc.widthOfString(scenario) - 1));
	doc.text(project, left, y, { ...oneLine, width: projectWidth });
	doc.text(scenario, left + projectWidth, y, { ...oneLine, width: room - projectWidth });
	doc.moveTo(left, y + 14).lineTo(right, y + 14).lineWidth(0.5).strokeColor(colours.rule).stroke();
}

/** Where the footer's last line sits: this far above the page's bottom edge. */
const FOOTER_LAST_LINE = 30;

interface FooterLayout {
	pageText: string;
	stamp: string | null;
	/** The stamp fits beside the page number; else it takes lines of its own above it. */
	stampBeside: boolean;
	stampHeight: number;
	cautions: string;
	cautionsHeight: number;
	/** From the page's bottom edge to the rule above the cautions. */
	height: number;
}

function footerLayout(doc: PDFKit.PDFDocument, frame: PageFrame, width: number, pageNumber = 999, pageCount = 999): FooterLayout {
	const pageText = `${printable(frame.editionLabel)} · Page ${pageNumber} of ${pageCount}`;
	doc.font('sans').fontSize(type.small);
	const pageWidth = doc.widthOfString(pageText) + 2;
	const stamp = frame.stamp ? printable(stampText(frame.stamp)) : null;
	doc.font('sansBold').fontSize(type.small);
	const stampBeside = stamp === null || doc.widthOfString(stamp) <= width - pageWidth - 16;
	const stampHeight = stamp === null || stampBeside ? 0 : doc.heightOfString(stamp, { width }) + 2;
	const cautions = printable(`Read with care. ${frame.cautions.join(' ')}`);
	doc.font('sans').fontSize(type.tiny);
	const cautionsHeight = doc.heightOfString(cautions, { width, lineGap: 1 });
	const height = FOOTER_LAST_LINE + page.footerGap / 2 + stampHeight + cautionsHeight + 6;
	return { pageText, stamp, stampBeside, stampHeight, cautions, cautionsHeight, height };
}

function drawFooter(doc: PDFKit.PDFDocument, frame: PageFrame, pageNumber: number, pageCount: number): void {
	const left = doc.page.margins.left;
	const right = doc.page.width - doc.page.margins.right;
	const width = right - left;
	const layout = footerLayout(doc, frame, width, pageNumber, pageCount);
	const lastLineY = doc.page.height - FOOTER_LAST_LINE;

	doc.font('sans').fontSize(type.small);
	const pageWidth = doc.widthOfString(layout.pageText) + 2;
	doc.fillColor(colours.text).text(layout.pageText, right - pageWidth, lastLineY, { width: pageWidth, align: 'right', lineBreak: false });

	let aboveY = lastLineY - page.footerGap / 2;
	if (layout.stamp !== null) {
		doc.font('sansBold').fontSize(type.small).fillColor(colours.accent);
		if (layout.stampBeside) doc.text(layout.stamp, left, lastLineY, { width: width - pageWidth - 16, lineBreak: false });
		else {
			aboveY -= layout.stampHeight;
			doc.text(layout.stamp, left, aboveY, { width });
		}
	}

	const cautionsY = aboveY - layout.cautionsHeight;
	doc.font('sans').fontSize(type.tiny).fillColor(colours.muted).text(layout.cautions, left, cautionsY, { width, lineGap: 1 });
	const ruleY = cautionsY - 6;
	doc.moveTo(left, ruleY).lineTo(right, ruleY).lineWidth(0.5).strokeColor(colours.rule).stroke();
}
