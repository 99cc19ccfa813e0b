import { describe, expect, it } from 'vitest';
import { distributionFromForm, paramProblem, paramsToForm, reshape, rowsFromInput } from './run-form';

describe('run form', () => {
	it('shows multiples and fractions in per cent and reads them back', () => {
		const d = { shape: 'triangular' as const, min: 0.8, mode: 1, max: 1.25 };
		const params = paramsToForm(d, 'x base');
		expect(params).toEqual({ min: '80', mode: '100', max: '125' });
		expect(distributionFromForm({ driver: 'capex', on: true, shape: 'triangular', params }, 'x base')).toEqual(d);
		// Years stay years.
		expect(paramsToForm({ shape: 'uniform', min: 20, max: 30 }, 'years')).toEqual({ min: '20', max: '30' });
	});

	it('carries a distribution over to another shape around the same centre', () => {
		const tri = { shape: 'triangular' as const, min: 0.8, mode: 1, max: 1.2 };
		expect(reshape(tri, 'normal')).toEqual({ shape: 'normal', mean: 1, sd: 0.1 });
		expect(reshape(tri, 'uniform')).toEqual({ shape: 'uniform', min: 0.8, max: 1.2 });
		expect(reshape({ shape: 'normal', mean: 1, sd: 0.1 }, 'truncated-normal')).toEqual({ shape: 'truncated-normal', mean: 1, sd: 0.1, min: 0.8, max: 1.2 });
	});

	it('names what is wrong with a typed parameter', () => {
		expect(paramProblem('sd', '0')).toBe('Enter more than 0.');
		expect(paramProblem('mode', '')).toBe('Enter the most likely.');
		expect(paramProblem('min', 'abc')).toBe('Enter a number.');
		expect(paramProblem('max', '12.5')).toBeNull();
	});

	it('offers every driver, switched on where the input draws it', () => {
		const rows = rowsFromInput(
			[
				{ driver: 'capex', unit: 'x base', low: 0.8, high: 1.2, baseInput: 1 },
				{ driver: 'life', unit: 'years', low: 20, high: 30, baseInput: 25 }
			],
			{ drivers: [{ driver: 'capex', distribution: { shape: 'normal', mean: 1, sd: 0.05 } }] }
		);
		expect(rows[0]).toEqual({ driver: 'capex', on: true, shape: 'normal', params: { mean: '100', sd: '5' } });
		expect(rows[1]).toEqual({ driver: 'life', on: false, shape: 'triangular', params: { min: '20', mode: '25', max: '30' } });
	});
});
