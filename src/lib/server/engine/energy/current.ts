/**
 * Power of a tidal-stream or ocean-current device at a given flow speed.
 * Speeds in m/s, density in kg/m^3, areas in m^2, power in kW.
 */
import { dec, Decimal, ZERO, type DecimalInput } from '../decimal';
import { PI } from '../decimal';
export { PI };
import type { DeviceSpec } from '../../../schemas/scenario';

type RotorSpec = Extract<DeviceSpec, { kind: 'rotor' }>;
type PowerCurveSpec = Extract<DeviceSpec, { kind: 'power-curve' }>;

/**
 * Kinetic power flux through a unit area normal to the flow.
 *
 *     q = 1/2 rho v^3   (W/m^2)
 *
 * Source: kinetic energy flux, any fluid mechanics text. Example: rho 1025,
 * v 2.5 m/s gives 8007.8125 W/m^2.
 */
export function kineticPowerDensityWPerM2(densityKgPerM3: DecimalInput, speedMPerS: DecimalInput): Decimal {
	const v = dec(speedMPerS);
	return dec(densityKgPerM3).times(v).times(v).times(v).div(2);
}

/** Swept area A = pi D^2 / 4 (m^2), or the given area. */
export function sweptAreaM2(device: Pick<RotorSpec, 'rotorDiameterM' | 'sweptAreaM2'>): Decimal {
	if (device.sweptAreaM2 !== undefined) return dec(device.sweptAreaM2);
	const d = dec(device.rotorDiameterM ?? 0);
	return PI.times(d).times(d).div(4);
}

/**
 * Power of a parametric rotor.
 *
 *     P(v) = min(P_rated, 1/2 rho A Cp eta v^3)   for cut-in <= v < cut-out, else 0
 *
 * in kW. Source: actuator-disc power with the Betz-bounded power coefficient
 * (Cp <= 16/27, enforced by the scenario schema).
 */
export function rotorPowerKW(device: RotorSpec, densityKgPerM3: DecimalInput, speedMPerS: DecimalInput): Decimal {
	const v = dec(speedMPerS);
	if (v.lt(device.cutInSpeedMPerS) || v.gte(device.cutOutSpeedMPerS)) return ZERO;
	const hydrodynamicW = kineticPowerDensityWPerM2(densityKgPerM3, v)
		.times(sweptAreaM2(device))
		.times(device.powerCoefficient)
		.times(device.driveTrainEfficiency);
	return Decimal.min(hydrodynamicW.div(1000), device.ratedPowerKW);
}

/**
 * Builds P(v) for a rotor with the constant factor 1/2 rho A Cp eta computed
 * once, for use over many bins.
 */
export function rotorPowerFunction(device: RotorSpec, densityKgPerM3: DecimalInput): (v: Decimal) => Decimal {
	const kWPerCube = dec(densityKgPerM3)
		.times(sweptAreaM2(device))
		.times(device.powerCoefficient)
		.times(device.driveTrainEfficiency)
		.div(2000);
	const rated = dec(device.ratedPowerKW);
	return (v) => {
		if (v.lt(device.cutInSpeedMPerS) || v.gte(device.cutOutSpeedMPerS)) return ZERO;
		return Decimal.min(kWPerCube.times(v).times(v).times(v), rated);
	};
}

/**
 * Power from a measured power curve by linear interpolation between its points;
 * zero below the first and above the last point (list the curve through cut-out).
 *
 *     P(v) = P_i + (P_{i+1} - P_i) (v - v_i) / (v_{i+1} - v_i)   for v_i <= v <= v_{i+1}
 *
 * Source: IEC TS 62600-200 presents power against binned flow speed; linear
 * interpolation between bins is common practice.
 */
