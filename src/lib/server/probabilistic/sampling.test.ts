import { describe, expect, it } from 'vitest';
import { runInputSchema, type RunInput, type RunInputDraft } from '../../schemas/probabilistic';
import { normalQuantile } from '../engine/energy/uncertainty';
import { createSampler, drawVector, splitMix64, uniformAt, type DrawVector } from './sampling';
import { quantile, spearman } from './statistics';

const run = (draft: Omit<RunInputDraft, 'hurdleRate'>): RunInput => runInputSchema.parse({ hurdleRate: 0.08, ...draft });

function draws(input: RunInput, n: number, components: { sigma: number; kind?: 'long-term' | 'inter-annual' }[] = [], years = 20): DrawVector[] {
	const sample = createSampler(input, components, years);
	return Array.from({ length: n }, (_, i) => sample(i));
}

const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
const sd = (xs: number[]) => {
	const m = mean(xs);
	return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
};
const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b);
const valuesOf = (vectors: DrawVector[], driver: keyof DrawVector['drivers']) => vectors.map((v) => v.drivers[driver]!);

const N = 20_000;

describe('splitMix64', () => {
	it('gives the reference outputs', () => {
		// Source: Rosetta Code, "Pseudo-random numbers/Splitmix64": the first five outputs for seed 1234567.
		expect([1n, 2n, 3n, 4n, 5n].map((n) => splitMix64(1234567n, n))).toEqual([
			6457827717110365317n,
			3203168211198807973n,
			9817491932198370423n,
			4593380528125082431n,
			16408922859458223821n
		]);
	});

	it('uniformAt is the top 52 bits of the stream position, strictly inside (0, 1)', () => {
		// Draw 0, slot 0 is the first output: 6457827717110365317 / 2^64 = 0.35007... (by hand: the top 52 bits, centred).
		expect(uniformAt(1234567, 0, 0)).toBeCloseTo(Number(6457827717110365317n >> 12n) / 2 ** 52, 15);
		// Draw 1, slot 0 is position 129.
		expect(uniformAt(1234567, 1, 0)).toBe((Number(splitMix64(1234567n, 129n) >> 12n) + 0.5) / 2 ** 52);
	});
});

describe('drawVector', () => {
	const input = run({
		drivers: [
			{ driver: 'capex', distribution: { shape: 'triangular', min: 0.8, mode: 1, max: 1.3 } },
			{ driver: 'tariff', distribution: { shape: 'normal', mean: 1, sd: 0.1 } },
			{ driver: 'availability', distribution: { shape: 'truncated-normal', mean: 0.93, sd: 0.03, min: 0.85, max: 0.97 } }
		],
		correlations: [{ a: 'capex', b: 'tariff', rankCorrelation: 0.4 }],
		seed: 42
	});
	const energy = [
		{ sigma: 0.08, kind: 'long-term' as const },
		{ sigma: 0.1, kind: 'inter-annual' as const }
	];

	it('gives the same draw for the same seed and index, another for another seed', () => {
		expect(drawVector(input, 17, energy, 20)).toEqual(drawVector(input, 17, energy, 20));
		expect(drawVector({ ...input, seed: 43 }, 17, energy, 20)).not.toEqual(drawVector(input, 17, energy, 20));
		expect(drawVector(input, 18, energy, 20)).not.toEqual(drawVector(input, 17, energy, 20));
	});

	it('does not depend on how the run is chunked', () => {
		const whole = draws(input, 1000, energy);
		const pieces: DrawVector[] = [];
		for (const [from, to] of [
			[0, 1],
			[1, 250],
			[250, 251],
			[251, 777],
			[777, 1000]
		]) {
			// A fresh sampler per chunk, as a worker would make.
			const sample = createSampler(input, energy, 20);
			for (let i = from; i < to; i++) pieces.push(sample(i));
		}
		expect(pieces).toEqual(whole);
		// Backwards too.
		const sample = createSampler(input, energy, 20);
		expect(Array.from({ length: 1000 }, (_, k) => sample(999 - k)).reverse()).toEqual(whole);
	});

	it('does not depend on the order the drivers are listed in', () => {
		const reordered = { ...input, drivers: [...input.drivers].reverse() };
		expect(drawVector(reordered, 5, energy, 20)).toEqual(drawVector(input, 5, energy, 20));
	});

	it("leaves an independent driver's draws alone when another driver is added", () => {
		const alone = run({ drivers: [input.drivers[0]], seed: 42 });
		const withOpex = run({ drivers: [input.drivers[0], { driver: 'opex', distribution: { shape: 'uniform', min: 0.9, max: 1.1 } }], seed: 42 });
		expect(drawVector(withOpex, 9, [], 20).drivers.capex).toBe(drawVector(alone, 9, [], 20).drivers.capex);
	});

	it('draws only the drivers of the run, and energy 1 without energy uncertainty', () => {
		const v = drawVector({ ...input, energyUncertainty: false }, 3, energy, 20);
		expect(Object.keys(v.drivers).sort()).toEqual(['availability', 'capex', 'tariff']);
		expect(v.energyFactor).toBe(1);
		expect(drawVector(input, 3, [], 20).energyFactor).toBe(1);
	});

	it('refuses a bad index or life', () => {
		expect(() => drawVector(input, -1, energy, 20)).toThrow(RangeError);
		expect(() => drawVector(input, 1.5, energy, 20)).toThrow(RangeError);
		expect(() => drawVector(input, 0, energy, 0)).toThrow(RangeError);
	});
});

