/**
 * The chart.js configuration of a probabilistic run's histogram: one bar per
 * bin on a linear axis of the output (bars touching, as a histogram's do),
 * with P90, P50 and P10 drawn as labelled dashed lines across it.
 */
import type { ChartConfiguration, Plugin, TooltipItem } from 'chart.js';
import { chartColours } from '../components/charts/palette';
import { edgeText, type RunHistogramView } from '../probabilistic/run-report';
import { drawMarkerLine } from './charts';

const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };

export interface PercentileLinesOptions {
	lines: { label: string; value: number; colour: string }[];
}

/** Colours of the percentile lines: P90 in the signal colour (the lenders' case), P50 in ink, P10 in copper. */
export const PERCENTILE_COLOURS = { P90: chartColours.flare, P50: chartColours.abyss, P10: chartColours.copper } as const;

const LABEL_STEP = 14;

/** Dashed vertical lines at given x values across the chart area, each labelled above it, one label a row so close lines never hide each other's. */
export const percentileLinesPlugin: Plugin<'bar', PercentileLinesOptions> = {
	id: 'percentileLines',
	afterDatasetsDraw(chart, _args, options) {
		const lines = options.lines ?? [];
		lines.forEach((line, row) => drawMarkerLine(chart, line.value, line.colour, line.label, 4 + (lines.length - 1 - row) * LABEL_STEP));
	}
};

/** Bars at the bins' centres on a linear axis, each as wide as its bin. */
export function runHistogramChart(view: RunHistogramView): ChartConfiguration<'bar'> {
	const points = view.bins.map((b) => ({ x: (b.from + b.to) / 2, y: b.count }));
	const first = view.bins[0]?.from ?? 0;
	const last = view.bins[view.bins.length - 1]?.to ?? 1;
	const axis = `${view.label} (${view.unit})`;
	return {
		type: 'bar',
		data: {
			datasets: [
				{
					label: 'Draws in the bin',
					data: points as unknown as number[],
					backgroundColor: chartColours.kelp,
					borderColor: '#ffffff',
					borderWidth: 1,
					barPercentage: 1,
					categoryPercentage: 1,
					grouped: false
				}
			]
		},
		plugins: [percentileLinesPlugin],
		options: {
			layout: { padding: { top: 6 + LABEL_STEP * Math.max(1, view.markers.length) } },
			plugins: {
				legend: { display: false },
				tooltip: {
					callbacks: {
						title: (items: TooltipItem<'bar'>[]) => {
							const bin = view.bins[items[0]?.dataIndex ?? 0];
							return bin ? `${edgeText(bin.from)} to ${edgeText(bin.to)} ${view.unit}` : '';
						},
						label: (item: TooltipItem<'bar'>) => `${(item.raw as { y: number }).y.toLocaleString('en-GB')} draws`
					}
				},
				percentileLines: { lines: view.markers.map((m) => ({ label: `${m.name} ${m.text}`, value: m.value, colour: PERCENTILE_COLOURS[m.name] })) }
			} as Record<string, unknown>,
			scales: {
				x: { type: 'linear', min: first, max: last, offset: false, grid, title: axisTitle(axis), ticks: { callback: (value) => edgeText(Number(value)) } },
				y: { beginAtZero: true, grid, title: axisTitle('Draws'), ticks: { precision: 0 } }
			}
		}
	};
}
