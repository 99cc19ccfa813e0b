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

/** Tail probability beyond the last generated bin (it is folded into the last bin). */
export const TAIL_PROBABILITY = 1e-9;
/** Most bins one distribution is cut into; finer requested widths are widened to fit (see weibullBins). */
export const MAX_DISTRIBUTION_BINS = 10000;

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
 * Bins run up to v_max = c (-ln 1e-9)^(1/k), where the tail beyond is 1e-9;
 * that tail goes into the last bin so the probabilities sum to exactly 1.
 * When w is so fine that v_max / w exceeds 10,000 bins, w is widened to the
 * smallest whole multiple of itself that covers v_max in 10,000 bins, and a
 * warning naming the width used is added to `warnings` (cutting the bins short
 * instead would pile the whole tail onto a low speed and lose most of the
 * energy). Units: c and w in m/s, k dimensionless. Source: the Weibull
 * distribution (any statistics text); the cap is common practice.
 *
 * The bin probabilities are statistical weights computed in double precision
 * (relative error ~1e-15) because a decimal power with a fractional exponent
 * per bin would cost milliseconds; they are carried as decimals from here on.
 */
export function weibullBins(
	scaleMPerS: number,
	shape: number,
	binWidthMPerS: number,
	warnings?: string[],
	distributionName = 'Weibull distribution'
): FlowBin[] {
	const survival = (v: number) => Math.exp(-Math.pow(v / scaleMPerS, shape));
	const maxSpeed = scaleMPerS * Math.pow(-Math.log(TAIL_PROBABILITY), 1 / shape);
	const { width, widthMPerS } = coveringWidth(maxSpeed, binWidthMPerS);
	if (widthMPerS !== binWidthMPerS) {
		warnings?.push(
			`The ${distributionName}'s bins of ${plain(binWidthMPerS)} m/s would take more than ${MAX_DISTRIBUTION_BINS.toLocaleString('en')} bins ` +
				`to reach ${plain(maxSpeed)} m/s, where the tail left is ${TAIL_PROBABILITY}; bins of ${width.toString()} m/s were used instead.`
		);
	}
	const count = Math.max(1, Math.ceil(maxSpeed / widthMPerS));
	const bins: FlowBin[] = [];
	let lowerSurvival = 1;
	for (let j = 0; j < count; j++) {
		const upperSurvival = j === count - 1 ? 0 : survival((j + 1) * widthMPerS);
		bins.push({
			speedMPerS: width.times(j + 0.5),
			probability: new Decimal(lowerSurvival - upperSurvival)
		});
		lowerSurvival = upperSurvival;
	}
	return bins;
}

/**
 * The bin width that reaches maxSpeed in at most MAX_DISTRIBUTION_BINS bins:
 * the requested width when it does, else its smallest whole multiple that does
 * (so bin edges stay on the requested grid), as a decimal and a number.
 */
function coveringWidth(maxSpeed: number, requestedMPerS: number): { width: Decimal; widthMPerS: number } {
	const requested = dec(requestedMPerS);
	if (Math.ceil(maxSpeed / requestedMPerS) <= MAX_DISTRIBUTION_BINS) return { width: requested, widthMPerS: requestedMPerS };
	const multiple = Math.ceil(maxSpeed / requestedMPerS / MAX_DISTRIBUTION_BINS);
	// A width so small that the multiple overflows: take the covering width itself.
	let width = Number.isFinite(multiple) ? requested.times(multiple) : dec(maxSpeed).div(MAX_DISTRIBUTION_BINS).toSignificantDigits(6, Decimal.ROUND_UP);
	// Floating-point rounding of the quotient can leave one bin too many: widen by one more step.
	while (Math.ceil(maxSpeed / width.toNumber()) > MAX_DISTRIBUTION_BINS) width = width.plus(Number.isFinite(multiple) ? requested : width.div(1e6));
	return { width, widthMPerS: width.toNumber() };
}

const plain = (x: number) => String(Number(x.toPrecision(6)));

/**
 * Rayleigh distribution from its mean speed: a Weibull with k = 2 and
 * c = 2 vmean / sqrt(pi) (since the Weibull mean is c G(1 + 1/k)). Source: the
 * Rayleigh distribution, a textbook special case of the Weibull.
 */
export function rayleighBins(meanSpeedMPerS: number, binWidthMPerS: number, warnings?: string[]): FlowBin[] {
	return weibullBins((2 * meanSpeedMPerS) / Math.sqrt(Math.PI), 2, binWidthMPerS, warnings, 'Rayleigh distribution');
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
