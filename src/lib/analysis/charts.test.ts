import { describe, expect, it } from 'vitest';
import { legendLabel, spiderChart, tornadoChart, wrapLabel } from './charts';

describe('chart labels on narrow screens', () => {
	it('wraps a long category label at spaces into lines no longer than the width, keeping every word', () => {
		expect(wrapLabel('Capex')).toBe('Capex');
		const lines = wrapLabel('Array, electrical and other losses');
		expect(lines).toEqual(['Array, electrical and', 'other losses']);
		expect((lines as string[]).join(' ')).toBe('Array, electrical and other losses');
		// A single word longer than the width stays whole on its own line.
		expect(wrapLabel('Resource (flow speed, wave height or assessed energy)', 10)).toEqual(['Resource', '(flow', 'speed,', 'wave', 'height or', 'assessed', 'energy)']);
	});

	it('cuts a long legend entry with an ellipsis and leaves short ones alone', () => {
		expect(legendLabel('Opex')).toBe('Opex');
		const cut = legendLabel('Resource (flow speed, wave height or assessed energy)');
		expect(cut.length).toBeLessThanOrEqual(30);
		expect(cut.endsWith('…')).toBe(true);
	});

	it('uses them in the tornado and spider charts, the spider tooltip keeping the whole name', () => {
		const long = 'Resource (flow speed, wave height or assessed energy)';
		const tornado = tornadoChart([{ label: long, low: 1, high: 2 }], 1.5, { axis: 'LCOE', baseLine: 'base' }, String);
		expect(Array.isArray(tornado.data.labels?.[0])).toBe(true);
		const spider = spiderChart([{ label: long, points: [{ change: -0.1, value: 1 }, { change: 0.1, value: 2 }] }], 'LCOE', String);
		expect(spider.data.datasets[0].label).toBe(legendLabel(long));
		const tooltip = spider.options?.plugins?.tooltip?.callbacks?.label as unknown as (item: object) => string;
		expect(tooltip({ datasetIndex: 0, dataset: spider.data.datasets[0], raw: 2 })).toBe(`${long}: 2`);
	});
});
