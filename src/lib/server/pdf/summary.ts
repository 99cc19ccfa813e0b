/**
 * The PDF summary of one scenario, for investors' data rooms and for the
 * team: a cover, the key metrics (the one catalogue, formatted as the app
 * shows them), the assumptions in words, the annual cash-flow table, charts
 * drawn as vectors, a probabilistic run when one is given, and the method
 * notes; every page carries the cautions,
 * "page n of N" and, on an investor's copy, who it was prepared for.
 *
 * Pure but for the font files it reads once: everything it prints comes in
 * through ScenarioSummaryInput, so it runs as well on a compute-pool thread
 * as anywhere else.
 */
import PDFDocument from 'pdfkit';
import { METRIC_LIST, METRICS, metricUnit } from '../../metrics/catalogue';
import { coverShortfallsText } from '../../metrics/cover-shortfalls';
import { formatMetric } from '../../metrics/format';
import { technologyLabels, type Technology } from '../../technology';
import { targetDscrOf, type Scenario } from '../../schemas/scenario';
import type { EngineResult } from '../engine/evaluate';
import type { TornadoResult } from '../engine/sensitivity';
import { assumptionSections } from './assumptions';
import { cashFlowTableCells } from './cash-flow-table';
import { drawCashFlowChart, drawDscrChart, drawEnergyChart, drawRunHistogramChart, drawTornadoChart, type Rect } from './charts';
import { printable, registerFonts } from './fonts';
import { drawPageFrames, PageFlow, utcMinute, type PageFrame } from './layout';
import { noteBlocks, type TextRun } from './markdown';
import { colours, page, type } from './style';
import { drawTable, tableHeight } from './tables';
import type { SnapshotRun } from '../rooms/snapshot-format';
import { missingNotes, P90_CONVENTION, RUN_SECTION_TITLE, runBasisLine, runFacts, runHistogram, runProbabilities, runTableRows, samplingNote } from '../../probabilistic/run-report';

export interface ScenarioSummaryInput {
	project: { name: string; technology: Technology; siteName: string; siteDescription: string; currency: string };
	scenario: { name: string; revision: number; notes: string };
	/** The saved document the result was computed from. */
	document: Scenario;
	result: EngineResult;
	engineVersion: string;
	/** A tornado of one metric, drawn when given. */
	tornado?: TornadoResult | null;
	/** A finished probabilistic run of this revision, printed on pages of its own when given (pass the 'probabilistic-runs' note with it). */
	run?: SnapshotRun | null;
	/** Notes from docs/methods: the title, and the markdown with its sources. */
	methodNotes: { slug: string; title: string; markdown: string }[];
	/** The cautions every results surface carries (src/lib/cautions.ts). */
	cautions: readonly string[];
	/** Whose copy: "Data room Kestle Narrows, version 3" or "Team copy", and its date. */
	edition: { label: string; date: Date };
	/** An investor's copy: every footer reads "Prepared for <email> on <time> UTC". */
	stamp?: { email: string; at: Date };
}

const dayFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

/** The chapter titles, in the order the summary prints them. */
export const CHAPTERS = {
	metrics: 'Key metrics',
	assumptions: 'Assumptions',
	cashFlow: 'Annual cash flow',
	charts: 'Charts',
	run: RUN_SECTION_TITLE,
	notes: 'Method notes'
} as const;

export function renderScenarioSummaryPdf(input: ScenarioSummaryInput): Promise<Buffer> {
	const doc = new PDFDocument({
		size: page.size,
		margins: page.margin,
		bufferPages: true,
		autoFirstPage: false,
		info: {
			Title: `${input.project.name}: ${input.scenario.name} (revision ${input.scenario.revision})`,
			Author: 'Tidewright',
			Subject: `Scenario summary, ${input.edition.label}`,
			CreationDate: input.edition.date
		}
	});
	const chunks: Buffer[] = [];
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('data', (chunk: Buffer) => chunks.push(chunk));
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});
	registerFonts(doc);
	const frame: PageFrame = {
		editionLabel: input.edition.label,
		header: { project: input.project.name, scenario: `${input.scenario.name} (revision ${input.scenario.revision})` },
		cautions: input.cautions,
		stamp: input.stamp
	};
	const flow = new PageFlow(doc, frame);

	cover(flow, input);
	keyMetrics(flow, input);
	assumptions(flow, input);
	cashFlow(flow, input);
	charts(flow, input);
	probabilisticRun(flow, input);
	methodNotes(flow, input);

	drawPageFrames(doc, frame);
	doc.end();
	return done;
}

