/**
 * What the scenario's runs page adds to the run report (../probabilistic/run-report.ts):
 * the cumulative curve of an output and the time left in words. Safe to import in the browser.
 */
import type { ChartConfiguration } from 'chart.js';
import { chartColours } from '../components/charts/palette';
import { METRICS, metricUnit, type MetricKey } from '../metrics/catalogue';
import { formatChartValue } from '../metrics/format';

const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };

/** The cumulative curve: the probability that the output is at or below each value, in the display unit. */
export function cumulativeChart(key: MetricKey, curve: { probability: number; value: number }[], currency: string): ChartConfiguration<'line'> {
	const scale = METRICS[key].scale === 'percent' ? 100 : 1;
	const axis = `${METRICS[key].label} (${metricUnit(key, currency)})`;
	return {
		type: 'line',
		data: {
			datasets: [
				{
					label: 'Probability at or below (%)',
					data: curve.map((p) => ({ x: p.value * scale, y: p.probability * 100 })),
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
				x: { type: 'linear', title: axisTitle(axis), grid },
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
