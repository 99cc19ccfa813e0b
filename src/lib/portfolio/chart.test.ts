import { describe, expect, it } from 'vitest';
import { METRICS } from '../metrics/catalogue';
import { bubbleChart, bubbleRadius, chartGroups, chartLabel, chartSummary, technologyColours } from './chart';
import { portfolioRow } from '../server/workbench/testing/portfolio-rows';

const quenmoor = portfolioRow({ projectName: 'Quenmoor Sound', technology: 'tidal-stream' }, [['installedCapacityMW', '24'], ['lcoeReal', '180.5'], ['capexRealTotal', '160000000']]);
const tallowick = portfolioRow({ projectName: 'Tallowick Race', technology: 'tidal-stream' }, [['installedCapacityMW', '4.5'], ['lcoeReal', '410.25'], ['capexRealTotal', '40000000']]);
const ulvenholt = portfolioRow({ projectName: 'Ulvenholt Shelf', technology: 'wave' }, [['installedCapacityMW', '14'], ['lcoeReal', '320'], ['capexRealTotal', '90000000']]);
const merrowgate = portfolioRow({ projectName: 'Merrowgate Deep', technology: 'ocean-current', currency: 'USD' }, [['installedCapacityMW', '6'], ['lcoeReal', '290'], ['capexRealTotal', null]]);
const noEnergy = portfolioRow({ projectName: 'Dry Run' }, [['installedCapacityMW', '1']]);
const notEvaluated = portfolioRow({ projectName: 'Brackwater Deep', missing: 'not-evaluated' });

describe('chartGroups', () => {
	it('draws only rows with results, capacity and LCOE, one group a currency, projects by name', () => {
		const groups = chartGroups([ulvenholt, notEvaluated, merrowgate, tallowick, noEnergy, quenmoor]);
		expect(groups.map((g) => g.currency)).toEqual(['EUR', 'USD']);
		expect(groups[0].points.map((p) => p.projectName)).toEqual(['Quenmoor Sound', 'Tallowick Race', 'Ulvenholt Shelf']);
		expect(groups[1].points).toEqual([{ projectId: merrowgate.projectId, projectName: 'Merrowgate Deep', technology: 'ocean-current', capacityMW: '6', lcoe: '290', capex: null }]);
	});
});

describe('bubbleRadius', () => {
	it('grows the area, not the radius, with capex, between 5 and 28 px', () => {
		expect(bubbleRadius(100, 100)).toBe(28);
		// A quarter of the largest capex: half the span of radii, sqrt(1/4) = 1/2.
		expect(bubbleRadius(25, 100)).toBeCloseTo(5 + 23 / 2, 10);
		expect(bubbleRadius(null, 100)).toBe(5);
		expect(bubbleRadius(0, 0)).toBe(5);
	});
});

describe('bubbleChart', () => {
	it('puts capacity on x and LCOE on y, a dataset a technology in its colour, the largest capex the largest bubble', () => {
		const [group] = chartGroups([quenmoor, tallowick, ulvenholt]);
		const config = bubbleChart(group);
		expect(config.type).toBe('bubble');
		expect(config.data.datasets.map((d) => d.label)).toEqual(['Tidal stream', 'Wave']);
		expect(config.data.datasets[0].borderColor).toBe(technologyColours['tidal-stream']);
		const tidal = config.data.datasets[0].data as { x: number; y: number; r: number }[];
		expect(tidal[0]).toEqual({ x: 24, y: 180.5, r: 28 });
		expect(tidal[1].r).toBeLessThan(tidal[0].r);
		const scales = config.options?.scales as Record<string, { title: { text: string } }>;
		expect(scales.y.title.text).toBe(`${METRICS.lcoeReal.label} (EUR/MWh)`);
		expect(scales.x.title.text).toBe('Installed capacity (MW)');
	});
});

describe('chartLabel and chartSummary', () => {
	it('name the chart and say in words where LCOE and capacity range', () => {
		const [group] = chartGroups([quenmoor, tallowick, ulvenholt]);
		expect(chartLabel(group)).toMatch(/^Bubble chart of .+ in EUR\/MWh against installed capacity in MW for 3 projects in EUR/);
		const summary = chartSummary(group);
		expect(summary).toContain('3 projects in EUR.');
		expect(summary).toContain('from 180.50 EUR/MWh (Quenmoor Sound) to 410.25 EUR/MWh (Tallowick Race)');
		expect(summary).toContain('Installed capacity from 4.50 to 24.00 MW.');
	});

	it('describes a single project by itself', () => {
		const [group] = chartGroups([merrowgate]);
		expect(chartSummary(group)).toBe('1 project in USD. Merrowgate Deep (Ocean current): 6.00 MW, LCOE 290.00 USD/MWh, capex unknown.');
	});
});
