/**
 * The summary's charts, drawn as pdfkit vector paths (no pictures, no
 * browser): energy by flow-speed bin or by sea state, annual cash flows with
 * their running total, DSCR against its target, the tornado, and the
 * histogram of a probabilistic run. Each has a
 * title, axis titles, ticks and a legend, in the app's palette and the same
 * series the app's charts show. Numbers here are floats: charts only.
 */
import { METRICS, metricUnit } from '../../metrics/catalogue';
import { chartValue, formatMetric } from '../../metrics/format';
import type { EngineResult } from '../engine/evaluate';
import type { TornadoResult, TornadoRow } from '../engine/sensitivity';
import type { RunHistogramView } from '../../probabilistic/run-report';
import { withUnit } from './assumptions';
import { labelEvery, linearScale, niceTicks, tickLabel, type Ticks } from './chart-scale';
import { printable } from './fonts';
import { colours, type } from './style';

export interface Rect {
	x: number;
	y: number;
	width: number;
	height: number;
}

type Doc = PDFKit.PDFDocument;

interface LegendItem {
	label: string;
	colour: string;
	kind: 'bar' | 'line' | 'dashed' | 'marker-line';
}

const TITLE_HEIGHT = 20;
const LEGEND_HEIGHT = 18;
const X_TICKS_HEIGHT = 12;
const X_TITLE_HEIGHT = 12;
const Y_TITLE_WIDTH = 14;
const TICK = 3;

function write(doc: Doc, text: string, x: number, y: number, options: { width?: number; align?: 'left' | 'right' | 'center'; size?: number; colour?: string; bold?: boolean } = {}) {
	doc.font(options.bold ? 'sansBold' : 'sans').fontSize(options.size ?? type.tiny + 0.5).fillColor(options.colour ?? colours.muted);
	const width = options.width ?? doc.widthOfString(printable(text)) + 1;
	doc.text(printable(text), x, y, { width, align: options.align ?? 'left', lineBreak: false });
}

function drawTitle(doc: Doc, box: Rect, title: string): void {
	write(doc, title, box.x, box.y, { size: type.subheading, colour: colours.text, bold: true, width: box.width });
}

/** The plot area inside a chart box: room for the title, the y ticks and titles on each side in use, x ticks, x title and legend. */
function plotArea(doc: Doc, box: Rect, left: Ticks | null, right: Ticks | null, extraLeft = 0): Rect {
	doc.font('sans').fontSize(type.tiny + 0.5);
	const widest = (t: Ticks | null) => (t ? Math.max(...t.values.map((v) => doc.widthOfString(tickLabel(v, t.step)))) : 0);
	const leftRoom = extraLeft + (left ? widest(left) + TICK + 4 + Y_TITLE_WIDTH : 6);
	const rightRoom = right ? widest(right) + TICK + 4 + Y_TITLE_WIDTH : 10;
	const top = box.y + TITLE_HEIGHT + 6;
	const bottom = box.y + box.height - LEGEND_HEIGHT - X_TITLE_HEIGHT - X_TICKS_HEIGHT - 4;
	return { x: box.x + leftRoom, y: top, width: box.width - leftRoom - rightRoom, height: bottom - top };
}

