/**
 * Yield uncertainty: combined standard deviation and exceedance levels (P90,
 * any Pxx) under a normal model, over a one-year or an N-year horizon. Sigmas
 * are fractions of the P50 energy.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from '../decimal';

/**
 * inter-annual: the resource's year-to-year variability, which averages out
 * over several years; long-term: everything that does not (measurement,
 * model, losses, power performance): a bias common to every year.
 */
export type UncertaintyKind = 'long-term' | 'inter-annual';

/** Root-sum-square sigma of each kind, fractions of P50. */
export type UncertaintySplit = { longTerm: Decimal; interAnnual: Decimal };

/** The horizons the result reports exceedance levels for, years. */
export const EXCEEDANCE_HORIZON_YEARS = [1, 10] as const;

/**
 * Combined standard deviation of independent uncertainties (root sum of squares).
 *
 *     sigma = sqrt(sum sigma_i^2)
 *
 * Source: common practice for independent error sources (GUM-style combination).
 */
export function combinedSigma(sigmas: readonly DecimalInput[]): Decimal {
	let sumSquares = ZERO;
	for (const s of sigmas) sumSquares = sumSquares.plus(dec(s).times(s));
	return sumSquares.sqrt();
}

/** Standard normal CDF, |x| <= 8, via erf's all-positive series (no cancellation). */
function normalCdf(x: number): number {
	const t = Math.abs(x) / Math.SQRT2;
	if (t > 6) return x > 0 ? 1 : 0;
	// erf(t) = 2/sqrt(pi) exp(-t^2) sum_n 2^n t^(2n+1) / (1 3 5 ... (2n+1))
	let term = t;
	let total = t;
	for (let n = 1; n < 200 && term > total * 1e-17; n++) {
		term *= (2 * t * t) / (2 * n + 1);
		total += term;
	}
	const erf = (2 / Math.sqrt(Math.PI)) * Math.exp(-t * t) * total;
	return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
}

/**
 * Inverse standard normal CDF z = Phi^-1(p), 0 < p < 1. Acklam's rational
 * approximation (relative error 1.15e-9) polished by two Halley steps against
 * the series CDF above, giving about 1e-15. Source: P. J. Acklam, "An algorithm
 * for computing the inverse normal cumulative distribution function" (2003).
 * Example: Phi^-1(0.9) = 1.2815515655446004.
 */
