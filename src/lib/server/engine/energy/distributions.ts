/**
 * Resource distributions turned into occurrence bins.
 *
 * Energy is always summed over the distribution (sum of p_i P(v_i)), never taken
 * from the cube of the mean speed: E[v^3] is larger than E[v]^3 by the energy
 * pattern factor (6/pi for a Rayleigh distribution).
 */
import { dec, Decimal, ZERO, type DecimalInput } from '../decimal';

/** One flow-speed bin: its centre speed (m/s) and the share of time spent in it. */
export type FlowBin = { speedMPerS: Decimal; probability: Decimal };

/** One sea state: significant wave height (m), energy period Te (s), share of time. */
export type SeaStateBin = { hsM: Decimal; teS: Decimal; probability: Decimal };

/** Tail probability left out beyond the last generated bin (it is folded into the last bin). */
const TAIL_PROBABILITY = 1e-9;
const MAX_BINS = 10000;

/**
 * Occurrences (hours or probabilities) normalised to probabilities summing to 1.
 * Returns null when the total is zero, so the caller can say so in words.
 */
export function normaliseOccurrences(occurrences: readonly DecimalInput[]): Decimal[] | null {
	const values = occurrences.map(dec);
	let total = ZERO;
	for (const v of values) total = total.plus(v);
	if (total.isZero()) return null;
	return values.map((v) => v.div(total));
}

/**
 * Weibull distribution of speed cut into bins of width w, bin j covering
 * [j w, (j + 1) w) and represented by its centre (j + 1/2) w.
 *
 *     F(v) = 1 - exp(-(v / c)^k),   p_j = F((j + 1) w) - F(j w)
 *
 * Bins run until the tail beyond them is below 1e-9; that tail goes into the
 * last bin so the probabilities sum to exactly 1. Units: c and w in m/s, k
 * dimensionless. Source: the Weibull distribution (any statistics text).
 *
 * The bin probabilities are statistical weights computed in double precision
 * (relative error ~1e-15) because a decimal power with a fractional exponent
 * per bin would cost milliseconds; they are carried as decimals from here on.
 */
export function weibullBins(scaleMPerS: number, shape: number, binWidthMPerS: number): FlowBin[] {
	const survival = (v: number) => Math.exp(-Math.pow(v / scaleMPerS, shape));
	const maxSpeed = scaleMPerS * Math.pow(-Math.log(TAIL_PROBABILITY), 1 / shape);
	const count = Math.min(MAX_BINS, Math.max(1, Math.ceil(maxSpeed / binWidthMPerS)));
	const width = dec(binWidthMPerS);
	const bins: FlowBin[] = [];
	let lowerSurvival = 1;
	for (let j = 0; j < count; j++) {
		const upperSurvival = j === count - 1 ? 0 : survival((j + 1) * binWidthMPerS);
		bins.push({
			speedMPerS: width.times(j + 0.5),
			probability: new Decimal(lowerSurvival - upperSurvival)
		});
		lowerSurvival = upperSurvival;
	}
	return bins;
}

/**
 * Rayleigh distribution from its mean speed: a Weibull with k = 2 and
 * c = 2 vmean / sqrt(pi) (since the Weibull mean is c G(1 + 1/k)). Source: the
 * Rayleigh distribution, a textbook special case of the Weibull.
 */
export function rayleighBins(meanSpeedMPerS: number, binWidthMPerS: number): FlowBin[] {
	return weibullBins((2 * meanSpeedMPerS) / Math.sqrt(Math.PI), 2, binWidthMPerS);
}

/** Te = (Te/Tp) Tp. 0.9 is the usual rule; 0.8588 Pierson-Moskowitz; 0.9037 JONSWAP gamma 3.3 (23rd ITTC). */
export function energyPeriodFromPeakPeriod(peakPeriodS: DecimalInput, teOverTp: DecimalInput): Decimal {
	return dec(peakPeriodS).times(dec(teOverTp));
}

/**
 * Energy pattern factor of a set of bins: E[v^3] / E[v]^3. Used in tests and
 * the energy summary; 6/pi for a Rayleigh distribution.
 */
export function energyPatternFactor(bins: readonly FlowBin[]): Decimal {
	let mean = ZERO;
	let meanCube = ZERO;
	for (const { speedMPerS: v, probability: p } of bins) {
		mean = mean.plus(p.times(v));
		meanCube = meanCube.plus(p.times(v).times(v).times(v));
	}
	return meanCube.div(mean.times(mean).times(mean));
}