function drawYAxis(doc: Doc, plot: Rect, ticks: Ticks, scale: (v: number) => number, side: 'left' | 'right', title: string, box: Rect, grid: boolean): void {
	const axisX = side === 'left' ? plot.x : plot.x + plot.width;
	for (const value of ticks.values) {
		const y = scale(value);
		if (grid) doc.moveTo(plot.x, y).lineTo(plot.x + plot.width, y).lineWidth(0.4).strokeColor(colours.rule).stroke();
		const outward = side === 'left' ? -TICK : TICK;
		doc.moveTo(axisX, y).lineTo(axisX + outward, y).lineWidth(0.5).strokeColor(colours.faint).stroke();
		const label = tickLabel(value, ticks.step);
		if (side === 'left') write(doc, label, box.x, y - 3.5, { width: axisX - TICK - 3 - box.x, align: 'right' });
		else write(doc, label, axisX + TICK + 3, y - 3.5);
	}
	doc.moveTo(axisX, plot.y).lineTo(axisX, plot.y + plot.height).lineWidth(0.5).strokeColor(colours.faint).stroke();
	// The axis title reads upwards beside the tick labels.
	const titleX = side === 'left' ? box.x : box.x + box.width - 9;
	const bottom = plot.y + plot.height;
	doc.save();
	doc.rotate(-90, { origin: [titleX, bottom] });
	write(doc, title, titleX, bottom, { width: plot.height, align: 'center', colour: colours.text });
	doc.restore();
}

function drawXTitle(doc: Doc, plot: Rect, title: string): void {
	write(doc, title, plot.x, plot.y + plot.height + X_TICKS_HEIGHT + 2, { width: plot.width, align: 'center', colour: colours.text });
}

/** Category labels under a band axis, thinned so they never overlap. */
function drawBandLabels(doc: Doc, plot: Rect, labels: readonly string[]): void {
	const band = plot.width / Math.max(1, labels.length);
	doc.font('sans').fontSize(type.tiny + 0.5);
	const widest = Math.max(0, ...labels.map((l) => doc.widthOfString(l)));
	const every = labelEvery(band, widest);
	const y = plot.y + plot.height;
	doc.moveTo(plot.x, y).lineTo(plot.x + plot.width, y).lineWidth(0.5).strokeColor(colours.faint).stroke();
	labels.forEach((label, i) => {
		if (i % every !== 0) return;
		const centre = plot.x + band * (i + 0.5);
		doc.moveTo(centre, y).lineTo(centre, y + TICK).lineWidth(0.5).strokeColor(colours.faint).stroke();
		write(doc, label, centre - 30, y + TICK + 1, { width: 60, align: 'center' });
	});
}

function drawLegend(doc: Doc, box: Rect, items: readonly LegendItem[]): void {
	doc.font('sans').fontSize(type.tiny + 1);
	const swatch = 14;
	const widths = items.map((item) => swatch + 4 + doc.widthOfString(printable(item.label)) + 14);
	let x = box.x + (box.width - widths.reduce((a, b) => a + b, 0)) / 2;
	const y = box.y + box.height - LEGEND_HEIGHT + 6;
	items.forEach((item, i) => {
		const mid = y + 3.5;
		if (item.kind === 'bar') doc.rect(x, mid - 4, swatch, 8).fill(item.colour);
		else {
			doc.moveTo(x, mid).lineTo(x + swatch, mid).lineWidth(item.kind === 'dashed' ? 1.2 : 1.8).strokeColor(item.colour);
			if (item.kind === 'dashed') doc.dash(3, { space: 2 });
			doc.stroke();
			doc.undash();
			if (item.kind === 'marker-line') doc.circle(x + swatch / 2, mid, 2).fill(item.colour);
		}
		write(doc, item.label, x + swatch + 4, y, { size: type.tiny + 1, colour: colours.text });
		x += widths[i];
	});
}

function framePlot(doc: Doc, plot: Rect): void {
	doc.rect(plot.x, plot.y, plot.width, plot.height).lineWidth(0.4).strokeColor(colours.rule).stroke();
}

function emptyNote(doc: Doc, box: Rect, title: string, words: string): void {
	drawTitle(doc, box, title);
	write(doc, words, box.x, box.y + TITLE_HEIGHT + 4, { size: type.body, colour: colours.muted, width: box.width });
}

// ---------------------------------------------------------------- energy

/** Bin values as the document gives them (0.125, not 0.13), to three decimals at most. */
const plain = (value: string | undefined) => String(Number(Number(value ?? 0).toFixed(3)));

