/**
 * Reproducible draws for a probabilistic run. Draw i is computed on its own
 * from (seed, i): a run split into chunks over several workers gives the same
 * draws whatever the chunking, and a draw can be recomputed to explain it.
 *
 * Layout of the random stream: draw i owns positions i*128 + 1 ... i*128 + 128
 * of the SplitMix64 sequence of the seed. Slot k of a draw is position
 * i*128 + k + 1: slots 0..31 belong to the drivers by their place in
 * PROBABILISTIC_DRIVER_IDS (so adding a driver to a run leaves the others'
 * independent draws as they were), slots 32..127 to the energy uncertainty
 * components in the order given.
 */
import { PROBABILISTIC_DRIVER_IDS, type ProbabilisticDriverId, type RunInput } from '../../schemas/probabilistic';
import { SCENARIO_LIMITS } from '../../schemas/scenario-limits';
import { correlatedIds, correlationFactor } from '../../probabilistic/correlation';
import { normalQuantile } from '../engine/energy/uncertainty';
import { inverseCdf, standardNormalCdf } from './distributions';

const SLOTS_PER_DRAW = 128;
const DRIVER_SLOTS = 32;
const ENERGY_SLOTS = SLOTS_PER_DRAW - DRIVER_SLOTS;
// The layout must leave room for every driver, and for the scenario's components plus an assessed energy's own (at most 4).
if (PROBABILISTIC_DRIVER_IDS.length > DRIVER_SLOTS || SCENARIO_LIMITS.uncertaintyComponents + 4 > ENERGY_SLOTS)
	throw new Error('probabilistic sampling: the stream layout has too few slots');

const MASK_64 = (1n << 64n) - 1n;
const GOLDEN_GAMMA = 0x9e3779b97f4a7c15n;

/**
 * The n-th output (n >= 1) of SplitMix64 seeded with `seed`:
 *
 *     z = seed + n * 0x9e3779b97f4a7c15             (mod 2^64)
 *     z = (z xor (z >> 30)) * 0xbf58476d1ce4e5b9    (mod 2^64)
 *     z = (z xor (z >> 27)) * 0x94d049bb133111eb    (mod 2^64)
 *     out = z xor (z >> 31)
 *
 * The state is a counter, so any output is computed without the ones before
 * it. Sources: G. L. Steele, D. Lea and C. H. Flood (2014), "Fast splittable
 * pseudorandom number generators", OOPSLA '14; S. Vigna's reference C code
 * splitmix64.c (prng.di.unimi.it). Example (Rosetta Code, "Pseudo-random
 * numbers/Splitmix64"): seed 1234567 gives 6457827717110365317 first.
 */
export function splitMix64(seed: bigint, n: bigint): bigint {
	let z = (seed + n * GOLDEN_GAMMA) & MASK_64;
	z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK_64;
	z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK_64;
	return z ^ (z >> 31n);
}

/**
 * Uniform in (0, 1) for slot `slot` of draw `drawIndex`: the top 52 bits of the
 * output, centred in their interval, so u lies in [2^-53, 1 - 2^-53] and is
 * never 0 or 1 (whose normal quantiles are infinite).
 */
export function uniformAt(seed: number, drawIndex: number, slot: number): number {
	const bits = splitMix64(BigInt(seed), BigInt(drawIndex * SLOTS_PER_DRAW + slot + 1)) >> 12n;
	return (Number(bits) + 0.5) * 2 ** -52;
}

export type EnergyComponent = { sigma: number; kind?: 'long-term' | 'inter-annual' };

/** One draw: the drawn value of each driver in the run (in its DRIVERS unit), and the energy as a multiple of the estimate. */
export type DrawVector = { drivers: Partial<Record<ProbabilisticDriverId, number>>; energyFactor: number };

export type Sampler = (drawIndex: number) => DrawVector;

const driverSlot = (id: ProbabilisticDriverId) => PROBABILISTIC_DRIVER_IDS.indexOf(id);

