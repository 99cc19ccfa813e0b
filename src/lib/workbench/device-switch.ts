/**
 * Switching the device between its kinds (rotor, power curve, power matrix,
 * capture width) in the editor: what the new device keeps of the old one,
 * what the switch does to the installed capacity, and the words that say so.
 * Plain numbers: these are figures to read in the editor; the engine computes
 * the results from the document with its own arithmetic.
 */
import type { DeviceSpec } from '../schemas/scenario';
import { CASE_FIGURES } from '../metrics/catalogue';
import { deviceKindLabels, deviceOfKind } from './document-defaults';
import { formatNumber } from './format';

type Device = DeviceSpec;
export type DeviceKind = Device['kind'];
type Rotor = Extract<Device, { kind: 'rotor' }>;
type PowerCurve = Extract<Device, { kind: 'power-curve' }>;
export type PowerCurvePoint = PowerCurve['points'][number];

/** Spacing of the curve a rotor implies, m/s. */
export const IMPLIED_CURVE_STEP_MPERS = 0.25;
/** Seawater density when the document leaves it out, kg/m^3 (the schema's default). */
const DEFAULT_DENSITY = 1025;

/** Rated power of one device, kW: given, or the highest power of its curve or matrix; null when none can be read. */
export function deviceRatedPowerKW(device: Device): number | null {
	if (device.ratedPowerKW !== undefined) return device.ratedPowerKW;
	const powers = device.kind === 'power-curve' ? device.points.map((p) => p.powerKW) : device.kind === 'power-matrix' ? device.powerKW.flat() : [];
	const finite = powers.filter((p) => Number.isFinite(p));
	return finite.length > 0 ? Math.max(...finite) : null;
}

/** Installed capacity, kW = devices x rated power per device; null when either is missing. */
export function installedCapacityKW(deviceCount: number | undefined, device: Device): number | null {
	const rated = deviceRatedPowerKW(device);
	return rated === null || deviceCount === undefined || !Number.isFinite(deviceCount) ? null : deviceCount * rated;
}

/** Swept area of a rotor, m^2: given, or pi D^2 / 4; null when neither is given. */
export function rotorSweptAreaM2(rotor: Pick<Rotor, 'rotorDiameterM' | 'sweptAreaM2'>): number | null {
	if (rotor.sweptAreaM2 !== undefined) return rotor.sweptAreaM2;
	return rotor.rotorDiameterM === undefined ? null : (Math.PI * rotor.rotorDiameterM ** 2) / 4;
}

/** 1/2 rho A Cp eta in kW per (m/s)^3: the rotor's power is this times v^3 below rated. */
function rotorKWPerCube(rotor: Rotor, densityKgPerM3: number): number | null {
	const area = rotorSweptAreaM2(rotor);
	return area === null ? null : (0.5 * densityKgPerM3 * area * rotor.powerCoefficient * (rotor.driveTrainEfficiency ?? 1)) / 1000;
}

/**
 * Power of a parametric rotor at a flow speed, kW, the engine's formula in
 * plain numbers:
 *
 *     P(v) = min(P_rated, 1/2 rho A Cp eta v^3)   for cut-in <= v < cut-out, else 0
 *
 * Source: IEC TS 62600-200 / the standard actuator-disc form (common practice).
 */
export function rotorPowerKW(rotor: Rotor, densityKgPerM3: number, speedMPerS: number): number {
	const k = rotorKWPerCube(rotor, densityKgPerM3);
	if (k === null || speedMPerS < (rotor.cutInSpeedMPerS ?? 0) || speedMPerS >= rotor.cutOutSpeedMPerS) return 0;
	return Math.min(rotor.ratedPowerKW, k * speedMPerS ** 3);
}

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

/**
 * The power curve a rotor implies: the rotor's power sampled every `stepMPerS`
 * from cut-in to cut-out, plus the speed where it first reaches rated power.
 * The first point sits on cut-in itself (the curve gives nothing below its
 * first point, as the rotor gives nothing below cut-in); the last sits on
 * cut-out with the power just below it. Speeds to 0.01 m/s, powers to 0.1 kW;
 * null when the rotor has neither diameter nor swept area, or no speed range.
 *
 *     P(v) = min(P_rated, 1/2 rho A Cp eta v^3)
 *
 * Source: IEC TS 62600-200 / the standard actuator-disc form (common practice).
 */
