/**
 * Tables drawn with pdfkit: a header row (label, and the unit in a second
 * muted line) repeated at the top of every page the table runs onto, column
 * widths fitted to the content, numbers right-aligned, text cells wrapping.
 */
import { printable } from './fonts';
import type { Orientation, PageFlow } from './layout';
import { colours, type } from './style';

export interface TableColumn {
	header: string;
	/** Shown under the header in muted type: "EUR k", "MWh". */
	unit?: string;
	align?: 'left' | 'right';
	/** Text that may wrap over lines; numbers never wrap. */
	wrap?: boolean;
}

export interface TableSpec {
	columns: TableColumn[];
	rows: string[][];
	fontSize?: number;
	/** The smallest size the text may shrink to so that every column fits across the page. */
	minFontSize?: number;
	/** A background for a row (construction years), else the usual stripes. */
	rowShade?: (index: number) => string | undefined;
	/** Whether a number's text (in a right-aligned column) is negative, drawn in the signal colour. */
	negative?: (text: string) => boolean;
	/** What a page the table runs onto is called above the repeated header: "Annual cash flow (continued)". */
	continuedTitle?: string;
	/** The orientation of pages the table runs onto (the current one when left out). */
	orientation?: Orientation;
	/** False for a list of labelled facts, whose columns need no names. */
	header?: boolean;
	/** Widen the table to the full width (the default when a column wraps; else it keeps its own width). */
	stretch?: boolean;
}

const PAD_X = 4;
const PAD_Y = 3;
const LINE_GAP = 1;

interface Fitted {
	size: number;
	widths: number[];
}

/**
 * pdfkit's line wrapper counts a word's trailing space against the line and
 * breaks a word inside when it does not fit exactly, so every measured width
 * gets a space and a hair more.
 */
function slack(doc: PDFKit.PDFDocument): number {
	return doc.widthOfString(' ') + 0.5;
}

/** Widths fitted to the content; headers on one line when `headers` is 'whole', else as narrow as their longest word. */
function measure(doc: PDFKit.PDFDocument, spec: TableSpec, size: number, available: number, headers: 'whole' | 'words' = 'words'): number[] {
	return spec.columns.map((column, c) => {
		doc.font('sans').fontSize(size);
		const cells = spec.rows.map((row) => doc.widthOfString(printable(row[c] ?? '')));
		const content = Math.max(0, ...cells) + slack(doc);
		const unit = column.unit && spec.header !== false ? doc.widthOfString(printable(column.unit)) + slack(doc) : 0;
		doc.font('sansBold').fontSize(size);
		const words = spec.header === false ? [] : headers === 'whole' ? [printable(column.header)] : printable(column.header).split(/\s+/);
		const longestWord = Math.max(0, ...words.map((word) => doc.widthOfString(word))) + slack(doc);
		const wanted = column.wrap ? Math.min(content, available * 0.45) : content;
		return Math.max(wanted, longestWord, unit, size * 2) + 2 * PAD_X;
	});
}

/** The narrowest a wrapping column may get: its longest word (a word is never broken). */
function narrowest(doc: PDFKit.PDFDocument, spec: TableSpec, size: number, c: number): number {
	doc.font('sans').fontSize(size);
	const words = spec.rows.flatMap((row) => printable(row[c] ?? '').split(/\s+/));
	return Math.max(0, ...words.map((word) => doc.widthOfString(word))) + slack(doc) + 2 * PAD_X;
}

/** Widths that fit `available` at this size, or null: headers whole if they fit, else by words, else wrapping columns narrowed. */
function widthsAt(doc: PDFKit.PDFDocument, spec: TableSpec, size: number, available: number): number[] | null {
	const sum = (list: number[]) => list.reduce((a, b) => a + b, 0);
	const whole = measure(doc, spec, size, available, 'whole');
	if (sum(whole) <= available) return whole;
	const words = measure(doc, spec, size, available);
	if (sum(words) <= available) return words;
	const wrapping = spec.columns.map((c) => c.wrap === true);
	const fixed = sum(words.filter((_, i) => !wrapping[i]));
	const floors = words.map((w, i) => (wrapping[i] ? Math.min(w, narrowest(doc, spec, size, i)) : w));
	if (sum(floors) > available) return null;
	// Share the room left between the wrapping columns in proportion to what each would like beyond its floor.
	const room = available - fixed;
	const floorTotal = sum(floors.filter((_, i) => wrapping[i]));
	const wishTotal = sum(words.filter((_, i) => wrapping[i])) - floorTotal;
	return words.map((w, i) => (wrapping[i] ? floors[i] + (wishTotal > 0 ? ((w - floors[i]) / wishTotal) * (room - floorTotal) : 0) : w));
}

/**
 * Column widths at the largest size that fits, narrowing text columns
 * before shrinking the type; spare width goes to the last wrapping column
 * (or, for a stretched table of figures, to every column alike).
 */
function fit(doc: PDFKit.PDFDocument, spec: TableSpec, available: number): Fitted {
	const largest = spec.fontSize ?? type.table;
	const smallest = spec.minFontSize ?? largest - 1.5;
	let size = largest;
	let widths = widthsAt(doc, spec, size, available);
	while (widths === null && size > smallest) {
		size = Math.max(smallest, size - 0.25);
		widths = widthsAt(doc, spec, size, available);
	}
	if (widths === null) {
		// Too wide even at the smallest size: every column narrowed alike (text may then break inside words).
		const measured = measure(doc, spec, size, available);
		const total = measured.reduce((a, b) => a + b, 0);
		return { size, widths: measured.map((w) => (w * available) / total) };
	}
	const total = widths.reduce((a, b) => a + b, 0);
	const spare = available - total;
	if (spare > 0.5 && (spec.stretch ?? spec.columns.some((c) => c.wrap))) {
		// The last text column takes the spare width: labels keep their own width, the words beside them get the rest.
		const lastWrapping = spec.columns.map((c) => c.wrap === true).lastIndexOf(true);
		if (lastWrapping >= 0) widths[lastWrapping] += spare;
		else widths = widths.map((w) => w + spare / widths!.length);
	} else if (spare > 0.5) {
		// A table of a few figures keeps its own width, with a little air.
		const extra = Math.min(14, spare / widths.length);
		widths = widths.map((w) => w + extra);
	}
	return { size, widths };
}