// ---------------------------------------------------------------- cover

function cover(flow: PageFlow, input: ScenarioSummaryInput): void {
	const { doc } = flow;
	flow.newPage('portrait');
	const bandHeight = 132;
	doc.rect(0, 0, doc.page.width, bandHeight).fill(colours.deep);
	doc.rect(0, bandHeight, doc.page.width, 4).fill(colours.accent);
	doc.font('display').fontSize(22).fillColor(colours.band).text('Tidewright', flow.left, 44, { width: flow.width });
	doc.font('sans').fontSize(type.subheading).fillColor(colours.faint).text('Scenario summary', flow.left, 76, { width: flow.width });

	flow.y = bandHeight + 56;
	doc.font('display').fontSize(type.title).fillColor(colours.ink).text(printable(input.project.name), flow.left, flow.y, { width: flow.width });
	flow.y += 6;
	doc.font('sans').fontSize(15).fillColor(colours.text);
	doc.text(printable(`${input.scenario.name}, revision ${input.scenario.revision}`), flow.left, flow.y, { width: flow.width });
	flow.y += 4;
	const site = input.project.siteName || input.document.site.name || '';
	doc.font('sans').fontSize(type.subheading).fillColor(colours.muted);
	doc.text(printable([technologyLabels[input.project.technology], site].filter(Boolean).join(' · ')), flow.left, flow.y, { width: flow.width });
	flow.y += 28;

	const facts: [string, string][] = [
		['Edition', input.edition.label],
		['Date', dayFormat.format(input.edition.date)],
		['Engine version', input.engineVersion],
		['Site', site || 'Not named'],
		['Currency', input.project.currency]
	];
	if (input.stamp) facts.push(['Prepared for', `${input.stamp.email}, ${utcMinute(input.stamp.at)}`]);
	drawTable(flow, { columns: [{ header: 'Item' }, { header: 'Value', wrap: true }], rows: facts, header: false, fontSize: type.body });

	if (input.project.siteDescription.trim() !== '') {
		flow.subheading('The site', 30);
		flow.paragraph(input.project.siteDescription);
	}
	const notes = [input.scenario.notes, input.document.description ?? ''].map((n) => n.trim()).filter((n, i, all) => n !== '' && all.indexOf(n) === i);
	if (notes.length > 0) {
		flow.subheading('About this scenario', 30);
		for (const note of notes) flow.paragraph(note);
	}

	// The cautions in full, boxed, near the foot of the cover.
	const text = printable(input.cautions.join(' '));
	doc.font('sans').fontSize(type.body);
	const height = doc.heightOfString(text, { width: flow.width - 24, lineGap: 2 }) + 34;
	const top = Math.max(flow.y + 12, flow.bottom - height - 10);
	if (top + height <= flow.bottom) {
		doc.roundedRect(flow.left, top, flow.width, height, 4).fillAndStroke(colours.band, colours.rule);
		doc.font('sansBold').fontSize(type.body).fillColor(colours.text).text('Read with care', flow.left + 12, top + 10, { width: flow.width - 24 });
		doc.font('sans').fontSize(type.body).fillColor(colours.text).text(text, flow.left + 12, doc.y + 2, { width: flow.width - 24, lineGap: 2 });
	}
}

// ---------------------------------------------------------------- metrics

