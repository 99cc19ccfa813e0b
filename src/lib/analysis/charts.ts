/**
 * Chart.js configurations of the analysis pages, built from the API's
 * answers. Decimal strings become floats here, for drawing only.
 */
import type { Chart, ChartConfiguration, Plugin, TooltipItem } from 'chart.js';
import { chartColours, seriesColours } from '../components/charts/palette';
import { METRICS, metricUnit } from '../metrics/catalogue';
import { chartValue } from '../metrics/format';

const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };

export interface LcoeBar {
	name: string;
	lcoeReal: string | null;
	lcoeNominal: string | null;
	lcoeFcr: string | null;
}

/** LCOE of each scenario: real, nominal and the fixed-charge-rate form side by side. */
export function lcoeBarChart(scenarios: readonly LcoeBar[], currency: string): ChartConfiguration<'bar'> {
	const series = [
		{ key: 'lcoeReal', colour: chartColours.kelp },
		{ key: 'lcoeNominal', colour: chartColours.copper },
		{ key: 'lcoeFcr', colour: chartColours.sand }
	] as const;
	return {
		type: 'bar',
		data: {
			labels: scenarios.map((s) => s.name),
			datasets: series.map((s) => ({
				label: METRICS[s.key].label,
				data: scenarios.map((scenario) => chartValue(s.key, scenario[s.key])),
				backgroundColor: s.colour,
				borderRadius: 3
			}))
		},
		options: {
			plugins: { legend: { position: 'bottom' } },
			scales: {
				x: { grid: { display: false } },
				y: { beginAtZero: true, grid, title: axisTitle(metricUnit('lcoeReal', currency)) }
			}
		}
	};
}

export interface TornadoBar {
	label: string;
	/** Outputs at the driver's low and high input, as chart numbers in the display unit. */
	low: number | null;
	high: number | null;
}

/** Options of the base-value line drawn across a tornado chart. */
export interface BaseLineOptions {
	value: number | null;
	label: string;
}

/** A dashed vertical line at the x-axis value across the chart area, its label `raise` pixels above the top. */
export function drawMarkerLine(chart: Chart, value: number, colour: string, label: string, raise = 4): void {
	const x = chart.scales.x.getPixelForValue(value);
	const { top, bottom } = chart.chartArea;
	const ctx = chart.ctx;
	ctx.save();
	ctx.strokeStyle = colour;
	ctx.lineWidth = 1.5;
	ctx.setLineDash([5, 4]);
	ctx.beginPath();
	ctx.moveTo(x, top);
	ctx.lineTo(x, bottom);
	ctx.stroke();
	ctx.setLineDash([]);
	ctx.fillStyle = colour;
	ctx.font = '12px "IBM Plex Sans", system-ui, sans-serif';
	ctx.textAlign = 'center';
	ctx.textBaseline = 'bottom';
	ctx.fillText(label, x, top - raise);
	ctx.restore();
}

/** Draws a dashed vertical line at the base value across the chart area, labelled at the top. */
export const baseLinePlugin: Plugin<'bar', BaseLineOptions> = {
	id: 'baseLine',
	afterDatasetsDraw(chart, _args, options) {
		if (options.value === null || options.value === undefined) return;
		drawMarkerLine(chart, options.value, chartColours.abyss, options.label);
	}
};

/**
 * Tornado: for each driver (largest swing on top) a floating bar from the
 * base output to the output at the driver's low input, and one to the output
 * at its high input, in the same band, with the base value as a line.
 */
/**
 * A long category label as lines of at most `width` characters, broken at
 * spaces, so a narrow chart keeps every word ("Array, electrical and other
 * losses" on two lines) instead of cutting its start off.
 */
export function wrapLabel(text: string, width = 22): string | string[] {
	if (text.length <= width) return text;
	const lines: string[] = [];
	for (const word of text.split(/\s+/)) {
		const last = lines.at(-1);
		if (last !== undefined && last.length + 1 + word.length <= width) lines[lines.length - 1] = `${last} ${word}`;
		else lines.push(word);
	}
	return lines;
}

/** A legend entry cut to `width` characters with an ellipsis (legends do not wrap); tooltips keep the whole name. */
export function legendLabel(text: string, width = 30): string {
	return text.length <= width ? text : `${text.slice(0, width - 1).trimEnd()}…`;
}

export function tornadoChart(
	rows: readonly TornadoBar[],
	base: number | null,
	labels: { axis: string; baseLine: string },
	format: (value: number) => string
): ChartConfiguration<'bar'> {
	const from = base ?? 0;
	const bar = (value: number | null): [number, number] | null => (value === null ? null : [from, value]);
	const dataset = (label: string, values: (number | null)[], fill: string, border: string) => ({
		label,
		data: values.map(bar) as unknown as number[],
		backgroundColor: fill,
		borderColor: border,
		borderWidth: 1,
		barPercentage: 0.9,
		categoryPercentage: 0.8
	});
	return {
		type: 'bar',
		data: {
			labels: rows.map((r) => wrapLabel(r.label)),
			datasets: [
				dataset('At the low input', rows.map((r) => r.low), chartColours.abyssLight, chartColours.abyss),
				dataset('At the high input', rows.map((r) => r.high), chartColours.copperLight, chartColours.copper)
			]
		},
		plugins: [baseLinePlugin],
		options: {
			indexAxis: 'y',
			layout: { padding: { top: 18 } },
			plugins: {
				legend: { position: 'bottom' },
				tooltip: {
					callbacks: {
						label: (item: TooltipItem<'bar'>) => {
							const span = item.raw as [number, number] | null;
							return span ? `${item.dataset.label}: ${format(span[1])}` : `${item.dataset.label}: not defined`;
						}
					}
				},
				baseLine: { value: base, label: labels.baseLine }
			} as Record<string, unknown>,
			scales: {
				x: { beginAtZero: false, grace: '5%', grid, title: axisTitle(labels.axis) },
				y: { stacked: true, grid: { display: false } }
			}
		}
	};
}

export interface SpiderLine {
	label: string;
	/** change: relative change of the driver (0.1 = +10 %); value: the output as a chart number. */
	points: { change: number; value: number | null }[];
}

/** "+10 %", "−20 %", "0 %". */
export function changeLabel(change: number): string {
	const percent = Math.round(Math.abs(change) * 1000) / 10;
	return `${change > 0 ? '+' : change < 0 ? '−' : ''}${percent} %`;
}

/** Spider: the output against the same relative change of each driver, one line a driver. */
export function spiderChart(series: readonly SpiderLine[], axisLabel: string, format: (value: number) => string): ChartConfiguration<'line'> {
	const changes = series[0]?.points.map((p) => p.change) ?? [];
	return {
		type: 'line',
		data: {
			labels: changes.map(changeLabel),
			datasets: series.map((s, i) => ({
				label: legendLabel(s.label),
				data: s.points.map((p) => p.value),
				borderColor: seriesColours[i % seriesColours.length],
				backgroundColor: seriesColours[i % seriesColours.length],
				borderDash: i >= seriesColours.length ? [6, 3] : undefined,
				pointRadius: 3,
				tension: 0,
				spanGaps: false
			}))
		},
		options: {
			plugins: {
				legend: { position: 'bottom' },
				tooltip: {
					callbacks: { label: (item) => `${series[item.datasetIndex]?.label ?? item.dataset.label}: ${item.raw === null ? 'not defined' : format(item.raw as number)}` }
				}
			},
			scales: {
				x: { grid, title: axisTitle('Change of each driver from its base value') },
				y: { grid, title: axisTitle(axisLabel) }
			}
		}
	};
}
