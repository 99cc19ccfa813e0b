/**
 * Wave energy flux and the power of a wave energy converter in a sea state.
 * Heights in m, periods in s, density kg/m^3, g m/s^2, flux kW/m, power kW.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from '../decimal';
import { PI } from './current';
import { groupVelocityDepthFactor } from './dispersion';
import type { DeviceSpec } from '../../../schemas/scenario';

type PowerMatrixSpec = Extract<DeviceSpec, { kind: 'power-matrix' }>;
type CaptureWidthSpec = Extract<DeviceSpec, { kind: 'capture-width' }>;

/**
 * Wave energy flux of an irregular sea state per metre of crest, at the
 * site's water depth h:
 *
 *     J = rho g (Hs^2 / 16) Cg(Te, h)   (W/m; returned in kW/m)
 *     Cg = g Te / (4 pi) x tanh(kh) (1 + 2kh / sinh 2kh),   w^2 = g k tanh(kh) at w = 2 pi / Te
 *
 * In deep water (h undefined) Cg = g Te / (4 pi) and J = rho g^2 Hs^2 Te / (64 pi).
 * Source: IEC TS 62600-101 (omnidirectional wave power; the group velocity at
 * the energy period stands for the spectral integral, common practice); the
 * group velocity from ./dispersion. Note the regular-wave form
 * rho g^2 H^2 T / (32 pi) is a factor 2 larger for the same height number.
 * Example: Hs 2 m, Te 8 s, rho 1025, g 9.80665 gives 15.6886 kW/m in deep water.
 */
export function waveEnergyFluxKWPerM(
	hsM: DecimalInput,
	teS: DecimalInput,
	densityKgPerM3: DecimalInput,
	gravityMPerS2: DecimalInput,
	waterDepthM?: number
): Decimal {
	return waveFluxFunction(densityKgPerM3, gravityMPerS2, waterDepthM)(dec(hsM), dec(teS));
}

/**
 * J(Hs, Te) in kW/m for many sea states: the deep-water constant
 * rho g^2 / (64 pi 1000) computed once, and the depth factor Cg/Cg0 once per
 * distinct period (a scatter diagram repeats a few dozen periods).
 */
export function waveFluxFunction(
	densityKgPerM3: DecimalInput,
	gravityMPerS2: DecimalInput,
	waterDepthM?: number
): (hsM: Decimal, teS: Decimal) => Decimal {
	const g = dec(gravityMPerS2);
	const coefficient = dec(densityKgPerM3).times(g).times(g).div(PI.times(64000));
	// coefficient x Hs^2 kept per height (a table repeats a dozen), the same products in the same order.
	const perHeight = new Map<Decimal, Decimal>();
	const deep = (hs: Decimal, te: Decimal) => {
		let squared = perHeight.get(hs);
		if (squared === undefined) perHeight.set(hs, (squared = coefficient.times(hs).times(hs)));
		return squared.times(te);
	};
	if (waterDepthM === undefined) return deep;
	const gravity = g.toNumber();
	const factors = new Map<string, Decimal>();
	return (hs, te) => {
		const key = te.toString();
		let factor = factors.get(key);
		if (factor === undefined) {
			factor = groupVelocityDepthFactor(te.toNumber(), waterDepthM, gravity);
			factors.set(key, factor);
		}
		return deep(hs, te).times(factor);
	};
}

/**
 * Parametric device: absorbed and converted power as a share of the flux
 * across its characteristic width, capped at rated power.
 *
 *     P = min(P_rated, CWR x B x J)
 *
 * Source: capture width ratio as defined in IEC TS 62600-100 (wave-to-wire here).
 */
export function captureWidthPowerKW(device: CaptureWidthSpec, fluxKWPerM: Decimal): Decimal {
	const absorbed = fluxKWPerM.times(device.captureWidthRatio).times(device.characteristicWidthM);
	return Decimal.min(absorbed, device.ratedPowerKW);
}

/** The outer edges of an axis's cells: half a spacing beyond the first and last centres (a lone centre is its own edge). */
function cellEdges(a: readonly number[]): { low: number; high: number } {
	const n = a.length;
	const firstMargin = n > 1 ? (a[1] - a[0]) / 2 : 0;
	const lastMargin = n > 1 ? (a[n - 1] - a[n - 2]) / 2 : 0;
	return { low: a[0] - firstMargin, high: a[n - 1] + lastMargin };
}

function sideOfCells(a: readonly number[], x: number): 'below' | 'inside' | 'above' {
	const { low, high } = cellEdges(a);
	return x < low - 1e-12 ? 'below' : x > high + 1e-12 ? 'above' : 'inside';
}

