import { describe, expect, it } from 'vitest';
import { Decimal, dec, sum } from '../decimal';
import { energyPatternFactor, energyPeriodFromPeakPeriod, MAX_DISTRIBUTION_BINS, normaliseOccurrences, rayleighBins, weibullBins } from './distributions';

/** Gamma function by the Lanczos approximation (g = 7), for the Weibull moments. */
function gamma(x: number): number {
	const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
	if (x < 0.5) return Math.PI / (Math.sin(Math.PI * x) * gamma(1 - x));
	x -= 1;
	let a = c[0];
	const t = x + 7.5;
	for (let i = 1; i < 9; i++) a += c[i] / (x + i);
	return Math.sqrt(2 * Math.PI) * t ** (x + 0.5) * Math.exp(-t) * a;
}

describe('rayleighBins', () => {
	it('has the Rayleigh energy pattern factor 6/pi on fine bins', () => {
		// Derived from the Rayleigh moments (CHECK-VALUES): E[v^3]/E[v]^3 = 6/pi = 1.909859.
		const bins = rayleighBins(1, 0.001);
		expect(energyPatternFactor(bins).toNumber()).toBeCloseTo(6 / Math.PI, 5);
		expect(energyPatternFactor(bins).toNumber()).toBeCloseTo(1.909859, 5);
	});
	it('keeps the given mean speed and sums to 1', () => {
		// Rayleigh mean = c sqrt(pi)/2 (textbook), so c = 2 vmean / sqrt(pi) recovers the mean.
		const bins = rayleighBins(1.8, 0.001);
		const mean = sum(bins.map((b) => b.probability.times(b.speedMPerS)));
		expect(mean.toNumber()).toBeCloseTo(1.8, 5);
		expect(sum(bins.map((b) => b.probability)).toNumber()).toBeCloseTo(1, 14);
	});
});

describe('weibullBins', () => {
	it.each([
		[1.5, 2.718531],
		[2.5, 1.577413],
		[3, 1.404351],
		[4, 1.234189]
	])('shape %d has EPF G(1+3/k)/G(1+1/k)^3 = %d on fine bins', (k, published) => {
		// CHECK-VALUES (derived from the Weibull moments): EPF = G(1+3/k) / G(1+1/k)^3.
		const formula = gamma(1 + 3 / k) / gamma(1 + 1 / k) ** 3;
		expect(formula).toBeCloseTo(published, 6);
		const epf = energyPatternFactor(weibullBins(1, k, 0.002)).toNumber();
		expect(epf).toBeCloseTo(published, 4);
	});
	it('puts bin probabilities F(b) - F(a) at bin centres', () => {
		// Weibull CDF F(v) = 1 - exp(-(v/c)^k) (textbook); first bin of width 0.1 with c 2, k 2.
		const bins = weibullBins(2, 2, 0.1);
		expect(bins[0].speedMPerS.toString()).toBe('0.05');
		expect(bins[0].probability.toNumber()).toBeCloseTo(1 - Math.exp(-((0.1 / 2) ** 2)), 15);
		expect(sum(bins.map((b) => b.probability)).toNumber()).toBeCloseTo(1, 14);
	});
});