export function drawEnergyChart(doc: Doc, box: Rect, energy: EngineResult['energy']): void {
	const bins = energy.bins;
	if (bins.length === 0) return emptyNote(doc, box, 'Energy by resource bin', 'The resource has no bins with any occurrence, so there is no energy to chart.');
	if (bins.some((b) => b.hsM !== undefined && b.teS !== undefined)) drawSeaStateChart(doc, box, bins);
	else drawSpeedBinChart(doc, box, bins);
}

function drawSpeedBinChart(doc: Doc, box: Rect, bins: EngineResult['energy']['bins']): void {
	drawTitle(doc, box, 'Gross array energy by flow-speed bin, with the hours each bin occurs');
	const energy = bins.map((b) => Number(b.arrayGrossEnergyMWh));
	const hours = bins.map((b) => Number(b.hours));
	const left = niceTicks(0, Math.max(...energy), 5);
	const right = niceTicks(0, Math.max(...hours), 5);
	const plot = plotArea(doc, box, left, right);
	const y = linearScale([left.min, left.max], [plot.y + plot.height, plot.y]);
	const yHours = linearScale([right.min, right.max], [plot.y + plot.height, plot.y]);
	drawYAxis(doc, plot, left, y, 'left', 'Gross array energy (MWh/yr)', box, true);
	drawYAxis(doc, plot, right, yHours, 'right', 'Occurrence (h/yr)', box, false);
	const band = plot.width / bins.length;
	energy.forEach((value, i) => {
		const top = y(value);
		if (value > 0) doc.rect(plot.x + band * i + band * 0.12, top, band * 0.76, y(0) - top).fill(colours.positive);
	});
	hours.forEach((value, i) => {
		const px = plot.x + band * (i + 0.5);
		if (i === 0) doc.moveTo(px, yHours(value));
		else doc.lineTo(px, yHours(value));
	});
	doc.lineWidth(1.6).strokeColor(colours.high).stroke();
	drawBandLabels(doc, plot, bins.map((b) => plain(b.speedMPerS)));
	drawXTitle(doc, plot, 'Flow speed bin centre (m/s)');
	drawLegend(doc, box, [
		{ label: 'Gross array energy (MWh/yr)', colour: colours.positive, kind: 'bar' },
		{ label: 'Occurrence (h/yr)', colour: colours.high, kind: 'line' }
	]);
}

/** Mixes two #rrggbb colours: share 0 gives `from`, 1 gives `to`. */
export function mix(from: string, to: string, share: number): string {
	const parse = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
	const a = parse(from);
	const b = parse(to);
	const s = Math.min(1, Math.max(0, share));
	return `#${a.map((v, i) => Math.round(v + (b[i] - v) * s).toString(16).padStart(2, '0')).join('')}`;
}