/** Where a coordinate falls on a matrix axis. `null` means outside the matrix's cells. */
type AxisPosition = { lower: number; upper: number; weightUpper: Decimal; nearest: number } | null;

/** An ascending axis of cell centres, with the decimal values and inverse spacings the weights need. */
type Axis = { values: number[]; decimals: Decimal[]; inverseSpacing: Decimal[] };

function axisOf(decimals: Decimal[]): Axis {
	return {
		values: decimals.map((d) => d.toNumber()),
		decimals,
		inverseSpacing: decimals.slice(1).map((d, i) => ONE.div(d.minus(decimals[i])))
	};
}

/**
 * Locate x on an axis of cell centres. The matrix covers its cells, which
 * reach half a spacing beyond the first and last centres; inside that margin
 * the coordinate is clamped to the edge centre. The weight is exact decimal
 * arithmetic: (x - a_i) / (a_{i+1} - a_i).
 */
function locate(axis: Axis, x: Decimal, wantNearest: boolean): AxisPosition {
	const a = axis.values;
	const n = a.length;
	const xf = x.toNumber();
	if (sideOfCells(a, xf) !== 'inside') return null;
	if (xf <= a[0]) return { lower: 0, upper: 0, weightUpper: ZERO, nearest: 0 };
	if (xf >= a[n - 1]) return { lower: n - 1, upper: n - 1, weightUpper: ZERO, nearest: n - 1 };
	let i = 0;
	while (a[i + 1] < xf) i++;
	const weightUpper = x.minus(axis.decimals[i]).times(axis.inverseSpacing[i]);
	// Ties go to the upper cell, as the IEC bin [centre - w/2, centre + w/2) does.
	const nearest = wantNearest && !weightUpper.lt(0.5) ? i + 1 : i;
	return { lower: i, upper: i + 1, weightUpper, nearest };
}

/**
 * Mean power of a device in a sea state from its power matrix.
 *
 * bilinear: P = sum of the four surrounding cells weighted by (1 - a)(1 - b),
 * a (1 - b), (1 - a) b, a b, where a, b are the fractional positions along Hs
 * and the period axis. nearest: the value of the nearest cell. Sea states
 * outside the matrix's cells give zero (the device is not rated for them).
 * teAxisS is the period axis in energy period (converted from Tp when the
 * matrix is in peak periods). Source: IEC TS 62600-100 (power matrix x
 * occurrence matrix); the lookup is common practice.
 */
export function powerMatrixKW(
	matrix: Pick<PowerMatrixSpec, 'hsM' | 'powerKW' | 'lookup'>,
	teAxisS: readonly DecimalInput[],
	hsM: DecimalInput,
	teS: DecimalInput
): Decimal | null {
	return powerMatrixFunction(matrix, teAxisS)(dec(hsM), dec(teS));
}

/** The lookup of powerMatrixKW with the matrix and axes prepared once, for many sea states. */
export function powerMatrixFunction(
	matrix: Pick<PowerMatrixSpec, 'hsM' | 'powerKW' | 'lookup'>,
	teAxisS: readonly DecimalInput[]
): (hsM: Decimal, teS: Decimal) => Decimal | null {
	const m = matrix.powerKW.map((row) => row.map((v) => new Decimal(v)));
	const hsAxis = axisOf(matrix.hsM.map(dec));
	const teAxis = axisOf(teAxisS.map(dec));
	const nearestMode = matrix.lookup === 'nearest';
	// Positions kept per coordinate (a table repeats a dozen heights and periods).
	const located = (axis: Axis) => {
		const known = new Map<Decimal, AxisPosition>();
		return (x: Decimal) => {
			let position = known.get(x);
			if (position === undefined) known.set(x, (position = locate(axis, x, nearestMode)));
			return position;
		};
	};
	const rowOf = located(hsAxis);
	const colOf = located(teAxis);
	return (hsM, teS) => {
		const row = rowOf(hsM);
		const col = colOf(teS);
		if (!row || !col) return null;
		if (nearestMode) return m[row.nearest][col.nearest];
		const a = row.weightUpper;
		const b = col.weightUpper;
		const lowRow = m[row.lower];
		const highRow = m[row.upper];
		const low = b.isZero() ? lowRow[col.lower] : lowRow[col.lower].plus(b.times(lowRow[col.upper].minus(lowRow[col.lower])));
		const high = b.isZero() ? highRow[col.lower] : highRow[col.lower].plus(b.times(highRow[col.upper].minus(highRow[col.lower])));
		return a.isZero() ? low : low.plus(a.times(high.minus(low)));
	};
}