export function powerCurveKW(points: PowerCurveSpec['points'], speedMPerS: DecimalInput): Decimal {
	const v = dec(speedMPerS);
	const first = points[0];
	const last = points[points.length - 1];
	if (v.lt(first.speedMPerS) || v.gt(last.speedMPerS)) return ZERO;
	for (let i = 0; i < points.length - 1; i++) {
		const a = points[i];
		const b = points[i + 1];
		if (v.lte(b.speedMPerS)) {
			const share = v.minus(a.speedMPerS).div(b.speedMPerS - a.speedMPerS);
			return dec(a.powerKW).plus(share.times(b.powerKW - a.powerKW));
		}
	}
	return dec(last.powerKW);
}

/** A fall in a power curve on its way up to rated power: from `peak` down to `low`, rising again at `rise`. */
export type PowerCurveDip = {
	peak: { speedMPerS: number; powerKW: number };
	low: { speedMPerS: number; powerKW: number };
	rise: { speedMPerS: number; powerKW: number };
};

/**
 * The dips of a power curve between cut-in and rated power: wherever the
 * power falls from one point to the next and then rises again.
 *
 *     cut-in = first point with P > 0;  rated = first point with P >= min(P_rated, max P)
 *     dip    = P_i > P_{i+1} >= ... >= P_low < P_{low+1}, all within [cut-in, rated]
 *
 * Flat stretches are not dips, nor is anything above rated power (a curve may
 * ease off towards cut-out). Source: IEC TS 62600-200 presents power against
 * flow speed rising from cut-in to rated; a rotor's power, 1/2 rho A Cp v^3, only
 * rises below rated, so a fall and rise there is a measurement or typing fault
 * (common practice to question it). Example: 0, 300, 250, 1000 kW at 0.5, 1.5,
 * 1.75, 2.5 m/s dips from 300 kW at 1.5 m/s to 250 kW at 1.75 m/s.
 */
export function powerCurveDips(points: PowerCurveSpec['points'], ratedPowerKW?: number): PowerCurveDip[] {
	const start = points.findIndex((p) => p.powerKW > 0);
	if (start < 0) return [];
	const highest = Math.max(...points.map((p) => p.powerKW));
	const rated = Math.min(ratedPowerKW ?? highest, highest);
	const end = points.findIndex((p, i) => i >= start && p.powerKW >= rated);
	const dips: PowerCurveDip[] = [];
	let peak = -1;
	let low = -1;
	for (let i = start + 1; i <= end; i++) {
		const [before, here] = [points[i - 1], points[i]];
		if (here.powerKW < before.powerKW) {
			if (peak < 0) peak = i - 1;
			if (low < 0 || here.powerKW < points[low].powerKW) low = i;
		} else if (peak >= 0 && here.powerKW > points[low].powerKW) {
			dips.push({ peak: { ...points[peak] }, low: { ...points[low] }, rise: { ...here } });
			peak = -1;
			low = -1;
		}
	}
	return dips;
}

const speedWords = (x: number) => String(Number(x.toPrecision(6)));

/**
 * The warning for a power curve that dips on its way to rated power, naming
 * the speeds of each dip; null when it rises steadily (see powerCurveDips).
 */
export function powerCurveDipWarning(points: PowerCurveSpec['points'], ratedPowerKW?: number): string | null {
	const dips = powerCurveDips(points, ratedPowerKW);
	if (dips.length === 0) return null;
	const each = dips.map(
		(d) =>
			`from ${speedWords(d.peak.powerKW)} kW at ${speedWords(d.peak.speedMPerS)} m/s down to ${speedWords(d.low.powerKW)} kW at ${speedWords(d.low.speedMPerS)} m/s, rising again by ${speedWords(d.rise.speedMPerS)} m/s`
	);
	return `The power curve falls and rises again between cut-in and rated power (${each.join('; ')}). A device's power normally rises steadily up to rated: check these points.`;
}

/** Rated power per device (kW): given, or the curve's maximum. */
export function flowDeviceRatedPowerKW(device: RotorSpec | PowerCurveSpec): Decimal {
	if (device.ratedPowerKW !== undefined) return dec(device.ratedPowerKW);
	if (device.kind === 'rotor') return dec(device.ratedPowerKW);
	return dec(Math.max(...device.points.map((p) => p.powerKW)));
}