/**
 * A sampler for a validated run: draw i of it is drawVector(input, i, ...),
 * with the correlation factor worked out once.
 *
 * Drivers, by a Gaussian copula: z_k = Phi^-1(u_k) independent standard
 * normals for the correlated drivers, y = L z with L the Cholesky factor of
 * the copula's correlation matrix (rank correlations turned into Pearson by
 * pearsonFromSpearman), then x_k = F_k^-1(Phi(y_k)); a driver in no
 * correlation is x = F^-1(u) straight away. Source: Gaussian copula sampling,
 * R. B. Nelsen, An Introduction to Copulas, 2nd ed. (2006), and R. L. Iman
 * and W. J. Conover (1982), "A distribution-free approach to inducing rank
 * correlation among input variables", Commun. Statist. B11(3).
 *
 * Energy, independent of the drivers: each component draws e_j ~ N(0, s_j),
 * where s_j = sigma_j for a long-term component and sigma_j / sqrt(N) for an
 * inter-annual one (N = operatingYears: the life-average of independent years),
 * so sum e_j ~ N(0, sigma_N), sigma_N = sqrt(sigma_LT^2 + sigma_IAV^2 / N) as in
 * ../engine/energy/uncertainty.ts; energyFactor = max(0, 1 + sum e_j). Without
 * energyUncertainty, or with no components, the factor is 1.
 *
 * `energyComponents` are every component of the energy estimate: the
 * scenario's uncertainty.components and, for an assessed-energy resource,
 * the assessment's own sigma. `operatingYears` is the life the inter-annual
 * part averages over (the scenario's, even when `life` is a drawn driver, so
 * the energy draw does not depend on the life draw).
 */
export function createSampler(input: RunInput, energyComponents: readonly EnergyComponent[], operatingYears: number): Sampler {
	if (!(Number.isInteger(operatingYears) && operatingYears >= 1)) throw new RangeError(`operatingYears must be a whole number of at least 1, got ${operatingYears}`);
	if (energyComponents.length > ENERGY_SLOTS) throw new RangeError(`at most ${ENERGY_SLOTS} energy uncertainty components can be drawn`);
	const drivers = [...input.drivers].sort((a, b) => driverSlot(a.driver) - driverSlot(b.driver));
	const correlated = correlatedIds(PROBABILISTIC_DRIVER_IDS, input.correlations);
	const factor = correlationFactor(correlated, input.correlations);
	if (!factor.ok) throw new RangeError('the rank correlations are not consistent (not positive definite): validate the run with runInputSchema');
	const distributionOf = new Map(drivers.map((d) => [d.driver, d.distribution]));
	const independent = drivers.filter((d) => !correlated.includes(d.driver));
	const energySds = input.energyUncertainty
		? energyComponents.map((c) => ((c.kind ?? 'long-term') === 'inter-annual' ? c.sigma / Math.sqrt(operatingYears) : c.sigma))
		: [];

	return (drawIndex) => {
		if (!(Number.isInteger(drawIndex) && drawIndex >= 0)) throw new RangeError(`drawIndex must be a whole number of at least 0, got ${drawIndex}`);
		const values: DrawVector['drivers'] = {};
		for (const d of independent) values[d.driver] = inverseCdf(d.distribution, uniformAt(input.seed, drawIndex, driverSlot(d.driver)));
		if (correlated.length > 0) {
			const z = correlated.map((id) => normalQuantile(uniformAt(input.seed, drawIndex, driverSlot(id))));
			correlated.forEach((id, row) => {
				let y = 0;
				for (let k = 0; k <= row; k++) y += factor.lower[row][k] * z[k];
				values[id] = inverseCdf(distributionOf.get(id)!, standardNormalCdf(y));
			});
		}
		let energyDeviation = 0;
		energySds.forEach((sd, j) => {
			energyDeviation += sd * normalQuantile(uniformAt(input.seed, drawIndex, DRIVER_SLOTS + j));
		});
		return { drivers: values, energyFactor: Math.max(0, 1 + energyDeviation) };
	};
}

/** Draw `drawIndex` of a run on its own; createSampler once when drawing many. */
export function drawVector(input: RunInput, drawIndex: number, energyComponents: readonly EnergyComponent[], operatingYears: number): DrawVector {
	return createSampler(input, energyComponents, operatingYears)(drawIndex);
}
