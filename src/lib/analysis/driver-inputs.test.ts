import { describe, expect, it } from 'vitest';
import { describeInput, inputProblem, toEngineValue, toFormValue } from './driver-inputs';

describe('toFormValue and toEngineValue', () => {
	it('shows multipliers and fractions in per cent and sends them back unchanged', () => {
		// 0.96 is what 0.93 + 0.03 gives in float64 (0.9600000000000001); the form shows 96.
		expect(toFormValue('fraction', 0.93 + 0.03)).toBe(96);
		expect(toFormValue('x base', 0.8)).toBe(80);
		expect(toEngineValue('x base', 120)).toBe(1.2);
		expect(toEngineValue('fraction/yr', 6.5)).toBe(0.065);
	});
	it('leaves years and device counts as they are', () => {
		expect(toFormValue('years', 25)).toBe(25);
		expect(toEngineValue('devices', 12)).toBe(12);
	});
});

describe('describeInput', () => {
	it('writes the value with its unit', () => {
		expect(describeInput('x base', 0.9)).toBe('90 % of base');
		expect(describeInput('fraction/yr', 0.007)).toBe('0.7 %/yr');
		expect(describeInput('years', 30)).toBe('30 years');
	});
});

describe('inputProblem', () => {
	it('refuses empty, non-numeric and out-of-range values', () => {
		expect(inputProblem('x base', '')).toBe('Enter a value.');
		expect(inputProblem('x base', 'abc')).toBe('Enter a number.');
		expect(inputProblem('x base', '0')).toMatch(/more than 0/);
		expect(inputProblem('fraction', '101')).toMatch(/0 to 100/);
		expect(inputProblem('years', '20.5')).toMatch(/whole years/);
		expect(inputProblem('devices', '0')).toMatch(/at least 1/);
	});
	it('accepts a sensible range', () => {
		expect(inputProblem('x base', '80')).toBeNull();
		expect(inputProblem('fraction/yr', '-1')).toBeNull();
	});
});