/** Wave: the scatter diagram as a grid of Hs by Te, each sea state shaded by the energy it brings. */
function drawSeaStateChart(doc: Doc, box: Rect, bins: EngineResult['energy']['bins']): void {
	drawTitle(doc, box, 'Gross array energy by sea state (scatter diagram of Hs and Te)');
	const hsValues = [...new Set(bins.map((b) => plain(b.hsM)))].sort((a, b) => Number(a) - Number(b));
	const teValues = [...new Set(bins.map((b) => plain(b.teS)))].sort((a, b) => Number(a) - Number(b));
	const energyAt = new Map<string, number>();
	for (const b of bins) {
		const key = `${plain(b.hsM)}|${plain(b.teS)}`;
		energyAt.set(key, (energyAt.get(key) ?? 0) + Number(b.arrayGrossEnergyMWh));
	}
	const largest = Math.max(0, ...energyAt.values());
	// Room on the left for the Hs labels: a band axis drawn by hand, not a tick axis.
	doc.font('sans').fontSize(type.tiny + 0.5);
	const hsLabelWidth = Math.max(...hsValues.map((v) => doc.widthOfString(v)));
	const plot = plotArea(doc, box, null, null, hsLabelWidth + TICK + 4 + Y_TITLE_WIDTH);
	const cellWidth = plot.width / teValues.length;
	const cellHeight = plot.height / hsValues.length;
	doc.font('sans').fontSize(type.tiny);
	const widestValue = doc.widthOfString(Math.round(largest).toLocaleString('en-GB'));
	const showValues = cellWidth >= widestValue + 4 && cellHeight >= 8;
	hsValues.forEach((hs, row) => {
		const cy = plot.y + plot.height - (row + 1) * cellHeight;
		teValues.forEach((te, column) => {
			const value = energyAt.get(`${hs}|${te}`);
			if (value === undefined) return;
			const cx = plot.x + column * cellWidth;
			const share = largest > 0 ? value / largest : 0;
			doc.rect(cx + 0.5, cy + 0.5, cellWidth - 1, cellHeight - 1).fill(value > 0 ? mix(colours.heatLow, colours.heatHigh, 0.08 + 0.92 * share) : colours.paper);
			if (showValues && value > 0) {
				write(doc, Math.round(value).toLocaleString('en-GB'), cx, cy + cellHeight / 2 - 3, {
					width: cellWidth,
					align: 'center',
					size: type.tiny,
					colour: share > 0.55 ? '#ffffff' : colours.text
				});
			}
		});
	});
	framePlot(doc, plot);
	// Hs labels on the left, one per row (thinned when rows are tight).
	const everyRow = labelEvery(cellHeight, 7, 1);
	hsValues.forEach((hs, row) => {
		if (row % everyRow !== 0) return;
		const cy = plot.y + plot.height - (row + 0.5) * cellHeight;
		write(doc, hs, plot.x - TICK - 3 - hsLabelWidth, cy - 3.5, { width: hsLabelWidth, align: 'right' });
	});
	const bottom = plot.y + plot.height;
	doc.save();
	doc.rotate(-90, { origin: [box.x, bottom] });
	write(doc, 'Significant wave height Hs (m)', box.x, bottom, { width: plot.height, align: 'center', colour: colours.text });
	doc.restore();
	drawBandLabels(doc, plot, teValues);
	drawXTitle(doc, plot, 'Energy period Te (s)');
	drawShadeLegend(doc, box, largest);
}

function drawShadeLegend(doc: Doc, box: Rect, largest: number): void {
	const label = 'Gross array energy per sea state (MWh/yr)';
	doc.font('sans').fontSize(type.tiny + 1);
	const barWidth = 120;
	const zero = '0';
	const top = Math.round(largest).toLocaleString('en-GB');
	const total = doc.widthOfString(label) + 10 + doc.widthOfString(zero) + 4 + barWidth + 4 + doc.widthOfString(top);
	let x = box.x + (box.width - total) / 2;
	const y = box.y + box.height - LEGEND_HEIGHT + 6;
	write(doc, label, x, y, { size: type.tiny + 1, colour: colours.text });
	x += doc.widthOfString(label) + 10;
	write(doc, zero, x, y, { size: type.tiny + 1 });
	x += doc.widthOfString(zero) + 4;
	const gradient = doc.linearGradient(x, 0, x + barWidth, 0);
	gradient.stop(0, mix(colours.heatLow, colours.heatHigh, 0.08)).stop(1, colours.heatHigh);
	doc.rect(x, y - 0.5, barWidth, 8).fill(gradient);
	x += barWidth + 4;
	write(doc, top, x, y, { size: type.tiny + 1 });
}

// ---------------------------------------------------------------- cash flows

