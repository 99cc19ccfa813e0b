/**
 * Losses and degradation. Losses are independent and multiply: 95 %
 * availability, 5 % array loss and 3 % electrical loss leave
 * 0.95 x 0.95 x 0.97 = 0.875425 of the gross energy, not 0.87.
 */
import { dec, Decimal, ONE, type DecimalInput } from '../decimal';

export type LossInputs = {
	arrayLoss: DecimalInput;
	availability: DecimalInput;
	electricalLoss: DecimalInput;
	otherLoss: DecimalInput;
};

/**
 * Share of gross energy delivered after all losses.
 *
 *     f = (1 - array) x availability x (1 - electrical) x (1 - other)
 *
 * Source: common practice (losses applied in sequence, each to what is left).
 */
export function netLossFactor(losses: LossInputs): Decimal {
	return ONE.minus(losses.arrayLoss)
		.times(losses.availability)
		.times(ONE.minus(losses.electricalLoss))
		.times(ONE.minus(losses.otherLoss));
}

/**
 * Geometric degradation factor of operating year k (k = 1 is undegraded).
 *
 *     d_k = (1 - rate)^(k - 1)
 *
 * Source: common practice. Example: 0.5 %/yr in year 10 gives 0.995^9 = 0.955890.
 */
export function degradationFactor(ratePerYear: DecimalInput, year: number): Decimal {
	return ONE.minus(ratePerYear).pow(year - 1);
}

/** d_1..d_N by repeated multiplication (one multiplication a year). */
export function degradationFactors(ratePerYear: DecimalInput, years: number): Decimal[] {
	const keep = ONE.minus(dec(ratePerYear));
	const factors: Decimal[] = [];
	let f = ONE;
	for (let k = 1; k <= years; k++) {
		factors.push(f);
		f = f.times(keep);
	}
	return factors;
}
