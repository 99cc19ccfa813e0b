/**
 * Chart.js configurations of the device in the editor: a power curve as a
 * line, a power matrix as a shaded grid (a heat map drawn by a small plugin
 * on a scatter chart, so chart.js core is enough). Built from the document's
 * plain numbers; values still being typed (empty, out of order) are left out
 * rather than drawn wrong.
 */
import type { Chart, ChartConfiguration, Plugin, TooltipItem } from 'chart.js';
import type { DeviceSpec } from '../schemas/scenario';
import { chartColours } from '../components/charts/palette';
import { formatNumber } from './format';

type PowerCurvePoint = Extract<DeviceSpec, { kind: 'power-curve' }>['points'][number];
type PowerMatrix = Extract<DeviceSpec, { kind: 'power-matrix' }>;

const axisTitle = (text: string) => ({ display: true, text, color: chartColours.abyss });
const grid = { color: 'rgba(29, 67, 87, 0.08)' };
const isNumber = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
/** 1.5, 12.25, 333.3: as typed, to three decimals at most. */
const plain = (x: number) => formatNumber(x, 3).replace(/\.?0+$/, '');

/** The points a chart can draw: both numbers present, speeds ascending (a point out of order is left out). */
export function drawablePoints(points: readonly Partial<PowerCurvePoint>[]): { x: number; y: number }[] {
	const drawn: { x: number; y: number }[] = [];
	for (const p of points) {
		if (!isNumber(p.speedMPerS) || !isNumber(p.powerKW)) continue;
		if (drawn.length > 0 && p.speedMPerS <= drawn[drawn.length - 1].x) continue;
		drawn.push({ x: p.speedMPerS, y: p.powerKW });
	}
	return drawn;
}

/**
 * Power against flow speed, with the rated power as a dashed line. `smooth`
 * draws a finely sampled curve without point markers (a rotor's), else the
 * points themselves are marked (a measured curve's).
 */
export function powerCurveChart(
	points: readonly Partial<PowerCurvePoint>[],
	ratedPowerKW: number | null,
	options: { label: string; smooth?: boolean }
): ChartConfiguration<'scatter'> {
	const drawn = drawablePoints(points);
	const first = drawn[0]?.x ?? 0;
	const last = drawn.at(-1)?.x ?? 0;
	const rated =
		ratedPowerKW !== null && isNumber(ratedPowerKW) && drawn.length > 1
			? [
					{
						label: `Rated power (${plain(ratedPowerKW)} kW)`,
						data: [
							{ x: first, y: ratedPowerKW },
							{ x: last, y: ratedPowerKW }
						],
						showLine: true,
						borderColor: chartColours.copper,
						backgroundColor: chartColours.copper,
						borderDash: [6, 4],
						borderWidth: 1.5,
						pointRadius: 0
					}
				]
			: [];
	return {
		type: 'scatter',
		data: {
			datasets: [
				{
					label: options.label,
					data: drawn,
					showLine: true,
					borderColor: chartColours.kelp,
					backgroundColor: chartColours.kelp,
					borderWidth: 2,
					pointRadius: options.smooth ? 0 : 3,
					tension: 0
				},
				...rated
			]
		},
		options: {
			interaction: { mode: 'nearest', axis: 'x', intersect: false },
			plugins: {
				legend: { position: 'bottom', labels: { boxWidth: 12 } },
				tooltip: {
					callbacks: { label: (item: TooltipItem<'scatter'>) => `${item.dataset.label}: ${plain(item.parsed.y ?? 0)} kW at ${plain(item.parsed.x ?? 0)} m/s` }
				}
			},
			scales: {
				x: { type: 'linear', min: 0, grid, title: axisTitle('Flow speed (m/s)') },
				y: { beginAtZero: true, grace: '5%', grid, title: axisTitle('Power per device (kW)') }
			}
		}
	};
}

/**
 * Cell edges along an axis of ascending values: halfway between neighbours,
 * and half a gap beyond each end (±0.5 for a single value); null when the
 * values do not ascend.
 */
export function cellEdges(values: readonly number[]): number[] | null {
	if (values.length === 0 || !values.every(isNumber)) return null;
	for (let i = 1; i < values.length; i++) if (!(values[i] > values[i - 1])) return null;
	if (values.length === 1) return [values[0] - 0.5, values[0] + 0.5];
	const mids = values.slice(1).map((v, i) => (v + values[i]) / 2);
	return [values[0] - (values[1] - values[0]) / 2, ...mids, values.at(-1)! + (values.at(-1)! - values.at(-2)!) / 2];
}

const white = [255, 255, 255];
const kelp = [0x2f, 0x7d, 0x6d];

/** White for nothing, the kelp green for the largest power, in between by share: an `rgb(...)` colour. */
export function shadeOf(powerKW: number, largestKW: number): string {
	const share = largestKW > 0 ? Math.min(1, Math.max(0, powerKW / largestKW)) : 0;
	const [r, g, b] = white.map((w, i) => Math.round(w + (kelp[i] - w) * share));
	return `rgb(${r}, ${g}, ${b})`;
}