export function drawCashFlowChart(doc: Doc, box: Rect, rows: EngineResult['cashFlow'], currency: string): void {
	drawTitle(doc, box, 'Annual post-tax project cash flows and their cumulative total');
	const millions = (value: string) => Number(value) / 1e6;
	const flows = rows.map((r) => millions(r.projectCashFlowPostTax));
	const cumulative = rows.map((r) => millions(r.cumulativeProjectCashFlow));
	const ticks = niceTicks(Math.min(0, ...flows, ...cumulative), Math.max(0, ...flows, ...cumulative), 6);
	const plot = plotArea(doc, box, ticks, null);
	const y = linearScale([ticks.min, ticks.max], [plot.y + plot.height, plot.y]);
	drawYAxis(doc, plot, ticks, y, 'left', `${currency} M, nominal`, box, true);
	const band = plot.width / Math.max(1, rows.length);
	flows.forEach((value, i) => {
		const top = Math.min(y(value), y(0));
		const height = Math.abs(y(value) - y(0));
		if (height > 0) doc.rect(plot.x + band * i + band * 0.14, top, band * 0.72, height).fill(value >= 0 ? colours.positive : colours.negative);
	});
	doc.moveTo(plot.x, y(0)).lineTo(plot.x + plot.width, y(0)).lineWidth(0.7).strokeColor(colours.faint).stroke();
	cumulative.forEach((value, i) => {
		const px = plot.x + band * (i + 0.5);
		if (i === 0) doc.moveTo(px, y(value));
		else doc.lineTo(px, y(value));
	});
	doc.lineWidth(1.6).strokeColor(colours.line).stroke();
	drawBandLabels(doc, plot, rows.map((r) => (r.t < 0 ? `−${-r.t}` : String(r.t))));
	drawXTitle(doc, plot, 'Year (t = 0 at COD)');
	drawLegend(doc, box, [
		{ label: `Money in, post-tax (${currency} M)`, colour: colours.positive, kind: 'bar' },
		{ label: `Money out (${currency} M)`, colour: colours.negative, kind: 'bar' },
		{ label: `Cumulative (${currency} M)`, colour: colours.line, kind: 'line' }
	]);
}

// ---------------------------------------------------------------- DSCR

/** Where the DSCR axis stops: a year whose debt service is tiny can have a cover of 50×, which would flatten every other year. */
function dscrAxisTop(values: readonly number[], reference: number): number {
	const sorted = [...values].sort((a, b) => a - b);
	const upperQuartile = sorted[Math.floor((sorted.length - 1) * 0.75)];
	return Math.max(reference * 1.25, Math.min(sorted[sorted.length - 1], upperQuartile * 1.6));
}

/** A downside sizing case's DSCR each operating year (index k = year k + 1) and its own target. */
export type DscrCaseLine = { label: string; targetDscr: number; dscr: readonly (string | null)[] };

const CASE_COLOURS = [colours.accent, colours.line, colours.negative, colours.deep];