describe('weibullBins with bins too fine for the cap', () => {
	// Weibull c 2.5 m/s, k 2: the bins reach v_max = 2.5 sqrt(-ln 1e-9) = 2.5 x 4.55228 = 11.3807 m/s (tail 1e-9).
	// E[v^3] = c^3 G(1 + 3/k) = 15.625 x G(2.5) = 15.625 x 1.329340 = 20.7709 m^3/s^3 (Weibull moments, statistics texts).
	const meanCube = (bins: ReturnType<typeof weibullBins>) => sum(bins.map((b) => b.probability.times(b.speedMPerS.pow(3)))).toNumber();
	const exact = 2.5 ** 3 * gamma(2.5);

	it.each([
		// 0.0001 m/s would need 113,808 bins: the smallest multiple reaching 11.3807 m/s in 10,000 is 12 x 0.0001 = 0.0012.
		[0.0001, '0.0012'],
		// 0.00001 m/s would need 1,138,071 bins: 114 x 0.00001 = 0.00114.
		[0.00001, '0.00114']
	])('widens %d m/s bins to %s m/s, keeps the energy and says so', (width, used) => {
		// Before, the bins stopped at 10,000 x width (1 m/s and 0.1 m/s) with the whole tail on the last bin:
		// E[v^3] fell to about 1 m^3/s^3 and 0.001 m^3/s^3, most or all of the energy lost without a word.
		const warnings: string[] = [];
		const bins = weibullBins(2.5, 2, width, warnings);
		expect(bins.length).toBeLessThanOrEqual(MAX_DISTRIBUTION_BINS);
		expect(bins[1].speedMPerS.minus(bins[0].speedMPerS).toString()).toBe(used);
		expect(Math.abs(meanCube(bins) / exact - 1)).toBeLessThan(1e-5);
		expect(sum(bins.map((b) => b.probability)).toNumber()).toBeCloseTo(1, 14);
		expect(warnings).toEqual([
			`The Weibull distribution's bins of ${width} m/s would take more than 10,000 bins to reach 11.3807 m/s, where the tail left is 1e-9; bins of ${used} m/s were used instead.`
		]);
	});

	it('names the Rayleigh distribution when it is the one widened', () => {
		const warnings: string[] = [];
		const bins = rayleighBins(1.8, 0.00001, warnings);
		expect(warnings[0]).toMatch(/^The Rayleigh distribution's bins of 0\.00001 m\/s .* bins of 0\.00\d+ m\/s were used instead\.$/);
		// Rayleigh mean = c sqrt(pi)/2 (textbook): the mean survives the wider bins.
		expect(sum(bins.map((b) => b.probability.times(b.speedMPerS))).toNumber()).toBeCloseTo(1.8, 5);
	});

	it('leaves a width that fits alone, without a warning', () => {
		// c 2, k 2: v_max = 9.1 m/s, 9,105 bins of 0.001 m/s fit under the cap.
		const warnings: string[] = [];
		const bins = weibullBins(2, 2, 0.001, warnings);
		expect(bins).toHaveLength(9105);
		expect(bins[0].speedMPerS.toString()).toBe('0.0005');
		expect(warnings).toEqual([]);
	});

	it('copes with a width so small that the multiple overflows', () => {
		const warnings: string[] = [];
		const bins = weibullBins(2.5, 2, 1e-320, warnings);
		expect(bins.length).toBeLessThanOrEqual(MAX_DISTRIBUTION_BINS);
		expect(Math.abs(meanCube(bins) / exact - 1)).toBeLessThan(1e-5);
		expect(warnings).toHaveLength(1);
	});
});

describe('energyPatternFactor', () => {
	it('is pi^2/6 for a sinusoidal tide u = U0 |sin wt| sampled finely', () => {
		// CHECK-VALUES (derived): mean |u|^3 = 4/(3 pi) U0^3 = 0.424413 U0^3, mean |u| = 2/pi U0,
		// so EPF = (4/(3 pi)) / (2/pi)^3 = pi^2/6 = 1.644934.
		const n = 20000;
		const bins = Array.from({ length: n }, (_, i) => ({
			speedMPerS: new Decimal(Math.abs(Math.sin((Math.PI * (i + 0.5)) / n))),
			probability: dec(1).div(n)
		}));
		expect(energyPatternFactor(bins).toNumber()).toBeCloseTo((Math.PI * Math.PI) / 6, 6);
		const meanCube = sum(bins.map((b) => b.probability.times(b.speedMPerS.pow(3))));
		expect(meanCube.toNumber()).toBeCloseTo(0.424413, 6);
	});
});

describe('normaliseOccurrences', () => {
	it('turns hours into probabilities and refuses an all-zero table', () => {
		expect(normaliseOccurrences([2190, 4380, 2190])!.map(String)).toEqual(['0.25', '0.5', '0.25']);
		expect(normaliseOccurrences([0, 0])).toBeNull();
	});
});

describe('energyPeriodFromPeakPeriod', () => {
	it('applies the Te/Tp ratio', () => {
		// CHECK-VALUES: Te/Tp = 0.8588 for Pierson-Moskowitz; 0.9 is the usual rule.
		expect(energyPeriodFromPeakPeriod(10, 0.8588).toString()).toBe('8.588');
		// 23rd ITTC fit for JONSWAP: 0.8255 + 0.03852 g - 0.005537 g^2 + 0.0003154 g^3 at g = 3.3 gives 0.9037.
		const g = 3.3;
		expect(0.8255 + 0.03852 * g - 0.005537 * g ** 2 + 0.0003154 * g ** 3).toBeCloseTo(0.9037, 4);
	});
});
