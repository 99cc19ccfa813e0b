/**
 * Conversions between real and nominal rates. Rates are fractions per year
 * (0.05 is 5 %).
 */
import { dec, ONE, type Decimal, type DecimalInput } from '../decimal';

function onePlus(rate: Decimal, name: string): Decimal {
	const factor = ONE.plus(rate);
	if (!factor.isFinite() || factor.lte(0)) {
		throw new RangeError(`${name} must be a finite fraction greater than -1, got ${rate.toString()}`);
	}
	return factor;
}

/**
 * Nominal rate from a real rate and inflation (Fisher relation, exact form).
 *
 *     1 + nominal = (1 + real) * (1 + inflation)
 *
 * Units: fractions per year. Source: Fisher (1930), the exact form rather than
 * the approximation nominal ~ real + inflation.
 *
 * Example: a real 5 % with 2 % inflation is nominal 7.1 %:
 *
 *     nominalFromReal(0.05, 0.02)  // => 0.071
 *
 * @throws RangeError when either rate is not greater than -1.
 */
export function nominalFromReal(real: DecimalInput, inflation: DecimalInput): Decimal {
	const growth = onePlus(dec(real), 'real rate');
	const priceGrowth = onePlus(dec(inflation), 'inflation');
	return growth.times(priceGrowth).minus(ONE);
}

/**
 * Real rate from a nominal rate and inflation (Fisher relation, exact form).
 *
 *     1 + real = (1 + nominal) / (1 + inflation)
 *
 * Units: fractions per year. Source: Fisher (1930).
 *
 * Example: nominal 8 % with 2.5 % inflation is real 5.365854 %:
 *
 *     realFromNominal(0.08, 0.025)  // => 0.05365853658536585365853658537
 *
 * @throws RangeError when either rate is not greater than -1.
 */
export function realFromNominal(nominal: DecimalInput, inflation: DecimalInput): Decimal {
	const growth = onePlus(dec(nominal), 'nominal rate');
	const priceGrowth = onePlus(dec(inflation), 'inflation');
	return growth.div(priceGrowth).minus(ONE);
}
