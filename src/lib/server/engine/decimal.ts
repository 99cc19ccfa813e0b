/**
 * The engine's one decimal type. 30 significant digits keep 25-year discounting
 * and root solving far below a cent on billion-scale projects.
 */
import DecimalJs from 'decimal.js';

export const Decimal = DecimalJs.clone({ precision: 30, rounding: DecimalJs.ROUND_HALF_EVEN });
export type Decimal = InstanceType<typeof Decimal>;
export type DecimalInput = Decimal | number | string;

export const ZERO = new Decimal(0);
export const ONE = new Decimal(1);

export function dec(value: DecimalInput): Decimal {
	return value instanceof Decimal ? value : new Decimal(value);
}

export function sum(values: readonly Decimal[]): Decimal {
	let total = ZERO;
	for (const v of values) total = total.plus(v);
	return total;
}