export interface MatrixCell {
	/** Period and Hs at the cell's centre. */
	x: number;
	y: number;
	powerKW: number;
	/** The cell's edges, period then Hs. */
	x0: number;
	x1: number;
	y0: number;
	y1: number;
	shade: string;
	/** Light text on the darker cells. */
	ink: string;
}

/** The matrix as cells to draw; null while its axes do not ascend or its rows do not match them. */
export function matrixCells(matrix: Pick<PowerMatrix, 'hsM' | 'periodS' | 'powerKW'>): MatrixCell[] | null {
	const xs = cellEdges(matrix.periodS);
	const ys = cellEdges(matrix.hsM);
	if (!xs || !ys || matrix.powerKW.length !== matrix.hsM.length || matrix.powerKW.some((row) => row.length !== matrix.periodS.length)) return null;
	const largest = Math.max(0, ...matrix.powerKW.flat().filter(isNumber));
	return matrix.powerKW.flatMap((row, i) =>
		row.map((value, j) => {
			const powerKW = isNumber(value) ? value : 0;
			return {
				x: matrix.periodS[j],
				y: matrix.hsM[i],
				powerKW,
				x0: xs[j],
				x1: xs[j + 1],
				y0: ys[i],
				y1: ys[i + 1],
				shade: shadeOf(powerKW, largest),
				ink: largest > 0 && powerKW / largest > 0.55 ? '#ffffff' : chartColours.abyss
			};
		})
	);
}

/** Fills each cell of the first dataset with its shade, and writes its power in it where the number fits. */
export const heatCellsPlugin: Plugin<'scatter'> = {
	id: 'heatCells',
	beforeDatasetsDraw(chart: Chart) {
		const cells = (chart.data.datasets[0]?.data ?? []) as unknown as MatrixCell[];
		const { x, y } = chart.scales;
		const ctx = chart.ctx;
		ctx.save();
		ctx.font = '11px "IBM Plex Sans", system-ui, sans-serif';
		ctx.textAlign = 'center';
		ctx.textBaseline = 'middle';
		for (const cell of cells) {
			const left = x.getPixelForValue(cell.x0);
			const right = x.getPixelForValue(cell.x1);
			const top = y.getPixelForValue(cell.y1);
			const bottom = y.getPixelForValue(cell.y0);
			ctx.fillStyle = cell.shade;
			ctx.fillRect(left, top, right - left, bottom - top);
			ctx.strokeStyle = 'rgba(29, 67, 87, 0.12)';
			ctx.strokeRect(left, top, right - left, bottom - top);
			const text = formatNumber(cell.powerKW, cell.powerKW < 10 && !Number.isInteger(cell.powerKW) ? 1 : 0);
			if (ctx.measureText(text).width < right - left - 4 && bottom - top >= 14) {
				ctx.fillStyle = cell.ink;
				ctx.fillText(text, (left + right) / 2, (top + bottom) / 2);
			}
		}
		ctx.restore();
	}
};

/** Ticks at the axis values themselves (a matrix has no values between them). */
const ticksAt = (values: readonly number[]) => (scale: { ticks: { value: number }[] }) => {
	scale.ticks = values.map((value) => ({ value }));
};

/** The power matrix as a heat map: period across, Hs up, each cell shaded by its power (kW written in it where it fits). */
export function powerMatrixChart(matrix: Pick<PowerMatrix, 'hsM' | 'periodS' | 'powerKW'>, periodName: 'Te' | 'Tp'): ChartConfiguration<'scatter'> | null {
	const cells = matrixCells(matrix);
	if (!cells) return null;
	const first = cells[0];
	const last = cells.at(-1)!;
	return {
		type: 'scatter',
		data: { datasets: [{ label: 'Mean power per device (kW)', data: cells as unknown as { x: number; y: number }[], pointRadius: 0, pointHoverRadius: 0 }] },
		plugins: [heatCellsPlugin],
		options: {
			interaction: { mode: 'nearest', intersect: false },
			plugins: {
				legend: { display: false },
				tooltip: {
					callbacks: {
						label: (item: TooltipItem<'scatter'>) => {
							const cell = item.raw as MatrixCell;
							return `Hs ${plain(cell.y)} m, ${periodName} ${plain(cell.x)} s: ${plain(cell.powerKW)} kW`;
						}
					}
				}
			},
			scales: {
				x: { type: 'linear', min: first.x0, max: last.x1, grid: { display: false }, afterBuildTicks: ticksAt(matrix.periodS), title: axisTitle(`${periodName} (s)`) },
				y: { type: 'linear', min: first.y0, max: last.y1, grid: { display: false }, afterBuildTicks: ticksAt(matrix.hsM), title: axisTitle('Hs (m)') }
			}
		}
	};
}
