/**
 * A probabilistic run's results as the pages show them: outputs in the
 * metric catalogue's words, units and precision, and the chart.js
 * configurations of a histogram and a cumulative curve. Safe to import in the browser.
 */
import type { ChartConfiguration } from 'chart.js';
import { chartColours } from '../components/charts/palette';
import { METRICS, metricUnit, type MetricKey } from '../metrics/catalogue';
import { formatChartValue, formatMetric, NO_VALUE } from '../metrics/format';

/** The outputs every draw reports (RUN_OUTPUTS on the server), in the order the tables list them. */
export const RUN_OUTPUT_KEYS = ['equityIrr', 'projectIrrPostTax', 'minDscr', 'lcoeReal', 'npv'] as const satisfies readonly MetricKey[];
export type RunOutputKey = (typeof RUN_OUTPUT_KEYS)[number];

/** An engine value (a fraction for per cent figures) at the catalogue's precision, without the unit; null reads as a dash. */
export function runValue(key: RunOutputKey, value: number | null | undefined): string {
	return value === null || value === undefined || !Number.isFinite(value) ? NO_VALUE : formatMetric(key, String(value));
}

export function runLabel(key: RunOutputKey): string {
	return METRICS[key].label;
}

export function runUnit(key: RunOutputKey, currency: string): string {
	return metricUnit(key, currency);
}

/** A probability as per cent with one decimal: "12.3 %"; null reads as words. */
export function probabilityText(p: number | null | undefined, none = 'not given'): string {
	return p === null || p === undefined ? none : `${(p * 100).toFixed(1)} %`;
}

const scale = (key: RunOutputKey) => (METRICS[key].scale === 'percent' ? 100 : 1);
const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };

/** Share of the draws in each bin, against the bins' midpoints in the display unit. */
export function histogramChart(key: RunOutputKey, histogram: { edges: number[]; counts: number[] }, currency: string): ChartConfiguration<'bar'> {
	const total = histogram.counts.reduce((a, b) => a + b, 0) || 1;
	const s = scale(key);
	const labels = histogram.counts.map((_, i) => formatChartValue(key, ((histogram.edges[i] + histogram.edges[i + 1]) / 2) * s, currency));
	return {
		type: 'bar',
		data: {
			labels,
			datasets: [
				{
					label: 'Share of draws (%)',
					data: histogram.counts.map((c) => (c / total) * 100),
					backgroundColor: chartColours.kelp,
					categoryPercentage: 1,
					barPercentage: 0.95
				}
			]
		},
		options: {
			plugins: { legend: { display: false } },
			scales: {
				x: { title: axisTitle(`${runLabel(key)} (${runUnit(key, currency)})`), grid: { display: false }, ticks: { maxTicksLimit: 8 } },
				y: { title: axisTitle('Share of draws (%)'), grid, beginAtZero: true }
			}
		}
	};
}

/** The cumulative curve: the probability that the output is at or below each value. */
export function cumulativeChart(key: RunOutputKey, curve: { probability: number; value: number }[], currency: string): ChartConfiguration<'line'> {
	const s = scale(key);
	return {
		type: 'line',
		data: {
			datasets: [
				{
					label: 'Probability at or below (%)',
					data: curve.map((p) => ({ x: p.value * s, y: p.probability * 100 })),
					borderColor: chartColours.copper,
					backgroundColor: chartColours.copper,
					pointRadius: 0,
					borderWidth: 2
				}
			]
		},
		options: {
			parsing: false,
			plugins: {
				legend: { display: false },
				tooltip: { callbacks: { label: (item) => `${(item.parsed.y ?? 0).toFixed(0)} % at or below ${formatChartValue(key, item.parsed.x ?? 0, currency)}` } }
			},
			scales: {
				x: { type: 'linear', title: axisTitle(`${runLabel(key)} (${runUnit(key, currency)})`), grid },
				y: { min: 0, max: 100, title: axisTitle('Probability at or below (%)'), grid }
			}
		}
	};
}

/** "3 min 20 s", "45 s", "under a second". */
export function durationText(seconds: number | null): string {
	if (seconds === null) return 'working it out';
	if (seconds < 1) return 'under a second';
	const s = Math.round(seconds);
	if (s < 60) return `${s} s`;
	const m = Math.floor(s / 60);
	return `${m} min ${s % 60} s`;
}
