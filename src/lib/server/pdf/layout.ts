/**
 * Pages of the summary: a cursor that moves down the page and turns to a new
 * one when the next block will not fit, and, once every page exists, the
 * frame each page gets (a header after the cover, a footer on every page with
 * the cautions, "page n of N" and an investor's stamp).
 */
import { printable } from './fonts';
import { colours, page, type } from './style';

export type Orientation = 'portrait' | 'landscape';

export class PageFlow {
	readonly doc: PDFKit.PDFDocument;

	constructor(doc: PDFKit.PDFDocument) {
		this.doc = doc;
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
		this.doc.addPage({ size: page.size, layout: orientation, margins: page.margin });
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
	/** "Project: scenario (revision 3)" in the header of every page after the cover. */
	headerText: string;
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

function drawHeader(doc: PDFKit.PDFDocument, frame: PageFrame): void {
	const left = doc.page.margins.left;
	const right = doc.page.width - doc.page.margins.right;
	const y = page.headerY;
	const labelWidth = Math.min(220, (right - left) * 0.4);
	doc.font('sans').fontSize(type.small).fillColor(colours.muted);
	// One line each: a long name ends in an ellipsis rather than running into the rule.
	const oneLine = { lineBreak: false, ellipsis: true, height: doc.currentLineHeight(true) } as const;
	doc.text(printable(frame.headerText), left, y, { ...oneLine, width: right - left - labelWidth - 12 });
	doc.text(printable(frame.editionLabel), right - labelWidth, y, { ...oneLine, width: labelWidth, align: 'right' });
	doc.moveTo(left, y + 14).lineTo(right, y + 14).lineWidth(0.5).strokeColor(colours.rule).stroke();
}

function drawFooter(doc: PDFKit.PDFDocument, frame: PageFrame, pageNumber: number, pageCount: number): void {
	const left = doc.page.margins.left;
	const right = doc.page.width - doc.page.margins.right;
	const width = right - left;
	const lastLineY = doc.page.height - 30;

	const pageText = `${printable(frame.editionLabel)} · Page ${pageNumber} of ${pageCount}`;
	doc.font('sans').fontSize(type.small);
	const pageWidth = doc.widthOfString(pageText) + 2;
	doc.fillColor(colours.text).text(pageText, right - pageWidth, lastLineY, { width: pageWidth, align: 'right', lineBreak: false });

	let aboveY = lastLineY - page.footerGap / 2;
	if (frame.stamp) {
		// Beside the page number when it fits; a long address gets a line of its own above the cautions.
		const stamp = printable(stampText(frame.stamp));
		doc.font('sansBold').fontSize(type.small).fillColor(colours.accent);
		const besideWidth = width - pageWidth - 16;
		if (doc.widthOfString(stamp) <= besideWidth) doc.text(stamp, left, lastLineY, { width: besideWidth, lineBreak: false });
		else {
			const height = doc.heightOfString(stamp, { width });
			aboveY -= height;
			doc.text(stamp, left, aboveY, { width });
			aboveY -= 2;
		}
	}

	const cautions = printable(`Read with care. ${frame.cautions.join(' ')}`);
	doc.font('sans').fontSize(type.tiny);
	const cautionsHeight = doc.heightOfString(cautions, { width, lineGap: 1 });
	const cautionsY = aboveY - cautionsHeight;
	doc.fillColor(colours.muted).text(cautions, left, cautionsY, { width, lineGap: 1 });
	const ruleY = cautionsY - 6;
	doc.moveTo(left, ruleY).lineTo(right, ruleY).lineWidth(0.5).strokeColor(colours.rule).stroke();
}
