/**
 * The portfolio chart: LCOE against installed capacity, one bubble a project
 * (its area in proportion to capex), one colour a technology, one chart a
 * currency (LCOE and capex in two currencies do not share an axis). Only
 * projects with both figures are drawn. Floats here are for drawing only;
 * the words for screen readers are formatted from the decimal strings.
 */
import type { ChartConfiguration, TooltipItem } from 'chart.js';
import { chartColours } from '../components/charts/palette';
import { figureDefinition, metricUnit } from '../metrics/catalogue';
import { chartValue, formatMetric, formatMetricWithUnit } from '../metrics/format';
import { technologyLabels, type Technology } from '../technology';
import type { PortfolioRow } from '../schemas/portfolio';

export const technologyColours: Readonly<Record<Technology, string>> = {
	'tidal-stream': chartColours.kelp,
	'ocean-current': chartColours.abyss,
	wave: chartColours.copper
};

const lcoeLabel = figureDefinition('lcoeReal').label;

const SMALLEST_RADIUS = 5;
const LARGEST_RADIUS = 28;

export interface BubblePoint {
	projectId: string;
	projectName: string;
	technology: Technology;
	capacityMW: string;
	lcoe: string;
	capex: string | null;
}

export interface ChartGroup {
	currency: string;
	points: BubblePoint[];
}

/** The projects to draw, one group a currency (A to Z), each by name: rows with results whose capacity and LCOE are both known. */
export function chartGroups(rows: readonly PortfolioRow[]): ChartGroup[] {
	const groups = new Map<string, BubblePoint[]>();
	for (const row of rows) {
		const { installedCapacityMW, lcoeReal, capexRealTotal } = row.figures;
		if (row.missing !== null || installedCapacityMW === null || lcoeReal === null) continue;
		const points = groups.get(row.currency) ?? [];
		points.push({ projectId: row.projectId, projectName: row.projectName, technology: row.technology, capacityMW: installedCapacityMW, lcoe: lcoeReal, capex: capexRealTotal });
		groups.set(row.currency, points);
	}
	return [...groups.entries()]
		.sort(([a], [b]) => a.localeCompare(b))
		.map(([currency, points]) => ({ currency, points: points.sort((a, b) => a.projectName.localeCompare(b.projectName)) }));
}

/** Bubble radius in pixels: the area grows with capex, r = r_min + (r_max - r_min) x sqrt(capex / largest capex). */
export function bubbleRadius(capex: number | null, largestCapex: number): number {
	if (capex === null || !(largestCapex > 0) || capex <= 0) return SMALLEST_RADIUS;
	return SMALLEST_RADIUS + (LARGEST_RADIUS - SMALLEST_RADIUS) * Math.sqrt(Math.min(capex, largestCapex) / largestCapex);
}

/** The chart's accessible name. */
export function chartLabel(group: ChartGroup): string {
	return `Bubble chart of ${lcoeLabel} in ${metricUnit('lcoeReal', group.currency)} against installed capacity in MW for ${group.points.length} project${group.points.length === 1 ? '' : 's'} in ${group.currency}; bubble size shows capex, colour the technology`;
}

/** One line a project, for the text beside the chart. */
export function pointDescription(point: BubblePoint, currency: string): string {
	const capex = point.capex === null ? 'capex unknown' : `capex ${formatMetricWithUnit('capexRealTotal', point.capex, currency)}`;
	return `${point.projectName} (${technologyLabels[point.technology]}): ${formatMetricWithUnit('installedCapacityMW', point.capacityMW, currency)}, LCOE ${formatMetricWithUnit('lcoeReal', point.lcoe, currency)}, ${capex}`;
}

/** What the chart shows, in a sentence or two: the range of LCOE and of capacity, and where each end sits. */
export function chartSummary(group: ChartGroup): string {
	const byLcoe = [...group.points].sort((a, b) => Number(a.lcoe) - Number(b.lcoe));
	const byCapacity = [...group.points].sort((a, b) => Number(a.capacityMW) - Number(b.capacityMW));
	const lowest = byLcoe[0];
	const highest = byLcoe[byLcoe.length - 1];
	if (!lowest || !highest) return `No project in ${group.currency} has both an LCOE and an installed capacity to draw.`;
	const count = `${group.points.length} project${group.points.length === 1 ? '' : 's'} in ${group.currency}.`;
	if (group.points.length === 1) return `${count} ${pointDescription(lowest, group.currency)}.`;
	const lcoe = `${lcoeLabel} from ${formatMetricWithUnit('lcoeReal', lowest.lcoe, group.currency)} (${lowest.projectName}) to ${formatMetricWithUnit('lcoeReal', highest.lcoe, group.currency)} (${highest.projectName}).`;
	const capacity = `Installed capacity from ${formatMetric('installedCapacityMW', byCapacity[0].capacityMW)} to ${formatMetricWithUnit('installedCapacityMW', byCapacity[byCapacity.length - 1].capacityMW, group.currency)}.`;
	return `${count} ${lcoe} ${capacity}`;
}

const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };

/** The chart.js configuration of one group: a dataset a technology, so the legend names the colours. */
export function bubbleChart(group: ChartGroup): ChartConfiguration<'bubble'> {
	const { currency } = group;
	const largestCapex = Math.max(0, ...group.points.map((p) => chartValue('capexRealTotal', p.capex) ?? 0));
	const technologies = (Object.keys(technologyLabels) as Technology[]).filter((t) => group.points.some((p) => p.technology === t));
	const pointsOf = technologies.map((t) => group.points.filter((p) => p.technology === t));
	const tooltipLabel = (item: TooltipItem<'bubble'>) => {
		const point = pointsOf[item.datasetIndex]?.[item.dataIndex];
		return point ? pointDescription(point, currency) : '';
	};
	return {
		type: 'bubble',
		data: {
			datasets: technologies.map((technology, i) => ({
				label: technologyLabels[technology],
				data: pointsOf[i].map((p) => ({
					x: chartValue('installedCapacityMW', p.capacityMW) ?? 0,
					y: chartValue('lcoeReal', p.lcoe) ?? 0,
					r: bubbleRadius(chartValue('capexRealTotal', p.capex), largestCapex)
				})),
				backgroundColor: `${technologyColours[technology]}99`,
				borderColor: technologyColours[technology],
				borderWidth: 1.5
			}))
		},
		options: {
			plugins: {
				legend: { position: 'bottom', labels: { boxWidth: 12 } },
				tooltip: { callbacks: { label: tooltipLabel } }
			},
			scales: {
				// Room beyond the largest point, so the bubble there is not cut by the plot's edge.
				x: {
					beginAtZero: true,
					grace: '12%',
					grid,
					title: axisTitle(`${figureDefinition('installedCapacityMW').label} (${metricUnit('installedCapacityMW', currency)})`)
				},
				y: {
					beginAtZero: true,
					grace: '12%',
					grid,
					title: axisTitle(`${figureDefinition('lcoeReal').label} (${metricUnit('lcoeReal', currency)})`)
				}
			}
		}
	};
}