function headerHeight(doc: PDFKit.PDFDocument, spec: TableSpec, fitted: Fitted): number {
	if (spec.header === false) return 0;
	const heights = spec.columns.map((column, c) => {
		doc.font('sansBold').fontSize(fitted.size);
		let h = doc.heightOfString(printable(column.header), { width: fitted.widths[c] - 2 * PAD_X, lineGap: LINE_GAP });
		if (column.unit) {
			doc.font('sans').fontSize(fitted.size - 0.5);
			h += doc.heightOfString(printable(column.unit), { width: fitted.widths[c] - 2 * PAD_X });
		}
		return h;
	});
	return Math.max(...heights) + 2 * PAD_Y;
}

function drawHeader(flow: PageFlow, spec: TableSpec, fitted: Fitted, height: number): void {
	if (spec.header === false) return;
	const { doc } = flow;
	const y = flow.y;
	doc.rect(flow.left, y, fitted.widths.reduce((a, b) => a + b, 0), height).fill(colours.band);
	let x = flow.left;
	spec.columns.forEach((column, c) => {
		const width = fitted.widths[c] - 2 * PAD_X;
		const align = column.align ?? 'left';
		doc.font('sansBold').fontSize(fitted.size).fillColor(colours.text);
		doc.text(printable(column.header), x + PAD_X, y + PAD_Y, { width, align, lineGap: LINE_GAP });
		if (column.unit) {
			doc.font('sans').fontSize(fitted.size - 0.5).fillColor(colours.muted);
			doc.text(printable(column.unit), x + PAD_X, doc.y, { width, align });
		}
		x += fitted.widths[c];
	});
	const bottom = y + height;
	doc.moveTo(flow.left, bottom).lineTo(x, bottom).lineWidth(0.75).strokeColor(colours.faint).stroke();
	flow.y = bottom;
}

function rowHeight(doc: PDFKit.PDFDocument, spec: TableSpec, fitted: Fitted, row: string[]): number {
	doc.font('sans').fontSize(fitted.size);
	const oneLine = doc.currentLineHeight(true);
	const heights = spec.columns.map((column, c) =>
		column.wrap ? doc.heightOfString(printable(row[c] ?? ''), { width: fitted.widths[c] - 2 * PAD_X, lineGap: LINE_GAP }) : oneLine
	);
	return Math.max(oneLine, ...heights) + 2 * PAD_Y;
}

/** The height the whole table takes at the flow's width (before any page turn). */
export function tableHeight(flow: PageFlow, spec: TableSpec): number {
	const fitted = fit(flow.doc, spec, flow.width);
	return headerHeight(flow.doc, spec, fitted) + spec.rows.reduce((sum, row) => sum + rowHeight(flow.doc, spec, fitted, row), 0);
}

/**
 * Draws the table at the cursor, turning pages as it needs with the header
 * repeated on each; answers the number of pages it ran onto after the first.
 */
export function drawTable(flow: PageFlow, spec: TableSpec): { pagesTurned: number } {
	const { doc } = flow;
	const fitted = fit(doc, spec, flow.width);
	const tableWidth = fitted.widths.reduce((a, b) => a + b, 0);
	const header = headerHeight(doc, spec, fitted);
	const firstRow = spec.rows.length > 0 ? rowHeight(doc, spec, fitted, spec.rows[0]) : 0;
	flow.ensure(header + firstRow);
	drawHeader(flow, spec, fitted, header);
	let pagesTurned = 0;

	spec.rows.forEach((row, r) => {
		const height = rowHeight(doc, spec, fitted, row);
		if (flow.y + height > flow.bottom) {
			flow.newPage(spec.orientation ?? flow.orientation);
			pagesTurned += 1;
			if (spec.continuedTitle) {
				doc.font('sans').fontSize(type.small).fillColor(colours.muted);
				doc.text(printable(spec.continuedTitle), flow.left, flow.y, { width: flow.width });
				flow.y += 4;
			}
			drawHeader(flow, spec, fitted, header);
		}
		const y = flow.y;
		const shade = spec.rowShade?.(r) ?? (r % 2 === 1 ? colours.stripe : undefined);
		if (shade) doc.rect(flow.left, y, tableWidth, height).fill(shade);
		let x = flow.left;
		spec.columns.forEach((column, c) => {
			const text = printable(row[c] ?? '');
			const signal = column.align === 'right' && spec.negative?.(text) === true;
			doc.font('sans').fontSize(fitted.size).fillColor(signal ? colours.target : colours.ink);
			doc.text(text, x + PAD_X, y + PAD_Y, {
				width: fitted.widths[c] - 2 * PAD_X,
				align: column.align ?? 'left',
				lineGap: LINE_GAP,
				lineBreak: column.wrap === true
			});
			x += fitted.widths[c];
		});
		flow.y = y + height;
	});
	doc.moveTo(flow.left, flow.y).lineTo(flow.left + tableWidth, flow.y).lineWidth(0.5).strokeColor(colours.rule).stroke();
	flow.y += 10;
	doc.x = flow.left;
	return { pagesTurned };
}