export function drawDscrChart(doc: Doc, box: Rect, rows: EngineResult['cashFlow'], targetDscr: number | null, cases: readonly DscrCaseLine[] = []): void {
	const title = 'Debt service cover ratio (DSCR) by operating year';
	const serviced = rows.filter((r) => r.phase === 'operation' && r.dscr !== null);
	if (serviced.length === 0) return emptyNote(doc, box, title, 'No debt service in this scenario, so there is no DSCR to chart.');
	drawTitle(doc, box, title);
	const values = serviced.map((r) => Number(r.dscr));
	const caseValues = cases.map((c) => serviced.map((r) => (c.dscr[r.t - 1] === null || c.dscr[r.t - 1] === undefined ? null : Number(c.dscr[r.t - 1]))));
	const everyValue = [...values, ...caseValues.flat().filter((v): v is number => v !== null)];
	const reference = targetDscr ?? 1;
	const top = dscrAxisTop(everyValue, reference);
	const ticks = niceTicks(Math.min(0, ...everyValue), top, 5);
	const plot = plotArea(doc, box, ticks, null);
	const y = linearScale([ticks.min, ticks.max], [plot.y + plot.height, plot.y]);
	drawYAxis(doc, plot, ticks, y, 'left', 'DSCR (×)', box, true);
	const band = plot.width / serviced.length;
	const clipped = (v: number) => Math.min(v, ticks.max);
	doc.moveTo(plot.x, y(reference)).lineTo(plot.x + plot.width, y(reference)).lineWidth(1.2).strokeColor(targetDscr === null ? colours.muted : colours.target).dash(5, { space: 3 }).stroke();
	doc.undash();
	values.forEach((value, i) => {
		const px = plot.x + band * (i + 0.5);
		if (i === 0) doc.moveTo(px, y(clipped(value)));
		else doc.lineTo(px, y(clipped(value)));
	});
	doc.lineWidth(1.6).strokeColor(colours.positive).stroke();
	// Downside cases: their DSCR under their own energy, and their own target, each in its colour.
	cases.forEach((c, n) => {
		const colour = CASE_COLOURS[n % CASE_COLOURS.length];
		doc.moveTo(plot.x, y(Math.min(c.targetDscr, ticks.max))).lineTo(plot.x + plot.width, y(Math.min(c.targetDscr, ticks.max))).lineWidth(0.8).strokeColor(colour).dash(2, { space: 2 }).stroke();
		doc.undash();
		let started = false;
		caseValues[n].forEach((value, i) => {
			if (value === null) return;
			const px = plot.x + band * (i + 0.5);
			if (!started) doc.moveTo(px, y(clipped(value)));
			else doc.lineTo(px, y(clipped(value)));
			started = true;
		});
		if (started) doc.lineWidth(1.2).strokeColor(colour).stroke();
	});
	values.forEach((value, i) => {
		const px = plot.x + band * (i + 0.5);
		if (value > ticks.max) {
			// Above the axis: an arrow at the top and the value beside it.
			const py = plot.y;
			doc.polygon([px - 3, py + 6], [px + 3, py + 6], [px, py]).fill(colours.positive);
			write(doc, `${value.toFixed(1)}×`, px + 4, py + 1, { size: type.tiny, colour: colours.positive });
		} else doc.circle(px, y(value), 2).fill(value < reference ? colours.target : colours.positive);
	});
	drawBandLabels(doc, plot, serviced.map((r) => String(r.t)));
	drawXTitle(doc, plot, 'Operating year');
	drawLegend(doc, box, [
		{ label: cases.length > 0 ? 'P50 DSCR' : 'DSCR (CFADS ÷ debt service)', colour: colours.positive, kind: 'marker-line' },
		targetDscr === null
			? { label: 'Cover of 1.00× (debt service just met; no target DSCR set)', colour: colours.muted, kind: 'dashed' }
			: { label: `Target ${targetDscr.toFixed(2)}×`, colour: colours.target, kind: 'dashed' },
		...cases.flatMap((c, n) => [
			{ label: `${c.label} DSCR (target ${c.targetDscr.toFixed(2)}×)`, colour: CASE_COLOURS[n % CASE_COLOURS.length], kind: 'line' as const }
		])
	]);
}

// ---------------------------------------------------------------- tornado

/** A driver's low and high inputs in words: "0.8× to 1.2× base", "4 to 8 %/yr", "20 to 30 years". */
export function driverRangeText(row: Pick<TornadoRow, 'unit' | 'lowInput' | 'highInput'>): string {
	if (row.unit === 'x base') return `${withUnit(row.lowInput, '×')} to ${withUnit(row.highInput, '×')} base`;
	const low = withUnit(row.lowInput, row.unit);
	const high = withUnit(row.highInput, row.unit);
	// The unit once, after the high value: "4 to 8 %/yr".
	const space = high.indexOf(' ');
	const suffix = space === -1 ? '' : high.slice(space);
	return `${suffix !== '' && low.endsWith(suffix) ? low.slice(0, -suffix.length) : low} to ${high}`;
}