export function normalQuantile(p: number): number {
	if (!(p > 0 && p < 1)) throw new RangeError(`probability must be strictly between 0 and 1, got ${p}`);
	const a = [-39.69683028665376, 220.9460984245205, -275.9285104469687, 138.357751867269, -30.66479806614716, 2.506628277459239];
	const b = [-54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972, -13.28068155288572];
	const c = [-0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
	const d = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416];
	const low = 0.02425;
	let x: number;
	if (p < low) {
		const q = Math.sqrt(-2 * Math.log(p));
		x = (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
	} else if (p <= 1 - low) {
		const q = p - 0.5;
		const r = q * q;
		x = ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
	} else {
		const q = Math.sqrt(-2 * Math.log(1 - p));
		x = -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
	}
	if (Math.abs(x) < 8) {
		for (let step = 0; step < 2; step++) {
			const e = normalCdf(x) - p;
			const u = e * Math.sqrt(2 * Math.PI) * Math.exp((x * x) / 2);
			x = x - u / (1 + (x * u) / 2);
		}
	}
	return x;
}

/**
 * Energy exceeded with probability `levelPercent` % as a share of P50.
 *
 *     Pxx / P50 = max(0, 1 - z sigma),   z = Phi^-1(xx / 100)
 *
 * so P90 = P50 (1 - 1.281552 sigma) and P50 itself has z = 0. Source: normal
 * exceedance model, common practice in yield assessment. Example: sigma 10 %
 * gives P90/P50 = 0.871845.
 */
export function exceedanceFactor(levelPercent: number, sigma: DecimalInput): Decimal {
	const z = new Decimal(normalQuantile(levelPercent / 100));
	return Decimal.max(ZERO, ONE.minus(z.times(sigma)));
}

/**
 * Combined sigma of each kind (root sum of squares within the kind).
 *
 *     sigma_LT  = sqrt(sum over long-term components sigma_i^2)
 *     sigma_IAV = sqrt(sum over inter-annual components sigma_i^2)
 *
 * A component without a kind is long-term. Source: as combinedSigma.
 */
export function splitSigmas(components: readonly { sigma: DecimalInput; kind?: UncertaintyKind }[]): UncertaintySplit {
	const of = (kind: UncertaintyKind) => combinedSigma(components.filter((c) => (c.kind ?? 'long-term') === kind).map((c) => c.sigma));
	return { longTerm: of('long-term'), interAnnual: of('inter-annual') };
}

/**
 * Standard deviation of the mean annual energy over an N-year horizon.
 *
 *     sigma_N = sqrt(sigma_LT^2 + sigma_IAV^2 / N)
 *
 * The year-to-year variability of N independent years averages out as
 * 1/sqrt(N) (the variance of a mean of N independent values); long-term
 * uncertainty is the same error in every year and does not. With N = 1 this
 * is the plain root sum of squares of all components. Sources: common
 * practice in yield assessment; D. Thevenard and S. Pelland, "Estimating the
 * uncertainty in long-term photovoltaic yield predictions", Solar Energy 91
 * (2013) 432-445 (first-year against lifetime uncertainty); EWEA, Wind Energy
 * - The Facts (2009), Part I (results for one-year and ten-year periods).
 * Example: sigma_LT 8 %, sigma_IAV 6 %: sigma_1 = 10 %, sigma_10 = sqrt(0.0064
 * + 0.00036) = 8.2219 %.
 */
export function horizonSigma(split: UncertaintySplit, horizonYears: number): Decimal {
	if (!(Number.isFinite(horizonYears) && horizonYears >= 1)) throw new RangeError(`horizon must be at least one year, got ${horizonYears}`);
	const lt = dec(split.longTerm);
	const iav = dec(split.interAnnual);
	// Only long-term uncertainty: the same sigma over every horizon, exactly (no square-and-root rounding).
	if (iav.isZero()) return lt;
	return lt.times(lt).plus(iav.times(iav).div(horizonYears)).sqrt();
}

/**
 * Energy exceeded with probability `levelPercent` % by the mean annual energy
 * over `horizonYears`, as a share of P50: what debt sizing multiplies the
 * P50 energy by to size on, say, the one-year P90.
 *
 *     Pxx,N / P50 = max(0, 1 - z_xx sigma_N)
 *
 * Source: exceedanceFactor and horizonSigma. Example: sigma_LT 8 %, sigma_IAV
 * 6 %, P90 over 10 years: 1 - 1.2815516 x 0.0822192 = 0.894632.
 */
export function horizonExceedanceFactor(levelPercent: number, horizonYears: number, split: UncertaintySplit): Decimal {
	return exceedanceFactor(levelPercent, horizonSigma(split, horizonYears));
}

/**
 * Sigma implied by a given exceedance value under the normal model, the
 * inverse of exceedanceFactor.
 *
 *     sigma = (1 - Pxx / P50) / z_xx,   z_xx = Phi^-1(xx / 100)
 *
 * so a P90 gives sigma = (1 - P90/P50) / 1.2815515655. Source: normal
 * exceedance model (common practice); z_90 from the standard normal table
 * (NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.1). Example:
 * P50 100, P90 87.1845: sigma = 0.128155 / 1.281552 = 0.1000.
 */
export function sigmaFromExceedance(p50: DecimalInput, pxx: DecimalInput, levelPercent = 90): Decimal {
	if (!(levelPercent > 50 && levelPercent < 100)) throw new RangeError(`exceedance level must be between 50 and 100 percent, got ${levelPercent}`);
	const z = new Decimal(normalQuantile(levelPercent / 100));
	return ONE.minus(dec(pxx).div(p50)).div(z);
}
