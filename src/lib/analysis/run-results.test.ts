import { describe, expect, it } from 'vitest';
import { cumulativeChart, durationText, histogramChart, probabilityText, runValue } from './run-results';

describe('run results', () => {
	it('formats outputs with the catalogue precision and unit scale', () => {
		expect(runValue('equityIrr', 0.0716692778)).toBe('7.17');
		expect(runValue('minDscr', 1.3499999999)).toBe('1.35');
		expect(runValue('npv', null)).toBe('–');
		expect(probabilityText(0.1234)).toBe('12.3 %');
		expect(probabilityText(null, 'no lock-up')).toBe('no lock-up');
	});

	it('draws the histogram as shares of the draws at the bin midpoints', () => {
		const chart = histogramChart('equityIrr', { edges: [0.05, 0.06, 0.07], counts: [1, 3] }, 'EUR');
		expect(chart.data.datasets[0].data).toEqual([25, 75]);
		expect(chart.data.labels).toEqual(['5.50 %/yr', '6.50 %/yr']);
	});

	it('draws the cumulative curve in the display unit', () => {
		const chart = cumulativeChart('equityIrr', [{ probability: 0, value: 0.05 }, { probability: 1, value: 0.09 }], 'EUR');
		expect(chart.data.datasets[0].data).toEqual([{ x: 5, y: 0 }, { x: 9, y: 100 }]);
	});

	it('says how long is left in words', () => {
		expect(durationText(null)).toBe('working it out');
		expect(durationText(0.4)).toBe('under a second');
		expect(durationText(200)).toBe('3 min 20 s');
	});
});