export function drawTornadoChart(doc: Doc, box: Rect, tornado: TornadoResult, currency: string): void {
	const metric = METRICS[tornado.metric];
	const unit = metricUnit(tornado.metric, currency);
	const title = `Tornado: ${metric.label}, one driver at a time at its low and high value`;
	const base = chartValue(tornado.metric, tornado.baseOutput);
	const rows = tornado.rows;
	if (base === null || rows.length === 0) return emptyNote(doc, box, title, `${metric.label} has no base value in this scenario, so there is no tornado to draw.`);
	drawTitle(doc, box, title);
	const outputs = rows.flatMap((r) => [chartValue(tornado.metric, r.lowOutput), chartValue(tornado.metric, r.highOutput)]).filter((v): v is number => v !== null);
	const ticks = niceTicks(Math.min(base, ...outputs), Math.max(base, ...outputs), 6);

	// Driver names and their ranges take the left side.
	doc.font('sans').fontSize(type.tiny + 1);
	const labels = rows.map((r) => ({ name: printable(r.label), range: printable(driverRangeText(r)) }));
	const labelWidth = Math.min(box.width * 0.36, Math.max(...labels.map((l) => Math.max(doc.widthOfString(l.name), doc.widthOfString(l.range)))) + 8);
	const plot: Rect = {
		x: box.x + labelWidth,
		y: box.y + TITLE_HEIGHT + 6,
		width: box.width - labelWidth - 12,
		height: box.height - TITLE_HEIGHT - 6 - LEGEND_HEIGHT - X_TITLE_HEIGHT - X_TICKS_HEIGHT - 4
	};
	const x = linearScale([ticks.min, ticks.max], [plot.x, plot.x + plot.width]);
	for (const value of ticks.values) {
		const px = x(value);
		doc.moveTo(px, plot.y).lineTo(px, plot.y + plot.height).lineWidth(0.4).strokeColor(colours.rule).stroke();
		doc.moveTo(px, plot.y + plot.height).lineTo(px, plot.y + plot.height + TICK).lineWidth(0.5).strokeColor(colours.faint).stroke();
		write(doc, tickLabel(value, ticks.step), px - 30, plot.y + plot.height + TICK + 1, { width: 60, align: 'center' });
	}
	const band = plot.height / rows.length;
	const barHeight = Math.min(14, band * 0.62);
	rows.forEach((row, i) => {
		const cy = plot.y + band * (i + 0.5);
		write(doc, labels[i].name, box.x, cy - 7.5, { width: labelWidth - 8, size: type.tiny + 1, colour: colours.text });
		write(doc, labels[i].range, box.x, cy + 0.5, { width: labelWidth - 8, size: type.tiny, colour: colours.muted });
		const low = chartValue(tornado.metric, row.lowOutput);
		const high = chartValue(tornado.metric, row.highOutput);
		if (low === null || high === null) {
			write(doc, 'not defined at one end of the range', x(base) + 4, cy - 3.5, { size: type.tiny });
			return;
		}
		for (const [value, colour] of [
			[low, colours.positive],
			[high, colours.high]
		] as const) {
			const from = Math.min(x(base), x(value));
			const width = Math.abs(x(value) - x(base));
			if (width > 0.2) doc.rect(from, cy - barHeight / 2, width, barHeight).fill(colour);
		}
	});
	doc.moveTo(x(base), plot.y - 2).lineTo(x(base), plot.y + plot.height).lineWidth(1).strokeColor(colours.line).stroke();
	doc.moveTo(plot.x, plot.y + plot.height).lineTo(plot.x + plot.width, plot.y + plot.height).lineWidth(0.5).strokeColor(colours.faint).stroke();
	drawXTitle(doc, plot, `${metric.label} (${unit}); base ${formatMetric(tornado.metric, tornado.baseOutput)} ${unit}`);
	drawLegend(doc, box, [
		{ label: 'Driver at its low value', colour: colours.positive, kind: 'bar' },
		{ label: 'Driver at its high value', colour: colours.high, kind: 'bar' },
		{ label: 'Base case', colour: colours.line, kind: 'line' }
	]);
}

