import { describe, expect, it } from 'vitest';
import { distributionSchema, runInputSchema } from './probabilistic';

/** The issues of a refused parse as "path: message" lines. */
function refusals(schema: { safeParse: (x: unknown) => { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } } }, input: unknown): string[] {
	const result = schema.safeParse(input);
	if (result.success) throw new Error('expected a refusal');
	return result.error!.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
}

const triangular = { shape: 'triangular', min: 0.8, mode: 1, max: 1.2 };
const drawn = (...drivers: string[]) => drivers.map((driver) => ({ driver, distribution: triangular }));

describe('distributionSchema', () => {
	it('accepts each shape', () => {
		for (const d of [
			{ shape: 'normal', mean: 1, sd: 0.1 },
			{ shape: 'truncated-normal', mean: 1, sd: 0.2, min: 0.7, max: 1.5 },
			{ shape: 'triangular', min: 0.8, mode: 0.8, max: 1.2 },
			{ shape: 'uniform', min: -0.01, max: 0.01 },
			{ shape: 'lognormal', mean: 1, sd: 0.3 }
		]) {
			expect(distributionSchema.parse(d)).toEqual(d);
		}
	});

	it('refuses bad parameters with the field named', () => {
		expect(refusals(distributionSchema, { shape: 'normal', mean: 1, sd: 0 })).toEqual(['sd: sd must be greater than 0']);
		expect(refusals(distributionSchema, { shape: 'normal', mean: 1, sd: -1 })).toEqual(['sd: sd must be greater than 0']);
		expect(refusals(distributionSchema, { shape: 'uniform', min: 2, max: 2 })).toEqual(['max: max must be greater than min']);
		expect(refusals(distributionSchema, { shape: 'triangular', min: 0, mode: 3, max: 2 })).toEqual(['mode: mode must lie between min and max']);
		expect(refusals(distributionSchema, { shape: 'triangular', min: 1, mode: 1, max: 0 })).toContain('max: max must be greater than min');
		expect(refusals(distributionSchema, { shape: 'truncated-normal', mean: 2, sd: 1, min: 0, max: 2 })).toEqual([
			'mean: mean must lie strictly between min and max'
		]);
		expect(refusals(distributionSchema, { shape: 'lognormal', mean: 0, sd: 1 })).toEqual(['mean: mean must be greater than 0']);
		expect(refusals(distributionSchema, { shape: 'normal', mean: Number.POSITIVE_INFINITY, sd: 1 })).toEqual(['mean: mean must be a finite number']);
		expect(refusals(distributionSchema, { shape: 'normal', mean: 1, sd: 1, extra: 1 })[0]).toMatch(/extra/);
		expect(refusals(distributionSchema, { shape: 'beta', a: 1 })[0]).toMatch(/^shape: /);
	});
});