export function impliedPowerCurve(rotor: Rotor, densityKgPerM3: number, stepMPerS = IMPLIED_CURVE_STEP_MPERS): PowerCurvePoint[] | null {
	const k = rotorKWPerCube(rotor, densityKgPerM3);
	const cutIn = rotor.cutInSpeedMPerS ?? 0;
	const cutOut = rotor.cutOutSpeedMPerS;
	if (k === null || !(k > 0) || !(cutOut > cutIn) || !(stepMPerS > 0)) return null;
	const speeds = new Set<number>([round(cutIn, 2)]);
	for (let n = Math.floor(cutIn / stepMPerS) + 1; n * stepMPerS < cutOut; n++) speeds.add(round(n * stepMPerS, 2));
	// Up to 0.01 m/s above the exact rated speed, so that point is at rated power.
	const ratedSpeed = Math.ceil(Math.cbrt(rotor.ratedPowerKW / k) * 100) / 100;
	if (ratedSpeed > cutIn && ratedSpeed < cutOut) speeds.add(ratedSpeed);
	speeds.add(round(cutOut, 2));
	const power = (v: number) => round(Math.min(rotor.ratedPowerKW, k * v ** 3), 1);
	return [...speeds].sort((a, b) => a - b).map((speedMPerS) => ({ speedMPerS, powerKW: power(speedMPerS) }));
}

/** Grouped, with at most `places` decimals and no trailing zeros: 1.5, 12,000, 333.3. */
const trimmed = (x: number, places: number) => {
	const text = formatNumber(x, places);
	return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
};

/** "750 kW", "333.3 kW", "1.5 MW", "15 MW": kW below 1 MW, MW from there. */
export function formatPower(kW: number): string {
	return Math.abs(kW) >= 1000 ? `${trimmed(kW / 1000, 4)} MW` : `${trimmed(kW, 1)} kW`;
}

/** The capacity of the array with one device: count, rated power per device and their product (null where unknown). */
export interface ArrayCapacity {
	deviceCount: number | undefined;
	ratedPowerKW: number | null;
	installedKW: number | null;
}

export interface DeviceSwitchSummary {
	from: DeviceKind;
	to: DeviceKind;
	before: ArrayCapacity;
	after: ArrayCapacity;
	/** What came across from the old device, in words. */
	carried: string[];
	/** What the new device starts from, and what was set aside, in words. */
	changed: string[];
}

export interface DeviceSwitch {
	device: Device;
	summary: DeviceSwitchSummary;
}

export interface SwitchContext {
	deviceCount: number | undefined;
	densityKgPerM3?: number;
	/** The values the user had under the new kind before, if any (brought back as they were, apart from the rated power). */
	stashed?: Device;
}

const capacityOf = (deviceCount: number | undefined, device: Device): ArrayCapacity => ({
	deviceCount,
	ratedPowerKW: deviceRatedPowerKW(device),
	installedKW: installedCapacityKW(deviceCount, device)
});

const plainNumber = (x: number) => String(round(x, 3));
const speedRange = (points: readonly PowerCurvePoint[]) => `${plainNumber(points[0].speedMPerS)} to ${plainNumber(points[points.length - 1].speedMPerS)} m/s`;

/** Fields of each kind that no other kind has, named as the editor names them. */
const ownFields: Record<DeviceKind, string> = {
	rotor: 'rotor diameter, power coefficient, drive-train efficiency, cut-in and cut-out speeds',
	'power-curve': 'curve points',
	'power-matrix': 'Hs values, periods and matrix powers',
	'capture-width': 'capture width ratio and characteristic width'
};

/** The speed where a curve first reaches its highest power, and its cut-in and cut-out speeds. */
function curveSpeeds(points: readonly PowerCurvePoint[]) {
	const highest = Math.max(...points.map((p) => p.powerKW));
	const ratedAt = points.find((p) => p.powerKW === highest)!;
	const firstProducing = points.find((p) => p.powerKW > 0);
	const lastProducing = points.findLastIndex((p) => p.powerKW > 0);
	// The rotor gives nothing at or above cut-out: past the last producing point, or at the curve's end.
	const cutOut = points[Math.min(lastProducing + 1, points.length - 1)];
	return { ratedAt, cutIn: firstProducing ?? points[0], cutOut };
}

/**
 * A rotor from a power curve: cut-in and cut-out where the curve starts and
 * stops giving power, and a diameter that reaches rated power at the curve's
 * rated speed with the default power coefficient and drive-train efficiency.
 *
 *     A = P_rated / (1/2 rho Cp eta v_rated^3),  D = sqrt(4 A / pi)
 *
 * Source: the actuator-disc form solved for the area (common practice).
 */
