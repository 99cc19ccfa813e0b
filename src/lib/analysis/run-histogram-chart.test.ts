import { describe, expect, it } from 'vitest';
import { chartColours } from '../components/charts/palette';
import type { RunHistogramView } from '../probabilistic/run-report';
import { runHistogramChart } from './run-histogram-chart';

const view: RunHistogramView = {
	key: 'equityIrr',
	label: 'Equity IRR',
	unit: '%/yr',
	bins: [
		{ from: 5, to: 7.5, count: 20 },
		{ from: 7.5, to: 10, count: 30 },
		{ from: 10, to: 12.5, count: 40 },
		{ from: 12.5, to: 15, count: 10 }
	],
	count: 100,
	markers: [
		{ name: 'P90', value: 5.9, text: '5.90' },
		{ name: 'P50', value: 9.5, text: '9.50' },
		{ name: 'P10', value: 13.1, text: '13.10' }
	]
};

describe('runHistogramChart', () => {
	const config = runHistogramChart(view);

	it("puts each bin's count at its centre on a linear axis spanning the bins, bars touching", () => {
		const dataset = config.data.datasets[0];
		expect(dataset.data).toEqual([
			{ x: 6.25, y: 20 },
			{ x: 8.75, y: 30 },
			{ x: 11.25, y: 40 },
			{ x: 13.75, y: 10 }
		]);
		expect(dataset).toMatchObject({ barPercentage: 1, categoryPercentage: 1, backgroundColor: chartColours.kelp });
		expect(config.options?.scales?.x).toMatchObject({ type: 'linear', min: 5, max: 15, title: { text: 'Equity IRR (%/yr)' } });
	});

	it('draws P90, P50 and P10 as labelled lines, P90 in the signal colour', () => {
		const plugins = config.options?.plugins as Record<string, { lines: { label: string; value: number; colour: string }[] }>;
		expect(plugins.percentileLines.lines).toEqual([
			{ label: 'P90 5.90', value: 5.9, colour: chartColours.flare },
			{ label: 'P50 9.50', value: 9.5, colour: chartColours.abyss },
			{ label: 'P10 13.10', value: 13.1, colour: chartColours.copper }
		]);
		expect(config.plugins?.map((p) => p.id)).toEqual(['percentileLines']);
	});
});