describe('runInputSchema', () => {
	it('fills the defaults', () => {
		expect(runInputSchema.parse({ drivers: drawn('capex'), hurdleRate: 0.1 })).toEqual({
			drivers: drawn('capex'),
			energyUncertainty: true,
			correlations: [],
			seed: 1,
			draws: 10_000,
			hurdleRate: 0.1
		});
	});

	it('refuses a driver drawn twice and an unknown driver', () => {
		expect(refusals(runInputSchema, { drivers: drawn('capex', 'opex', 'capex'), hurdleRate: 0.1 })).toEqual(['drivers.2.driver: driver: capex is drawn twice']);
		expect(refusals(runInputSchema, { drivers: drawn('windSpeed'), hurdleRate: 0.1 })[0]).toMatch(/^drivers\.0\.driver: /);
	});

	it('refuses a run with nothing to draw', () => {
		expect(refusals(runInputSchema, { drivers: [], energyUncertainty: false, hurdleRate: 0.1 })).toEqual([
			'drivers: drivers: draw at least one driver, or the energy uncertainty'
		]);
		expect(runInputSchema.safeParse({ drivers: [], hurdleRate: 0.1 }).success).toBe(true);
	});

	it('refuses seeds, draw counts and hurdle rates out of range, naming the field', () => {
		const base = { drivers: drawn('capex'), hurdleRate: 0.1 };
		expect(refusals(runInputSchema, { ...base, seed: -1 })).toEqual(['seed: seed must be at least 0']);
		expect(refusals(runInputSchema, { ...base, seed: 2 ** 31 })).toEqual(['seed: seed must be at most 2147483647']);
		expect(refusals(runInputSchema, { ...base, seed: 1.5 })).toEqual(['seed: seed must be a whole number']);
		expect(refusals(runInputSchema, { ...base, draws: 99 })).toEqual(['draws: draws must be at least 100']);
		expect(refusals(runInputSchema, { ...base, draws: 50_001 })).toEqual(['draws: draws must be at most 50000']);
		expect(refusals(runInputSchema, { ...base, hurdleRate: 10 })).toEqual(['hurdleRate: hurdleRate must be a fraction per year above -1 and at most 1']);
		expect(refusals(runInputSchema, { drivers: drawn('capex') })[0]).toMatch(/^hurdleRate: /);
	});

	it('refuses more than 16 drivers', () => {
		const many = Array.from({ length: 17 }, () => ({ driver: 'capex', distribution: triangular }));
		expect(refusals(runInputSchema, { drivers: many, hurdleRate: 0.1 })).toEqual(['drivers: drivers: at most 16']);
	});

	it('refuses correlations with a driver not drawn, with itself, out of range or given twice', () => {
		const base = { drivers: drawn('capex', 'opex'), hurdleRate: 0.1 };
		expect(refusals(runInputSchema, { ...base, correlations: [{ a: 'capex', b: 'tariff', rankCorrelation: 0.5 }] })).toEqual([
			'correlations.0.b: b: tariff is not among the drawn drivers'
		]);
		expect(refusals(runInputSchema, { ...base, correlations: [{ a: 'capex', b: 'capex', rankCorrelation: 0.5 }] })).toEqual([
			'correlations.0.b: b must be another driver than a (capex)'
		]);
		expect(refusals(runInputSchema, { ...base, correlations: [{ a: 'capex', b: 'opex', rankCorrelation: 1 }] })).toEqual([
			'correlations.0.rankCorrelation: rankCorrelation must lie strictly between -1 and 1'
		]);
		expect(
			refusals(runInputSchema, {
				...base,
				correlations: [
					{ a: 'capex', b: 'opex', rankCorrelation: 0.5 },
					{ a: 'opex', b: 'capex', rankCorrelation: 0.4 }
				]
			})
		).toEqual(['correlations.1: correlations: the pair opex-capex is given twice']);
	});

	it('refuses correlations that cannot hold together, naming the pairs', () => {
		const input = {
			drivers: drawn('capex', 'opex', 'tariff', 'resource'),
			hurdleRate: 0.1,
			correlations: [
				{ a: 'capex', b: 'opex', rankCorrelation: 0.9 },
				{ a: 'capex', b: 'tariff', rankCorrelation: 0.9 },
				{ a: 'opex', b: 'tariff', rankCorrelation: -0.9 }
			]
		};
		const [message, ...rest] = refusals(runInputSchema, input);
		expect(rest).toEqual([]);
		expect(message).toMatch(/^correlations: /);
		expect(message).toContain('capex-opex 0.9, capex-tariff 0.9, opex-tariff -0.9');
		expect(message).toContain('not positive definite');
		// The same three pairs at 0.5, 0.5, 0 are consistent (determinant 1 - 2 x 0.5176^2 > 0, by hand).
		const consistent = input.correlations.map((c, i) => ({ ...c, rankCorrelation: i < 2 ? 0.5 : 0 }));
		expect(runInputSchema.safeParse({ ...input, correlations: consistent }).success).toBe(true);
	});
});