// ---------------------------------------------------------------- probabilistic run

/** P90 in the signal colour (the lenders' case), P50 in ink, P10 in copper, as the room page draws them. */
const PERCENTILE_COLOURS = { P90: colours.target, P50: colours.line, P10: colours.high } as const;

/** A run's histogram: touching bars on a linear axis of the output, P90, P50 and P10 as dashed lines labelled above the plot. */
export function drawRunHistogramChart(doc: Doc, box: Rect, view: RunHistogramView): void {
	const title = `${view.label}: how ${view.count.toLocaleString('en-GB')} draws spread`;
	if (view.bins.length === 0) return emptyNote(doc, box, title, 'No draw has a value, so there is nothing to chart.');
	drawTitle(doc, box, title);
	const counts = view.bins.map((b) => b.count);
	const tallest = Math.max(1, ...counts);
	// No more steps than draws in the tallest bar, so no tick is a fraction of a draw.
	const yTicks = niceTicks(0, tallest, Math.min(5, tallest));
	const first = view.bins[0].from;
	const last = view.bins[view.bins.length - 1].to;
	const xTicks = niceTicks(first, last, 6);
	const plot = plotArea(doc, box, yTicks, null);
	// Room above the plot for one marker label a row.
	const labelRows = view.markers.length;
	plot.y += labelRows * 9;
	plot.height -= labelRows * 9;
	const y = linearScale([yTicks.min, yTicks.max], [plot.y + plot.height, plot.y]);
	const x = linearScale([xTicks.min, xTicks.max], [plot.x, plot.x + plot.width]);
	drawYAxis(doc, plot, yTicks, y, 'left', 'Draws', box, true);
	for (const bin of view.bins) {
		if (bin.count === 0) continue;
		const left = x(bin.from);
		const width = Math.max(0.3, x(bin.to) - left - 0.6);
		doc.rect(left + 0.3, y(bin.count), width, y(0) - y(bin.count)).fill(colours.positive);
	}
	const bottom = plot.y + plot.height;
	doc.moveTo(plot.x, bottom).lineTo(plot.x + plot.width, bottom).lineWidth(0.5).strokeColor(colours.faint).stroke();
	for (const value of xTicks.values) {
		const px = x(value);
		doc.moveTo(px, bottom).lineTo(px, bottom + TICK).lineWidth(0.5).strokeColor(colours.faint).stroke();
		write(doc, tickLabel(value, xTicks.step), px - 30, bottom + TICK + 1, { width: 60, align: 'center' });
	}
	view.markers.forEach((marker, row) => {
		const px = x(marker.value);
		const colour = PERCENTILE_COLOURS[marker.name];
		doc.moveTo(px, plot.y).lineTo(px, bottom).lineWidth(1.2).strokeColor(colour).dash(4, { space: 3 }).stroke();
		doc.undash();
		const label = `${marker.name} ${marker.text}`;
		doc.font('sansBold').fontSize(type.tiny + 0.5);
		const width = doc.widthOfString(printable(label)) + 2;
		const left = Math.min(Math.max(px - width / 2, box.x), box.x + box.width - width);
		write(doc, label, left, plot.y - (labelRows - row) * 9, { size: type.tiny + 0.5, colour, bold: true, width });
	});
	drawXTitle(doc, plot, `${view.label} (${view.unit})`);
	drawLegend(doc, box, [
		{ label: 'Draws in the bin', colour: colours.positive, kind: 'bar' },
		...view.markers.map((m) => ({ label: `${m.name} ${m.text} ${view.unit}`, colour: PERCENTILE_COLOURS[m.name], kind: 'dashed' as const }))
	]);
}
