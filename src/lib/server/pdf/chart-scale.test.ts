import { describe, expect, it } from 'vitest';
import { labelEvery, linearScale, niceTicks, stepPlaces, tickLabel } from './chart-scale';

describe('niceTicks', () => {
	// Rounding the rough step at 1.5, 3 and 7 as in P. Heckbert, "Nice numbers for graph labels", Graphics Gems (1990).
	it('covers the range in steps of 1, 2 or 5 times a power of ten', () => {
		expect(niceTicks(0, 7300, 5)).toEqual({ min: 0, max: 8000, step: 1000, values: [0, 1000, 2000, 3000, 4000, 5000, 6000, 7000, 8000] });
		expect(niceTicks(0, 9000, 5)).toEqual({ min: 0, max: 10000, step: 2000, values: [0, 2000, 4000, 6000, 8000, 10000] });
		expect(niceTicks(-66.4, 72.1, 6).values).toEqual([-80, -60, -40, -20, 0, 20, 40, 60, 80]);
		expect(niceTicks(0, 2.28, 5).step).toBe(0.5);
	});

	it('widens a flat range so the axis has height', () => {
		const ticks = niceTicks(1.35, 1.35);
		expect(ticks.min).toBeLessThan(1.35);
		expect(ticks.max).toBeGreaterThan(1.35);
		expect(niceTicks(0, 0).values.length).toBeGreaterThan(1);
	});

	it('puts an exact zero among ticks that cross it', () => {
		expect(niceTicks(-0.3, 0.3, 6).values).toContain(0);
		expect(Object.is(niceTicks(-0.3, 0.3, 6).values.find((v) => v === 0), -0)).toBe(false);
	});
});

describe('stepPlaces', () => {
	it('gives a tick label the decimals its step needs', () => {
		expect([stepPlaces(1000), stepPlaces(1), stepPlaces(0.5), stepPlaces(0.25), stepPlaces(0.02)]).toEqual([0, 0, 1, 1, 2]);
	});
});

describe('tickLabel', () => {
	it('groups thousands and writes a true minus sign', () => {
		expect(tickLabel(-20000, 10000)).toBe('−20,000');
		expect(tickLabel(1.5, 0.5)).toBe('1.5');
		expect(tickLabel(1e-17, 0.5)).toBe('0.0');
	});
});

describe('linearScale', () => {
	it('maps the domain onto the range, upside down for a y axis', () => {
		const y = linearScale([0, 100], [500, 100]);
		expect([y(0), y(50), y(100)]).toEqual([500, 300, 100]);
	});
});

describe('labelEvery', () => {
	it('thins labels that would overlap', () => {
		expect(labelEvery(30, 20)).toBe(1);
		expect(labelEvery(8, 20)).toBe(4);
	});
});