function rotorFromCurve(curve: PowerCurve, ratedKW: number, densityKgPerM3: number): { rotor: Rotor; words: string[] } | null {
	const base = deviceOfKind('rotor') as Rotor;
	const { ratedAt, cutIn, cutOut } = curveSpeeds(curve.points);
	if (!(cutOut.speedMPerS > cutIn.speedMPerS) || !(ratedAt.speedMPerS > 0)) return null;
	const area = (ratedKW * 1000) / (0.5 * densityKgPerM3 * base.powerCoefficient * base.driveTrainEfficiency * ratedAt.speedMPerS ** 3);
	const diameter = round(Math.sqrt((4 * area) / Math.PI), 1);
	const rotor: Rotor = { ...base, rotorDiameterM: diameter, ratedPowerKW: ratedKW, cutInSpeedMPerS: cutIn.speedMPerS, cutOutSpeedMPerS: cutOut.speedMPerS };
	return {
		rotor,
		words: [
			`cut-in ${plainNumber(cutIn.speedMPerS)} m/s and cut-out ${plainNumber(cutOut.speedMPerS)} m/s, where the curve starts and stops giving power`,
			`a rotor diameter of ${plainNumber(diameter)} m, so the rotor reaches rated power at ${plainNumber(ratedAt.speedMPerS)} m/s as the curve does, with a power coefficient of ${base.powerCoefficient} and a drive-train efficiency of ${base.driveTrainEfficiency} (example values: replace them with the device's own)`
		]
	};
}

/** The new device of kind `to`, before the rated power is carried across, with words on where it comes from. */
function startingDevice(current: Device, to: DeviceKind, ratedKW: number | null, context: SwitchContext): { device: Device; starts: string } {
	const density = context.densityKgPerM3 ?? DEFAULT_DENSITY;
	if (context.stashed && context.stashed.kind === to) {
		return { device: structuredClone(context.stashed), starts: `The ${ownFields[to]} you had entered before are back.` };
	}
	if (current.kind === 'rotor' && to === 'power-curve') {
		const points = impliedPowerCurve(current, density);
		if (points) {
			return {
				device: { kind: 'power-curve', points },
				starts: `The curve starts from the one the rotor implies (P = ½ρAv³ × Cp × efficiency, capped at rated power): ${points.length} points from ${speedRange(points)}, read as straight lines between them, so the energy can differ a little from the rotor's.`
			};
		}
	}
	if (current.kind === 'power-curve' && to === 'rotor' && ratedKW !== null) {
		const made = rotorFromCurve(current, ratedKW, density);
		if (made) return { device: made.rotor, starts: `The rotor starts from the curve: ${made.words.join('; ')}.` };
	}
	return { device: deviceOfKind(to), starts: `The ${ownFields[to]} start from example values: replace them with the device's own.` };
}

/**
 * The device after a switch to kind `to`, and what the switch did. The rated
 * power per device carries across every switch (so the installed capacity
 * stays where it can); values entered under the new kind before come back;
 * a rotor turned into a power curve starts from the curve it implies, a curve
 * turned into a rotor from a rotor sized to the curve's rated speed.
 */
export function switchDevice(current: Device, to: DeviceKind, context: SwitchContext): DeviceSwitch {
	const ratedKW = deviceRatedPowerKW(current);
	const { device, starts } = startingDevice(current, to, ratedKW, context);
	if (ratedKW !== null) device.ratedPowerKW = ratedKW;
	const carried = ratedKW === null ? [] : [`rated power ${formatPower(ratedKW)} per device`];
	const changed = [starts, `The ${ownFields[current.kind]} are set aside: switching back to ${deviceKindLabels[current.kind].toLowerCase()} brings them back.`];
	return {
		device,
		summary: { from: current.kind, to, before: capacityOf(context.deviceCount, current), after: capacityOf(context.deviceCount, device), carried, changed }
	};
}

const capacityWords = (c: ArrayCapacity) =>
	c.installedKW === null || c.ratedPowerKW === null ? 'not known' : `${formatPower(c.installedKW)} (${c.deviceCount} × ${formatPower(c.ratedPowerKW)})`;

/**
 * The installed capacity before and after, in words:
 * "Installed capacity 15 MW (10 × 1,500 kW) → 15 MW (10 × 1,500 kW), unchanged."
 */
export function capacityChangeWords(summary: Pick<DeviceSwitchSummary, 'before' | 'after'>): string {
	const { before, after } = summary;
	const label = CASE_FIGURES.installedCapacityMW.label;
	let change = '';
	if (before.installedKW !== null && after.installedKW !== null) {
		const difference = after.installedKW - before.installedKW;
		change = Math.abs(difference) < 1e-9 ? ', unchanged' : `, ${formatPower(Math.abs(difference))} ${difference > 0 ? 'more' : 'less'}`;
	}
	return `${label} ${capacityWords(before)} → ${capacityWords(after)}${change}.`;
}

/** The notice shown after a switch: a headline, the capacity change, then what came across and what changed. */
export function deviceSwitchNotice(summary: DeviceSwitchSummary): { headline: string; capacity: string; details: string[] } {
	const kept = summary.carried.length > 0 ? `Carried over: ${summary.carried.join(', ')}.` : 'Nothing carried over: the old device gave no rated power.';
	return {
		headline: `Device now given as ${deviceKindLabels[summary.to].toLowerCase()} (was ${deviceKindLabels[summary.from].toLowerCase()}).`,
		capacity: capacityChangeWords(summary),
		details: [kept, ...summary.changed]
	};
}