function keyMetrics(flow: PageFlow, input: ScenarioSummaryInput): void {
	const { doc } = flow;
	const { result } = input;
	flow.newPage('portrait');
	flow.heading(CHAPTERS.metrics);
	flow.paragraph(`As the workbench shows them, from the engine's result for revision ${input.scenario.revision}. Money in ${result.currency}; a dash is a figure the engine could not compute (the warnings below say why).`, {
		size: type.small,
		colour: colours.muted,
		gap: 10
	});
	const columns = 2;
	const gap = 8;
	const cellWidth = (flow.width - gap * (columns - 1)) / columns;
	const cellHeight = 46;
	const top = flow.y;
	METRIC_LIST.forEach((metric, i) => {
		const x = flow.left + (i % columns) * (cellWidth + gap);
		const y = top + Math.floor(i / columns) * (cellHeight + gap);
		doc.rect(x, y, cellWidth, cellHeight).fillAndStroke('#ffffff', colours.rule);
		doc.rect(x, y, 3, cellHeight).fill(colours.positive);
		doc.font('sans').fontSize(type.small).fillColor(colours.muted).text(printable(metric.label), x + 10, y + 6, { width: cellWidth - 16, lineBreak: false });
		const value = formatMetric(metric.key, result.metrics[metric.key]);
		doc.font('sansBold').fontSize(15).fillColor(colours.ink).text(value, x + 10, y + 17, { width: cellWidth - 16, lineBreak: false });
		const valueWidth = doc.widthOfString(value);
		const unit = metricUnit(metric.key, result.currency);
		doc.font('sans').fontSize(type.small).fillColor(colours.text).text(printable(unit), x + 14 + valueWidth, y + 23, { width: cellWidth - valueWidth - 24, lineBreak: false });
		if (metric.basis) doc.font('sans').fontSize(type.tiny).fillColor(colours.muted).text(printable(metric.basis), x + 10, y + 35, { width: cellWidth - 16, lineBreak: false });
	});
	flow.y = top + Math.ceil(METRIC_LIST.length / columns) * (cellHeight + gap) + 8;
	// Beside the minimum DSCR: the loan years it leaves out or that fall short (none in a result stored before they were reported).
	const shortfalls = coverShortfallsText(result.coverShortfalls);
	if (shortfalls) flow.paragraph(`${METRICS.minDscr.label}: ${shortfalls}.`, { colour: colours.target, gap: 6 });

	flow.subheading('Warnings from the engine', 30);
	if (result.warnings.length === 0) flow.paragraph('None: every figure was computed.', { colour: colours.muted });
	for (const warning of result.warnings) flow.paragraph(`• ${warning}`, { indent: 4, gap: 3 });
}

// ---------------------------------------------------------------- assumptions

function assumptions(flow: PageFlow, input: ScenarioSummaryInput): void {
	flow.newPage('portrait');
	flow.heading(CHAPTERS.assumptions);
	flow.paragraph(
		`Money inputs are real, in prices of the commercial operation year, in ${input.document.currency}. Shares are shown as per cent. Figures marked as used or paid are the engine's, from this revision's result.`,
		{ size: type.small, colour: colours.muted, gap: 8 }
	);
	for (const section of assumptionSections(input.document, input.result)) {
		flow.subheading(section.title, 60);
		if (section.facts.length > 0) {
			drawTable(flow, {
				columns: [{ header: 'Item', wrap: true }, { header: 'Value', wrap: true }],
				rows: section.facts.map((f) => [f.label, f.value]),
				header: false,
				fontSize: type.small
			});
		}
		for (const table of section.tables) {
			const spec = { ...table, fontSize: type.small, continuedTitle: `${table.title} (continued)` };
			// A table that fits in half a page is kept whole, with its title.
			const height = tableHeight(flow, spec);
			flow.ensure(height <= (flow.bottom - flow.top) / 2 ? height + 20 : 60);
			flow.paragraph(table.title, { size: type.small, colour: colours.muted, font: 'sansBold', gap: 3 });
			drawTable(flow, spec);
		}
	}
}

// ---------------------------------------------------------------- cash flow

