/**
 * A float64 number with the part of decimal.js's interface the engine uses,
 * so the one engine can run over either type (see ./decimal.ts: withFloat64).
 *
 * Draws of a probabilistic run and the first pass of a circular solve need
 * speed, not 30 digits: plain IEEE doubles are some twenty times faster than
 * 30-digit decimals. The figures the product reports stay decimal.
 */
type Operand = Float64 | number | string | { toNumber(): number };

const valueOf = (x: Operand): number =>
	typeof x === 'number' ? x : x instanceof Float64 ? x.value : typeof x === 'string' ? Number(x) : x.toNumber();

/** Round half to even at `places` decimal places (decimal.js's default rounding), as closely as a double allows. */
function roundToPlaces(x: number, places: number): number {
	if (!Number.isFinite(x)) return x;
	const scale = 10 ** places;
	const scaled = x * scale;
	const floor = Math.floor(scaled);
	const diff = scaled - floor;
	const rounded = diff > 0.5 ? floor + 1 : diff < 0.5 ? floor : floor % 2 === 0 ? floor : floor + 1;
	return rounded / scale;
}

/** Plain notation, never an exponent (decimal.js's toFixed() without places). */
function plainString(x: number): string {
	const text = String(x);
	if (!/e/i.test(text)) return text;
	if (Math.abs(x) < 1) return x.toFixed(20).replace(/\.?0+$/, '');
	return BigInt(Math.round(x)).toString();
}

export class Float64 {
	readonly value: number;
	static readonly ROUND_UP = 0;
	static readonly ROUND_DOWN = 1;
	static readonly ROUND_HALF_EVEN = 6;

	constructor(x: Operand) {
		this.value = valueOf(x);
	}

	static max(...xs: Operand[]): Float64 {
		let best = valueOf(xs[0]);
		for (let i = 1; i < xs.length; i++) {
			const v = valueOf(xs[i]);
			if (v > best || Number.isNaN(v)) best = v;
		}
		return new Float64(best);
	}

	static min(...xs: Operand[]): Float64 {
		let best = valueOf(xs[0]);
		for (let i = 1; i < xs.length; i++) {
			const v = valueOf(xs[i]);
			if (v < best || Number.isNaN(v)) best = v;
		}
		return new Float64(best);
	}

	static sum(...xs: Operand[]): Float64 {
		let total = 0;
		for (const x of xs) total += valueOf(x);
		return new Float64(total);
	}

	static acos(x: Operand): Float64 {
		return new Float64(Math.acos(valueOf(x)));
	}

	plus(x: Operand) {
		return new Float64(this.value + valueOf(x));
	}
	minus(x: Operand) {
		return new Float64(this.value - valueOf(x));
	}
	times(x: Operand) {
		return new Float64(this.value * valueOf(x));
	}
	div(x: Operand) {
		return new Float64(this.value / valueOf(x));
	}
	pow(x: Operand) {
		return new Float64(Math.pow(this.value, valueOf(x)));
	}
	sqrt() {
		return new Float64(Math.sqrt(this.value));
	}
	exp() {
		return new Float64(Math.exp(this.value));
	}
	ln() {
		return new Float64(Math.log(this.value));
	}
	log(base: Operand = 10) {
		return new Float64(Math.log(this.value) / Math.log(valueOf(base)));
	}
	abs() {
		return new Float64(Math.abs(this.value));
	}
	neg() {
		return new Float64(-this.value);
	}
	negated() {
		return this.neg();
	}
	round() {
		return new Float64(roundToPlaces(this.value, 0));
	}
	floor() {
		return new Float64(Math.floor(this.value));
	}
	ceil() {
		return new Float64(Math.ceil(this.value));
	}
	toDecimalPlaces(places = 0) {
		return new Float64(roundToPlaces(this.value, places));
	}
	toSignificantDigits(digits: number, rounding = Float64.ROUND_HALF_EVEN) {
		if (this.value === 0 || !Number.isFinite(this.value)) return this;
		const magnitude = 10 ** (digits - 1 - Math.floor(Math.log10(Math.abs(this.value))));
		const scaled = this.value * magnitude;
		const rounded = rounding === Float64.ROUND_UP ? Math.sign(scaled) * Math.ceil(Math.abs(scaled) - 1e-9) : rounding === Float64.ROUND_DOWN ? Math.trunc(scaled) : Math.round(scaled);
		return new Float64(rounded / magnitude);
	}

	comparedTo(x: Operand) {
		const v = valueOf(x);
		return this.value < v ? -1 : this.value > v ? 1 : this.value === v ? 0 : NaN;
	}
	eq(x: Operand) {
		return this.value === valueOf(x);
	}
	lt(x: Operand) {
		return this.value < valueOf(x);
	}
	lte(x: Operand) {
		return this.value <= valueOf(x);
	}
	gt(x: Operand) {
		return this.value > valueOf(x);
	}
	gte(x: Operand) {
		return this.value >= valueOf(x);
	}
	isZero() {
		return this.value === 0;
	}
	isNegative() {
		return this.value < 0 || Object.is(this.value, -0);
	}
	isPositive() {
		return this.value > 0 || Object.is(this.value, 0);
	}
	isFinite() {
		return Number.isFinite(this.value);
	}
	isNaN() {
		return Number.isNaN(this.value);
	}
	isInteger() {
		return Number.isInteger(this.value);
	}

	toNumber() {
		return this.value;
	}
	toFixed(places?: number) {
		return places === undefined ? plainString(this.value) : this.value.toFixed(places);
	}
	toString() {
		return String(this.value);
	}
	valueOf() {
		return String(this.value);
	}
	toJSON() {
		return String(this.value);
	}
}
