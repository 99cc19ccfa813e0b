/**
 * Wave energy flux and the power of a wave energy converter in a sea state.
 * Heights in m, periods in s, density kg/m^3, g m/s^2, flux kW/m, power kW.
 */
import { dec, Decimal, ONE, ZERO, type DecimalInput } from '../decimal';
import { PI } from './current';
import type { DeviceSpec } from '../../../schemas/scenario';

type PowerMatrixSpec = Extract<DeviceSpec, { kind: 'power-matrix' }>;
type CaptureWidthSpec = Extract<DeviceSpec, { kind: 'capture-width' }>;

/**
 * Deep-water wave energy flux of an irregular sea state per metre of crest.
 *
 *     J = rho g^2 Hs^2 Te / (64 pi)   (W/m; returned in kW/m)
 *
 * Source: IEC TS 62600-101 (omnidirectional wave power in deep water). Note the
 * regular-wave form rho g^2 H^2 T / (32 pi) is a factor 2 larger for the same
 * height number. Example: Hs 2 m, Te 8 s, rho 1025, g 9.80665 gives 15.6886 kW/m.
 */
export function waveEnergyFluxKWPerM(
	hsM: DecimalInput,
	teS: DecimalInput,
	densityKgPerM3: DecimalInput,
	gravityMPerS2: DecimalInput
): Decimal {
	return waveFluxFunction(densityKgPerM3, gravityMPerS2)(dec(hsM), dec(teS));
}

/** J(Hs, Te) in kW/m with the constant rho g^2 / (64 pi 1000) computed once, for many sea states. */
export function waveFluxFunction(densityKgPerM3: DecimalInput, gravityMPerS2: DecimalInput): (hsM: Decimal, teS: Decimal) => Decimal {
	const g = dec(gravityMPerS2);
	const coefficient = dec(densityKgPerM3).times(g).times(g).div(PI.times(64000));
	return (hs, te) => coefficient.times(hs).times(hs).times(te);
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
	const firstMargin = n > 1 ? (a[1] - a[0]) / 2 : 0;
	const lastMargin = n > 1 ? (a[n - 1] - a[n - 2]) / 2 : 0;
	if (xf < a[0] - firstMargin - 1e-12 || xf > a[n - 1] + lastMargin + 1e-12) return null;
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
	return (hsM, teS) => {
		const nearestMode = matrix.lookup === 'nearest';
		const row = locate(hsAxis, hsM, nearestMode);
		const col = locate(teAxis, teS, nearestMode);
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