function cashFlow(flow: PageFlow, input: ScenarioSummaryInput): void {
	const { result } = input;
	flow.newPage('landscape');
	flow.heading(CHAPTERS.cashFlow, 60);
	flow.paragraph(
		`Money in thousands of ${result.currency} (${result.currency} k), energy in MWh, prices in ${result.currency}/MWh; construction years are marked "build"; DSCR is CFADS over debt service; negative figures in red. Time convention: ${result.timeConvention}`,
		{ size: type.small, colour: colours.muted, gap: 6 }
	);
	const { columns, rows } = cashFlowTableCells(result);
	drawTable(flow, {
		columns,
		rows,
		fontSize: type.table,
		minFontSize: 6,
		orientation: 'landscape',
		continuedTitle: `${CHAPTERS.cashFlow} (continued)`,
		rowShade: (i) => (result.cashFlow[i].phase === 'construction' ? colours.band : i % 2 === 1 ? colours.stripe : undefined),
		negative: (text) => text.startsWith('−')
	});
}

// ---------------------------------------------------------------- charts

function charts(flow: PageFlow, input: ScenarioSummaryInput): void {
	const { doc } = flow;
	const { result, document } = input;
	flow.newPage('portrait');
	flow.heading(CHAPTERS.charts, 300);
	// Drawing moves pdfkit's cursor, so each chart's place is kept here and the cursor set below it afterwards.
	const place = (height: number, draw: (box: Rect) => void) => {
		flow.ensure(height);
		const box = { x: flow.left, y: flow.y, width: flow.width, height };
		draw(box);
		flow.y = box.y + height + 28;
	};
	place(310, (box) => drawEnergyChart(doc, box, result.energy));
	place(300, (box) => drawCashFlowChart(doc, box, result.cashFlow, result.currency));
	const anyCover = result.cashFlow.some((row) => row.phase === 'operation' && row.dscr !== null);
	// Without debt service the DSCR chart is a sentence, not an empty frame.
	// Downside sizing cases (results stored before them have none): each drawn under its own energy.
	const downside = (result.financing?.sizingCases ?? []).filter((c) => c.label !== 'P50').map((c) => ({ label: c.label, targetDscr: c.targetDscr, dscr: c.dscr }));
	place(anyCover ? 260 : 44, (box) => drawDscrChart(doc, box, result.cashFlow, targetDscrOf(document.finance.debt), downside));
	const tornado = input.tornado;
	if (tornado) place(Math.min(flow.bottom - flow.top - 40, 100 + tornado.rows.length * 22), (box) => drawTornadoChart(doc, box, tornado, result.currency));
	doc.x = flow.left;
}

// ---------------------------------------------------------------- probabilistic run

function probabilisticRun(flow: PageFlow, input: ScenarioSummaryInput): void {
	const run = input.run;
	if (!run) return;
	const { doc } = flow;
	const currency = input.result.currency;
	flow.newPage('portrait');
	flow.heading(CHAPTERS.run);
	flow.paragraph(
		`Revision ${input.scenario.revision}'s drivers drawn together: ${runBasisLine(run)}. Each draw takes every driver from its distribution${run.energyUncertainty ? ' and the energy from its uncertainty' : ''} and evaluates the scenario; the figures below summarise the draws.`,
		{ size: type.small, colour: colours.muted, gap: 8 }
	);
	drawTable(flow, {
		columns: [
			{ header: 'Output' },
			{ header: 'Unit' },
			{ header: 'Mean', align: 'right' },
			{ header: 'P90', align: 'right' },
			{ header: 'P50', align: 'right' },
			{ header: 'P10', align: 'right' }
		],
		rows: runTableRows(run.summary, currency).map((r) => [r.label, r.unit, r.mean, r.p90, r.p50, r.p10]),
		fontSize: type.body,
		stretch: true,
		negative: (text) => text.startsWith('−')
	});
	flow.y += 4;
	flow.paragraph(P90_CONVENTION, { size: type.small, colour: colours.text, gap: 3 });
	for (const note of missingNotes(run.summary)) flow.paragraph(note, { size: type.small, colour: colours.muted, gap: 3 });
	flow.paragraph(samplingNote(run.draws), { size: type.small, colour: colours.muted, gap: 6 });

	flow.subheading('Probabilities', 60);
	drawTable(flow, { columns: [{ header: 'Event', wrap: true }, { header: 'Share of the draws', align: 'right' }], rows: runProbabilities(run.summary).map((p) => [p.label, p.value]), header: false, fontSize: type.body });

	const histogram = runHistogram(run.summary, currency);
	if (histogram) {
		const height = 250;
		flow.ensure(height + 20);
		flow.y += 12;
		const box = { x: flow.left, y: flow.y, width: flow.width, height };
		drawRunHistogramChart(doc, box, histogram);
		flow.y = box.y + height + 16;
	}

	flow.subheading('What was drawn', 60);
	drawTable(flow, { columns: [{ header: 'Item', wrap: true }, { header: 'Value', wrap: true }], rows: runFacts(run).map((f) => [f.label, f.value]), header: false, fontSize: type.small });
	doc.x = flow.left;
}

