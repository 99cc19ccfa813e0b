/**
 * Inverse cumulative distribution functions x = F^-1(u) of the run's five
 * distribution shapes, and the standard normal CDF the copula needs. Plain
 * float64: statistics of draws, not money arithmetic.
 */
import type { Distribution } from '../../schemas/probabilistic';
import { normalQuantile } from '../engine/energy/uncertainty';

/**
 * Standard normal CDF Phi(x) by Marsaglia's Taylor series:
 *
 *     Phi(x) = 1/2 + phi(x) (x + x^3/3 + x^5/(3 5) + x^7/(3 5 7) + ...)
 *
 * summed until the sum stops changing; absolute error about 1e-16 for |x| <= 8.5,
 * and 0 or 1 beyond (where Phi differs from them by under 1e-17). Source:
 * G. Marsaglia (2004), "Evaluating the Normal Distribution", Journal of
 * Statistical Software 11(4). Example: Phi(1.2815515655446004) = 0.9.
 */
export function standardNormalCdf(x: number): number {
	if (x < -8.5) return 0;
	if (x > 8.5) return 1;
	const q = x * x;
	let sum = x;
	let term = x;
	let previous = 0;
	for (let i = 1; sum !== previous; i += 2) {
		previous = sum;
		term *= q / (i + 2);
		sum += term;
	}
	return 0.5 + sum * Math.exp(-0.5 * q - 0.9189385332046728); // ln sqrt(2 pi) = 0.9189385332046728
}

/** The open interval (2^-53, 1 - 2^-53): Phi^-1 of 0 or 1 is infinite. */
const U_MIN = 2 ** -53;
const U_MAX = 1 - 2 ** -53;
const openUnit = (u: number) => Math.min(U_MAX, Math.max(U_MIN, u));

/**
 * The value with cumulative probability u (0 < u < 1) under `distribution`:
 *
 *     normal            x = mean + sd Phi^-1(u)
 *     truncated-normal  x = mean + sd Phi^-1(Phi(a) + u (Phi(b) - Phi(a))),
 *                       a = (min - mean)/sd, b = (max - mean)/sd
 *     triangular        x = min + sqrt(u (max-min)(mode-min))          for u <  Fc
 *                       x = max - sqrt((1-u)(max-min)(max-mode))       for u >= Fc,
 *                       Fc = (mode-min)/(max-min)
 *     uniform           x = min + u (max - min)
 *     lognormal         x = exp(mu + s Phi^-1(u)),  s^2 = ln(1 + sd^2/mean^2),
 *                       mu = ln(mean^2 / sqrt(mean^2 + sd^2)) = ln(mean) - s^2/2
 *
 * u is held inside (2^-53, 1 - 2^-53). A truncated normal's mean and sd are the
 * untruncated normal's; its draws are clamped to [min, max] against rounding.
 * Sources: inverse-transform sampling, L. Devroye, Non-Uniform Random Variate
 * Generation (1986), ch. II.2; truncated normal by inversion, J. Burkardt,
 * "The Truncated Normal Distribution" (2014); triangular,
 * S. Kotz and J. R. van Dorp, Beyond Beta (2004), ch. 1; lognormal moments,
 * N. L. Johnson, S. Kotz and N. Balakrishnan, Continuous Univariate
 * Distributions vol. 1, 2nd ed. (1994), ch. 14. Phi^-1 is normalQuantile
 * (Acklam's approximation polished to about 1e-15, ../engine/energy/uncertainty.ts).
 */
export function inverseCdf(distribution: Distribution, u: number): number {
	const p = openUnit(u);
	switch (distribution.shape) {
		case 'normal':
			return distribution.mean + distribution.sd * normalQuantile(p);
		case 'truncated-normal': {
			const { mean, sd, min, max } = distribution;
			const low = standardNormalCdf((min - mean) / sd);
			const high = standardNormalCdf((max - mean) / sd);
			const x = mean + sd * normalQuantile(openUnit(low + p * (high - low)));
			return Math.min(max, Math.max(min, x));
		}
		case 'triangular': {
			const { min, mode, max } = distribution;
			const width = max - min;
			return p < (mode - min) / width ? min + Math.sqrt(p * width * (mode - min)) : max - Math.sqrt((1 - p) * width * (max - mode));
		}
		case 'uniform':
			return distribution.min + p * (distribution.max - distribution.min);
		case 'lognormal': {
			const { mean, sd } = distribution;
			const logVariance = Math.log1p((sd * sd) / (mean * mean));
			const logMean = Math.log(mean) - logVariance / 2;
			return Math.exp(logMean + Math.sqrt(logVariance) * normalQuantile(p));
		}
	}
}
