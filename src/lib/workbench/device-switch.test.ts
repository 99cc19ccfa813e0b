import { describe, expect, it } from 'vitest';
import type { DeviceSpec } from '../schemas/scenario';
import { deviceOfKind } from './document-defaults';
import {
	capacityChangeWords,
	deviceRatedPowerKW,
	deviceSwitchNotice,
	formatPower,
	impliedPowerCurve,
	installedCapacityKW,
	rotorPowerKW,
	rotorSweptAreaM2,
	switchDevice
} from './device-switch';

type Rotor = Extract<DeviceSpec, { kind: 'rotor' }>;
type Curve = Extract<DeviceSpec, { kind: 'power-curve' }>;

/** The Kestle Narrows example's rotor (examples/tidal-stream-kestle-narrows.json). */
const rotor: Rotor = {
	kind: 'rotor',
	rotorDiameterM: 20,
	powerCoefficient: 0.42,
	driveTrainEfficiency: 0.92,
	cutInSpeedMPerS: 0.7,
	ratedPowerKW: 1500,
	cutOutSpeedMPerS: 4.5
};

describe('deviceRatedPowerKW and installedCapacityKW', () => {
	it('read the given rating, else the highest power of the curve or matrix', () => {
		// Installed capacity = devices x rated power per device (the catalogue's basis for the figure).
		expect(deviceRatedPowerKW(rotor)).toBe(1500);
		expect(installedCapacityKW(10, rotor)).toBe(15000);
		const curve: Curve = { kind: 'power-curve', points: [{ speedMPerS: 1, powerKW: 0 }, { speedMPerS: 2, powerKW: 800 }, { speedMPerS: 3, powerKW: 750 }] };
		expect(deviceRatedPowerKW(curve)).toBe(800);
		expect(deviceRatedPowerKW({ ...curve, ratedPowerKW: 900 })).toBe(900);
		expect(deviceRatedPowerKW(deviceOfKind('power-matrix'))).toBe(540);
		expect(installedCapacityKW(undefined, rotor)).toBeNull();
	});
});

describe('rotorPowerKW and impliedPowerCurve', () => {
	it('gives the hand-computed power below rated (P = ½ρAv³ × Cp × eta)', () => {
		// Formula: IEC TS 62600-200 / standard actuator-disc form (common practice).
		// By hand: A = π × 20² / 4 = 314.159 m²; ½ × 1025 × 2³ = 4100 W/m²;
		// 4100 × 314.159 = 1,288,053 W; × 0.42 = 540,982 W; × 0.92 = 497,704 W = 497.70 kW.
		expect(rotorSweptAreaM2(rotor)).toBeCloseTo(314.159, 3);
		expect(rotorPowerKW(rotor, 1025, 2)).toBeCloseTo(497.7, 1);
		// Capped at rated power at 3.5 m/s; nothing below cut-in or at cut-out.
		expect(rotorPowerKW(rotor, 1025, 3.5)).toBe(1500);
		expect(rotorPowerKW(rotor, 1025, 0.6)).toBe(0);
		expect(rotorPowerKW(rotor, 1025, 4.5)).toBe(0);
	});

	it('samples the rotor every 0.25 m/s from cut-in to cut-out, with the rated speed as a point', () => {
		const points = impliedPowerCurve(rotor, 1025)!;
		const speeds = points.map((p) => p.speedMPerS);
		// By hand: k = ½ × 1025 × 314.159 × 0.42 × 0.92 / 1000 = 62.213 kW per (m/s)³;
		// rated speed = (1500 / 62.213)^(1/3) = 2.8889 m/s, taken up to 2.89.
		expect(speeds).toEqual([0.7, 0.75, 1, 1.25, 1.5, 1.75, 2, 2.25, 2.5, 2.75, 2.89, 3, 3.25, 3.5, 3.75, 4, 4.25, 4.5]);
		const at = (v: number) => points.find((p) => p.speedMPerS === v)!.powerKW;
		// By hand: 62.213 × 0.7³ = 62.213 × 0.343 = 21.34 kW at cut-in; 62.213 × 1.5³ = 62.213 × 3.375 = 209.97 kW.
		expect(at(0.7)).toBeCloseTo(21.3, 1);
		expect(at(1.5)).toBeCloseTo(210.0, 1);
		expect(at(2)).toBeCloseTo(497.7, 1);
		expect(at(2.89)).toBe(1500);
		// The last point holds the power just below cut-out; the curve gives nothing past it.
		expect(at(4.5)).toBe(1500);
		for (let i = 1; i < points.length; i++) expect(points[i].powerKW).toBeGreaterThanOrEqual(points[i - 1].powerKW);
	});

	it('has no curve for a rotor without diameter or area', () => {
		expect(impliedPowerCurve({ ...rotor, rotorDiameterM: undefined }, 1025)).toBeNull();
	});
});

