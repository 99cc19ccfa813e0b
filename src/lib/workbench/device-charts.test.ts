import { describe, expect, it } from 'vitest';
import { chartColours } from '../components/charts/palette';
import { cellEdges, drawablePoints, matrixCells, powerCurveChart, powerMatrixChart, shadeOf } from './device-charts';

describe('drawablePoints', () => {
	it('keeps complete points in ascending speed and leaves out the rest', () => {
		const points = [
			{ speedMPerS: 0.5, powerKW: 0 },
			{ speedMPerS: 1, powerKW: undefined },
			{ speedMPerS: 1.5, powerKW: 300 },
			{ speedMPerS: 1.2, powerKW: 200 },
			{ speedMPerS: 2.5, powerKW: 1000 }
		];
		expect(drawablePoints(points)).toEqual([
			{ x: 0.5, y: 0 },
			{ x: 1.5, y: 300 },
			{ x: 2.5, y: 1000 }
		]);
	});
});

describe('powerCurveChart', () => {
	it('draws the curve and a flat rated-power line across its speeds', () => {
		const config = powerCurveChart(
			[
				{ speedMPerS: 0.7, powerKW: 0 },
				{ speedMPerS: 2.5, powerKW: 1000 },
				{ speedMPerS: 4.5, powerKW: 1000 }
			],
			1000,
			{ label: 'Power curve (kW)' }
		);
		const [curve, rated] = config.data.datasets;
		expect(curve.data).toHaveLength(3);
		expect(rated.data).toEqual([
			{ x: 0.7, y: 1000 },
			{ x: 4.5, y: 1000 }
		]);
		expect(rated.label).toBe('Rated power (1,000 kW)');
	});

	it('has no rated line without a rating', () => {
		expect(powerCurveChart([{ speedMPerS: 1, powerKW: 1 }, { speedMPerS: 2, powerKW: 2 }], null, { label: 'x' }).data.datasets).toHaveLength(1);
	});
});

describe('cellEdges', () => {
	it('puts edges halfway between values and half a gap beyond the ends', () => {
		// By hand: 6, 8, 10 s -> 5 | 7 | 9 | 11.
		expect(cellEdges([6, 8, 10])).toEqual([5, 7, 9, 11]);
		expect(cellEdges([2])).toEqual([1.5, 2.5]);
		expect(cellEdges([1, 1, 2])).toBeNull();
		expect(cellEdges([])).toBeNull();
	});
});

describe('shadeOf', () => {
	it('runs from white to the chart kelp green by share of the largest power', () => {
		expect(shadeOf(0, 540)).toBe('rgb(255, 255, 255)');
		// The palette's kelp #2f7d6d is rgb(47, 125, 109).
		expect(chartColours.kelp).toBe('#2f7d6d');
		expect(shadeOf(540, 540)).toBe('rgb(47, 125, 109)');
		// Halfway by hand: 255 + (47 - 255) / 2 = 151; 255 + (125 - 255) / 2 = 190; 255 + (109 - 255) / 2 = 182.
		expect(shadeOf(270, 540)).toBe('rgb(151, 190, 182)');
		expect(shadeOf(5, 0)).toBe('rgb(255, 255, 255)');
	});
});

describe('matrixCells and powerMatrixChart', () => {
	const matrix = {
		hsM: [1, 2, 3],
		periodS: [6, 8, 10],
		powerKW: [
			[40, 60, 50],
			[160, 240, 200],
			[360, 540, 450]
		]
	};

	it('gives each cell its value, edges and shade, row by row', () => {
		const cells = matrixCells(matrix)!;
		expect(cells).toHaveLength(9);
		expect(cells[4]).toMatchObject({ x: 8, y: 2, powerKW: 240, x0: 7, x1: 9, y0: 1.5, y1: 2.5 });
		expect(cells[7].shade).toBe('rgb(47, 125, 109)');
		expect(cells[7].ink).toBe('#ffffff');
		expect(cells[0].ink).toBe(chartColours.abyss);
	});

	it('spans the axes over the cells and is absent while a row is short', () => {
		const config = powerMatrixChart(matrix, 'Te')!;
		expect(config.options?.scales?.x).toMatchObject({ min: 5, max: 11 });
		expect(config.options?.scales?.y).toMatchObject({ min: 0.5, max: 3.5 });
		expect(powerMatrixChart({ ...matrix, powerKW: [[1, 2, 3], [4, 5], [6, 7, 8]] }, 'Te')).toBeNull();
	});
});