// ---------------------------------------------------------------- method notes

function runs(flow: PageFlow, list: readonly TextRun[], x: number, width: number, size: number): void {
	const { doc } = flow;
	doc.fillColor(colours.text);
	list.forEach((run, i) => {
		doc.font(run.bold ? 'sansBold' : 'sans').fontSize(size);
		const text = printable(run.text);
		if (i === 0) doc.text(text, x, flow.y, { width, lineGap: 2, continued: i < list.length - 1 });
		else doc.text(text, { continued: i < list.length - 1 });
	});
}

/** The size at which the longest formula line fits the width (monospace: every character has the same advance). */
function formulaSize(doc: PDFKit.PDFDocument, lines: readonly string[], width: number): { size: number; lineHeight: number } {
	doc.font('mono').fontSize(type.small);
	const advance = doc.widthOfString('0');
	const longest = Math.max(1, ...lines.map((line) => [...line].length));
	const size = Math.max(5, Math.min(type.small, (type.small * width) / (advance * longest)));
	return { size, lineHeight: size * 1.45 };
}

function methodNotes(flow: PageFlow, input: ScenarioSummaryInput): void {
	if (input.methodNotes.length === 0) return;
	const { doc } = flow;
	flow.newPage('portrait');
	flow.heading(CHAPTERS.notes);
	flow.paragraph('How the figures in this summary are computed, with the sources each method follows. The same notes are in the workbench under Methods.', {
		size: type.small,
		colour: colours.muted,
		gap: 8
	});
	for (const note of input.methodNotes) {
		flow.ensure(90);
		flow.y += 6;
		doc.font('display').fontSize(13).fillColor(colours.ink).text(printable(note.title), flow.left, flow.y, { width: flow.width });
		flow.y += 4;
		for (const block of noteBlocks(note.markdown)) {
			switch (block.kind) {
				case 'heading':
					flow.ensure(40);
					flow.y += 3;
					doc.font('sansBold').fontSize(type.body).fillColor(colours.text).text(printable(block.text), flow.left, flow.y, { width: flow.width });
					flow.y += 2;
					break;
				case 'paragraph':
					flow.ensure(26);
					runs(flow, block.runs, flow.left, flow.width, type.body);
					flow.y += 5;
					break;
				case 'item': {
					flow.ensure(24);
					const indent = 14 + block.depth * 14;
					const top = flow.y;
					doc.font('sans').fontSize(type.body).fillColor(colours.text).text(block.marker, flow.left + indent - 12, top, { lineBreak: false });
					flow.y = top;
					runs(flow, block.runs, flow.left + indent, flow.width - indent, type.body);
					flow.y += 3;
					break;
				}
				case 'formula': {
					const lines = block.lines.map((line) => printable(line));
					const { size, lineHeight } = formulaSize(doc, lines, flow.width - 16);
					const height = lines.length * lineHeight + 10;
					flow.ensure(height + 6);
					const top = flow.y;
					doc.rect(flow.left, top, flow.width, height).fill(colours.paper);
					doc.rect(flow.left, top, 2, height).fill(colours.faint);
					doc.font('mono').fontSize(size).fillColor(colours.ink);
					lines.forEach((line, i) => doc.text(line, flow.left + 8, top + 5 + i * lineHeight, { lineBreak: false }));
					flow.y = top + height + 6;
					break;
				}
			}
		}
		flow.y += 6;
	}
	doc.x = flow.left;
}