describe('formatPower', () => {
	it('reads kW below 1 MW and MW from there', () => {
		expect(formatPower(750)).toBe('750 kW');
		expect(formatPower(333.33)).toBe('333.3 kW');
		expect(formatPower(1500)).toBe('1.5 MW');
		expect(formatPower(15000)).toBe('15 MW');
		expect(formatPower(150000)).toBe('150 MW');
	});
});

describe('switchDevice', () => {
	it('turns a rotor into the curve it implies, carrying the rated power, and keeps the installed capacity', () => {
		const { device, summary } = switchDevice(rotor, 'power-curve', { deviceCount: 10, densityKgPerM3: 1025 });
		expect(device.kind).toBe('power-curve');
		expect(device.ratedPowerKW).toBe(1500);
		expect((device as Curve).points).toEqual(impliedPowerCurve(rotor, 1025));
		expect(summary.before).toEqual({ deviceCount: 10, ratedPowerKW: 1500, installedKW: 15000 });
		expect(summary.after).toEqual({ deviceCount: 10, ratedPowerKW: 1500, installedKW: 15000 });
		const notice = deviceSwitchNotice(summary);
		expect(notice.capacity).toBe('Installed capacity 15 MW (10 × 1.5 MW) → 15 MW (10 × 1.5 MW), unchanged.');
		expect(notice.details[0]).toBe('Carried over: rated power 1.5 MW per device.');
		expect(notice.details.join(' ')).toContain('18 points from 0.7 to 4.5 m/s');
	});

	it('brings back the values entered under the new kind before, with the rated power of the old device', () => {
		const stashed: Curve = { kind: 'power-curve', points: [{ speedMPerS: 1, powerKW: 0 }, { speedMPerS: 2, powerKW: 1200 }, { speedMPerS: 3, powerKW: 1200 }] };
		const { device, summary } = switchDevice(rotor, 'power-curve', { deviceCount: 4, stashed });
		expect(device).toEqual({ ...stashed, ratedPowerKW: 1500 });
		expect(stashed.ratedPowerKW).toBeUndefined();
		expect(summary.changed[0]).toMatch(/curve points you had entered before are back/);
	});

	it('sizes a rotor from a curve: cut-in, cut-out and the diameter that reaches rated at the curve’s rated speed', () => {
		// The Mornstrand example's curve, shortened: rated 1000 kW first reached at 2.2 m/s.
		const curve: Curve = {
			kind: 'power-curve',
			points: [
				{ speedMPerS: 0.4, powerKW: 0 },
				{ speedMPerS: 0.6, powerKW: 20 },
				{ speedMPerS: 2.2, powerKW: 1000 },
				{ speedMPerS: 3, powerKW: 1000 }
			]
		};
		const { device, summary } = switchDevice(curve, 'rotor', { deviceCount: 6, densityKgPerM3: 1025 });
		const made = device as Rotor;
		// By hand: A = 1,000,000 W / (½ × 1025 × 0.4 × 0.9 × 2.2³) = 1,000,000 / (184.5 × 10.648) = 509.0 m²;
		// D = √(4 × 509.0 / π) = 25.46 m, shown to 0.1 m.
		expect(made.rotorDiameterM).toBe(25.5);
		expect([made.cutInSpeedMPerS, made.cutOutSpeedMPerS, made.ratedPowerKW]).toEqual([0.6, 3, 1000]);
		// The rotor's own power at 2.2 m/s is then (about) rated: the sizing holds.
		expect(rotorPowerKW({ ...made, rotorDiameterM: 25.4579 }, 1025, 2.2)).toBeCloseTo(1000, 0);
		expect(capacityChangeWords(summary)).toBe('Installed capacity 6 MW (6 × 1 MW) → 6 MW (6 × 1 MW), unchanged.');
	});

	it('names the change when the capacity moves: a matrix without rating to a capture width', () => {
		const matrix = { ...deviceOfKind('power-matrix'), ratedPowerKW: undefined } as DeviceSpec;
		const { device, summary } = switchDevice(matrix, 'capture-width', { deviceCount: 20 });
		// The matrix maximum, 540 kW, carries across as the rated power (20 × 540 = 10,800 kW).
		expect(device.ratedPowerKW).toBe(540);
		expect(summary.after.installedKW).toBe(10800);
		expect(deviceSwitchNotice(summary).details.join(' ')).toMatch(/capture width ratio and characteristic width start from example values/);
		// And a changed count on either side reads as more or less.
		expect(capacityChangeWords({ before: { deviceCount: 20, ratedPowerKW: 350, installedKW: 7000 }, after: summary.after })).toBe(
			'Installed capacity 7 MW (20 × 350 kW) → 10.8 MW (20 × 540 kW), 3.8 MW more.'
		);
	});

	it('leaves the old device untouched, so it can be put back exactly', () => {
		const before = structuredClone(rotor);
		switchDevice(rotor, 'power-curve', { deviceCount: 10 });
		expect(rotor).toEqual(before);
	});
});
