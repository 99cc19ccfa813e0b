import { describe, expect, it } from 'vitest';
import { cumulativeChart, durationText } from './run-results';

describe('run results', () => {
	it('draws the cumulative curve in the display unit', () => {
		const chart = cumulativeChart('equityIrr', [{ probability: 0, value: 0.05 }, { probability: 1, value: 0.09 }], 'EUR');
		expect(chart.data.datasets[0].data).toEqual([{ x: 5, y: 0 }, { x: 9, y: 100 }]);
		const lcoe = cumulativeChart('lcoeReal', [{ probability: 0.5, value: 250 }], 'EUR');
		expect(lcoe.data.datasets[0].data).toEqual([{ x: 250, y: 50 }]);
	});

	it('says how long is left in words', () => {
		expect(durationText(null)).toBe('working it out');
		expect(durationText(0.4)).toBe('under a second');
		expect(durationText(45.4)).toBe('45 s');
		expect(durationText(200)).toBe('3 min 20 s');
	});
});
