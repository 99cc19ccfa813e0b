/**
 * The engine's one number type. 30 significant digits keep 25-year discounting
 * and root solving far below a cent on billion-scale projects.
 *
 * The engine is written once, over this module's `Decimal`, `ZERO`, `ONE` and
 * `PI`. withFloat64(fn) runs fn with them bound to float64 (./float64.ts): the
 * draws of a probabilistic run and the first pass of a circular solve, where
 * speed matters and 1e-12 is plenty. The bindings are live ES module exports,
 * swapped for the synchronous call and put back after it; the engine never
 * awaits, so nothing else can run in between.
 */
import DecimalJs from 'decimal.js';
import { Float64 } from './float64';

const Decimal30 = DecimalJs.clone({ precision: 30, rounding: DecimalJs.ROUND_HALF_EVEN });
export type Decimal = InstanceType<typeof Decimal30>;
export type DecimalInput = Decimal | number | string;
export type NumberKind = 'decimal' | 'float64';

const kinds = {
	decimal: { Decimal: Decimal30, ZERO: new Decimal30(0), ONE: new Decimal30(1), PI: Decimal30.acos(-1) },
	// The engine sees float64 through decimal.js's type: it calls only methods Float64 has.
	float64: {
		Decimal: Float64 as unknown as typeof Decimal30,
		ZERO: new Float64(0) as unknown as Decimal,
		ONE: new Float64(1) as unknown as Decimal,
		PI: new Float64(Math.PI) as unknown as Decimal
	}
};

export let Decimal = kinds.decimal.Decimal;
export let ZERO: Decimal = kinds.decimal.ZERO;
export let ONE: Decimal = kinds.decimal.ONE;
export let PI: Decimal = kinds.decimal.PI;
let current: NumberKind = 'decimal';

/** The number kind the engine is running over now. */
export function numberKind(): NumberKind {
	return current;
}

function bind(kind: NumberKind) {
	current = kind;
	({ Decimal, ZERO, ONE, PI } = kinds[kind]);
}

/** Run a synchronous engine call over float64 numbers. Its results hold Float64 values (read them with toNumber). */
export function withFloat64<T>(fn: () => T): T {
	if (current === 'float64') return fn();
	bind('float64');
	try {
		const result = fn();
		if (result instanceof Promise) throw new Error('withFloat64 runs synchronous engine calls only');
		return result;
	} finally {
		bind('decimal');
	}
}

export function dec(value: DecimalInput): Decimal {
	return value instanceof Decimal ? value : new Decimal(value);
}

export function sum(values: readonly Decimal[]): Decimal {
	let total = ZERO;
	for (const v of values) total = total.plus(v);
	return total;
}

const EXACT_POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);
const powerOfTen = (k: number) => (k < EXACT_POWERS_OF_TEN.length ? EXACT_POWERS_OF_TEN[k] : 10 ** k);

/**
 * A decimal as float64, read from its digits (the first 17 to 23) to within a few
 * units in the last place. decimal.js's toNumber is exact but goes through a
 * string, which costs as much as a multiplication; this is for float64
 * searches whose answer the decimal pass then settles. Float64 values pass
 * through unchanged.
 */
export function roughNumber(x: Decimal): number {
	const words = (x as { d?: unknown }).d;
	if (!Array.isArray(words) || words.length === 0) return x.toNumber();
	let mantissa = words[0] as number;
	let digits = mantissa >= 1e6 ? 7 : String(mantissa).length;
	const leading = digits;
	for (let i = 1; i < words.length && digits < 17; i++) {
		mantissa = mantissa * 1e7 + (words[i] as number);
		digits += 7;
	}
	// The last digit read stands for 10^(e - digits + 1); the first for 10^e.
	const exponent = x.e - digits + 1;
	const value = exponent >= 0 ? mantissa * powerOfTen(exponent) : mantissa / powerOfTen(-exponent);
	return leading > 0 && x.isNegative() ? -value : value;
}