/** Rated power per device (kW): given, or the matrix maximum. */
export function powerMatrixRatedPowerKW(matrix: PowerMatrixSpec): Decimal {
	if (matrix.ratedPowerKW !== undefined) return dec(matrix.ratedPowerKW);
	return dec(Math.max(...matrix.powerKW.flat()));
}

/** Share of time (0..1) in sea states outside a power matrix, in all and by the side they leave it on; a state off a corner counts on both sides. */
export type MatrixCoverage = {
	outside: Decimal;
	hsBelow: Decimal;
	hsAbove: Decimal;
	periodBelow: Decimal;
	periodAbove: Decimal;
	/** Edges of the matrix's cells: Hs in m, energy period in s. */
	edges: { hsLow: number; hsHigh: number; teLow: number; teHigh: number };
};

/** Shares above this (1 % of the hours) are reported: storms beyond a matrix are usually the device's survival states, a small share is expected. */
export const MATRIX_COVERAGE_WARNING_SHARE = new Decimal(0.01);

/**
 * Which sea states a power matrix leaves out, and on which side: Hs below or
 * above its cells, energy period below or above them (teAxisS in Te, as for
 * powerMatrixFunction). The cells reach half a spacing beyond the first and
 * last centres, as in the lookup. Source: IEC TS 62600-100 (the matrix covers
 * the sea states it was measured or modelled in); the split is common practice.
 */
export function powerMatrixCoverage(
	matrix: Pick<PowerMatrixSpec, 'hsM'>,
	teAxisS: readonly DecimalInput[],
	states: readonly { hsM: Decimal; teS: Decimal; probability: Decimal }[]
): MatrixCoverage {
	const hsAxis = matrix.hsM.map(Number);
	const teAxis = teAxisS.map((t) => dec(t).toNumber());
	const shares = { outside: ZERO, hsBelow: ZERO, hsAbove: ZERO, periodBelow: ZERO, periodAbove: ZERO };
	for (const s of states) {
		const hsSide = sideOfCells(hsAxis, s.hsM.toNumber());
		const teSide = sideOfCells(teAxis, s.teS.toNumber());
		if (hsSide === 'inside' && teSide === 'inside') continue;
		shares.outside = shares.outside.plus(s.probability);
		if (hsSide === 'below') shares.hsBelow = shares.hsBelow.plus(s.probability);
		if (hsSide === 'above') shares.hsAbove = shares.hsAbove.plus(s.probability);
		if (teSide === 'below') shares.periodBelow = shares.periodBelow.plus(s.probability);
		if (teSide === 'above') shares.periodAbove = shares.periodAbove.plus(s.probability);
	}
	const hs = cellEdges(hsAxis);
	const te = cellEdges(teAxis);
	return { ...shares, edges: { hsLow: hs.low, hsHigh: hs.high, teLow: te.low, teHigh: te.high } };
}

const percent = (share: Decimal) => share.times(100).toDecimalPlaces(2).toString();
const plain = (x: number) => String(Number(x.toPrecision(6)));

/**
 * The warning for a matrix that leaves out more than 1 % of the hours, naming
 * the share and the sides, or null. For example: "3.2 % of the time falls in
 * sea states outside the power matrix, which give no power: 2.5 % with Hs above
 * it (over 5.75 m), 0.7 % with energy periods Te below it (under 4.5 s)."
 */
export function matrixCoverageWarning(coverage: MatrixCoverage): string | null {
	if (!coverage.outside.gt(MATRIX_COVERAGE_WARNING_SHARE)) return null;
	const { edges } = coverage;
	const sides = [
		{ share: coverage.hsAbove, words: `with Hs above it (over ${plain(edges.hsHigh)} m)` },
		{ share: coverage.hsBelow, words: `with Hs below it (under ${plain(edges.hsLow)} m)` },
		{ share: coverage.periodAbove, words: `with energy periods Te above it (over ${plain(edges.teHigh)} s)` },
		{ share: coverage.periodBelow, words: `with energy periods Te below it (under ${plain(edges.teLow)} s)` }
	]
		.filter((side) => side.share.gt(0))
		.sort((a, b) => b.share.comparedTo(a.share))
		.map((side) => `${percent(side.share)} % ${side.words}`);
	return `${percent(coverage.outside)} % of the time falls in sea states outside the power matrix, which give no power: ${sides.join(', ')}.`;
}