describe('drawn distributions, within sampling error (n = 20,000)', () => {
	it('normal: mean, P10 and P90 at mean -+ 1.2816 sd', () => {
		// Source: Abramowitz and Stegun Table 26.5 (from memory): z(0.90) = 1.2816. Standard errors: mean 1/sqrt(n) = 0.0071 sd;
		// a 10 % quantile sqrt(0.09/n)/phi(1.2816) = 0.012 sd (Kendall and Stuart); tolerances are about 4 of them.
		const xs = valuesOf(draws(run({ drivers: [{ driver: 'tariff', distribution: { shape: 'normal', mean: 50, sd: 5 } }], seed: 7 }), N), 'tariff');
		const s = sorted(xs);
		expect(Math.abs(mean(xs) - 50)).toBeLessThan(0.15);
		expect(Math.abs(sd(xs) - 5)).toBeLessThan(0.1);
		expect(Math.abs(quantile(s, 0.1) - (50 - 1.2816 * 5))).toBeLessThan(0.25);
		expect(Math.abs(quantile(s, 0.9) - (50 + 1.2816 * 5))).toBeLessThan(0.25);
	});

	it('uniform: empirical quantiles on the straight line', () => {
		// Standard error of a uniform p-quantile: (max - min) sqrt(p(1-p)/n) <= 0.0035 (max - min).
		const s = sorted(valuesOf(draws(run({ drivers: [{ driver: 'inflation', distribution: { shape: 'uniform', min: 0.01, max: 0.03 } }], seed: 11 }), N), 'inflation'));
		for (const p of [0.05, 0.25, 0.5, 0.75, 0.95]) expect(Math.abs(quantile(s, p) - (0.01 + 0.02 * p))).toBeLessThan(0.0002);
		expect(s[0]).toBeGreaterThanOrEqual(0.01);
		expect(s[s.length - 1]).toBeLessThanOrEqual(0.03);
	});

	it('triangular: mean (min + mode + max) / 3 and sd sqrt((a^2+b^2+c^2-ab-ac-bc)/18)', () => {
		// Source: Kotz and van Dorp, Beyond Beta (2004): mean 1.0667, sd sqrt((0.64 + 0.81 + 2.25 - 0.72 - 1.2 - 1.35)/18) = 0.1546 (by hand).
		const xs = valuesOf(draws(run({ drivers: [{ driver: 'capex', distribution: { shape: 'triangular', min: 0.8, mode: 0.9, max: 1.5 } }], seed: 3 }), N), 'capex');
		expect(Math.abs(mean(xs) - 3.2 / 3)).toBeLessThan(0.005);
		expect(Math.abs(sd(xs) - Math.sqrt(0.43 / 18))).toBeLessThan(0.004);
		expect(Math.min(...xs)).toBeGreaterThanOrEqual(0.8);
		expect(Math.max(...xs)).toBeLessThanOrEqual(1.5);
	});

	it('lognormal: the mean and sd given are recovered, and every draw is positive', () => {
		// Mean 100, sd 30: standard error of the mean 30/sqrt(n) = 0.21; of the sd about 0.3 (heavier tail than normal).
		const xs = valuesOf(draws(run({ drivers: [{ driver: 'opex', distribution: { shape: 'lognormal', mean: 100, sd: 30 } }], seed: 5 }), N), 'opex');
		expect(Math.abs(mean(xs) - 100)).toBeLessThan(1);
		expect(Math.abs(sd(xs) - 30)).toBeLessThan(1.2);
		expect(Math.min(...xs)).toBeGreaterThan(0);
	});

	it('truncated normal: stays inside its bounds and has the truncated mean', () => {
		// Mean of N(0,1) cut to [a, b]: (phi(a) - phi(b)) / (Phi(b) - Phi(a)); a = -0.5, b = 3:
		// (0.352065 - 0.004432) / (0.998650 - 0.308538) = 0.50374 (Johnson, Kotz and Balakrishnan ch. 13; by hand).
		const xs = valuesOf(
			draws(run({ drivers: [{ driver: 'availability', distribution: { shape: 'truncated-normal', mean: 0.9, sd: 0.02, min: 0.89, max: 0.96 } }], seed: 9 }), N),
			'availability'
		);
		expect(Math.min(...xs)).toBeGreaterThanOrEqual(0.89);
		expect(Math.max(...xs)).toBeLessThanOrEqual(0.96);
		expect(Math.abs(mean(xs) - (0.9 + 0.02 * 0.50374))).toBeLessThan(0.0005);
	});

	it('applies a rank correlation: target 0.7 gives an empirical Spearman within 0.03', () => {
		const input = run({
			drivers: [
				{ driver: 'capex', distribution: { shape: 'triangular', min: 0.8, mode: 1, max: 1.4 } },
				{ driver: 'opex', distribution: { shape: 'lognormal', mean: 1, sd: 0.4 } },
				{ driver: 'tariff', distribution: { shape: 'uniform', min: 0.9, max: 1.1 } }
			],
			correlations: [
				{ a: 'opex', b: 'capex', rankCorrelation: 0.7 },
				{ a: 'tariff', b: 'capex', rankCorrelation: -0.3 }
			],
			seed: 2024
		});
		const vectors = draws(input, N);
		const capex = valuesOf(vectors, 'capex');
		expect(Math.abs(spearman(capex, valuesOf(vectors, 'opex'))! - 0.7)).toBeLessThan(0.03);
		expect(Math.abs(spearman(capex, valuesOf(vectors, 'tariff'))! + 0.3)).toBeLessThan(0.03);
		// opex-tariff is not given: 0 in the copula's matrix, so independent.
		expect(Math.abs(spearman(valuesOf(vectors, 'opex'), valuesOf(vectors, 'tariff'))!)).toBeLessThan(0.03);
		// The marginals survive the copula: the triangular mean is still (0.8 + 1 + 1.4) / 3.
		expect(Math.abs(mean(capex) - 3.2 / 3)).toBeLessThan(0.004);
	});

	it('correlates through the Pearson equivalent of the rank correlation: y = L z, x = F^-1(Phi(y))', () => {
		// Two standard-normal drivers with rank correlation 0.5: the copula's rho is 2 sin(pi/12) (Pearson 1907), so
		// capex = z1 and opex = rho z1 + sqrt(1 - rho^2) z2, with z_k the normal scores of the draw's uniforms (slots 0 and 1).
		const input = run({
			drivers: [
				{ driver: 'capex', distribution: { shape: 'normal', mean: 0, sd: 1 } },
				{ driver: 'opex', distribution: { shape: 'normal', mean: 0, sd: 1 } }
			],
			correlations: [{ a: 'capex', b: 'opex', rankCorrelation: 0.5 }],
			seed: 31
		});
		const rho = 2 * Math.sin(Math.PI / 12);
		for (const i of [0, 1, 500]) {
			const z1 = normalQuantile(uniformAt(31, i, 0));
			const z2 = normalQuantile(uniformAt(31, i, 1));
			const v = drawVector(input, i, [], 20);
			expect(v.drivers.capex).toBeCloseTo(z1, 9);
			expect(v.drivers.opex).toBeCloseTo(rho * z1 + Math.sqrt(1 - rho * rho) * z2, 9);
		}
	});

	it('uncorrelated drivers come out independent', () => {
		const vectors = draws(
			run({
				drivers: [
					{ driver: 'capex', distribution: { shape: 'uniform', min: 0, max: 1 } },
					{ driver: 'opex', distribution: { shape: 'uniform', min: 0, max: 1 } }
				],
				seed: 99
			}),
			N
		);
		// Standard error of Spearman under independence 1/sqrt(n - 1) = 0.0071.
		expect(Math.abs(spearman(valuesOf(vectors, 'capex'), valuesOf(vectors, 'opex'))!)).toBeLessThan(0.03);
	});

	it('energy: sd sqrt(sigma_LT^2 + sigma_IAV^2 / N), mean 1, independent of the drivers', () => {
		// sigma_LT 0.08, sigma_IAV 0.1 over 25 years: sqrt(0.0064 + 0.0004) = 0.08246 (uncertainty.ts's horizon sigma).
		const input = run({ drivers: [{ driver: 'capex', distribution: { shape: 'uniform', min: 0.8, max: 1.2 } }], seed: 17 });
		const vectors = draws(
			input,
			N,
			[
				{ sigma: 0.06, kind: 'long-term' },
				{ sigma: Math.sqrt(0.0064 - 0.0036) }, // a component without a kind counts as long-term
				{ sigma: 0.1, kind: 'inter-annual' }
			],
			25
		);
		const factors = vectors.map((v) => v.energyFactor);
		expect(Math.abs(mean(factors) - 1)).toBeLessThan(0.003);
		expect(Math.abs(sd(factors) - Math.sqrt(0.0068))).toBeLessThan(0.0025);
		expect(Math.abs(spearman(factors, valuesOf(vectors, 'capex'))!)).toBeLessThan(0.03);
	});

	it('energy factor is floored at 0', () => {
		const vectors = draws(run({ drivers: [], seed: 1 }), 2000, [{ sigma: 2 }]);
		const factors = vectors.map((v) => v.energyFactor);
		expect(Math.min(...factors)).toBe(0);
		expect(factors.filter((f) => f === 0).length).toBeGreaterThan(0.2 * factors.length); // P(N(0,2) < -1) = 0.31
	});
});
