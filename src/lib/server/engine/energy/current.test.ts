import { describe, expect, it } from 'vitest';
import { dec } from '../decimal';
import { BETZ_LIMIT } from '../../../schemas/scenario';
import {
	flowDeviceRatedPowerKW,
	kineticPowerDensityWPerM2,
	powerCurveDips,
	powerCurveDipWarning,
	powerCurveKW,
	rotorPowerFunction,
	rotorPowerKW,
	sweptAreaM2
} from './current';

const rotor = {
	kind: 'rotor' as const,
	rotorDiameterM: 20,
	powerCoefficient: 0.4,
	driveTrainEfficiency: 1,
	cutInSpeedMPerS: 0.5,
	ratedPowerKW: 2000,
	cutOutSpeedMPerS: 4
};

describe('kineticPowerDensityWPerM2', () => {
	it('is 1/2 rho v^3, worked by hand', () => {
		// Hand calculation (standard kinetic energy flux): v^3 = 2.5^3 = 15.625;
		// 1/2 x 1025 x 15.625 = 512.5 x 15.625 = 8007.8125 W/m^2 (CHECK-VALUES, derived).
		expect(kineticPowerDensityWPerM2(1025, 2.5).toString()).toBe('8007.8125');
	});
});

describe('rotorPowerKW', () => {
	it('matches the rotor check value for D 20 m, v 2.5 m/s, Cp 0.40', () => {
		// Hand calculation: A = pi 20^2 / 4 = 314.159265 m^2;
		// P = 8007.8125 W/m^2 x 314.159265 x 0.40 = 1,006,291.2 W = 1.006291 MW (CHECK-VALUES, derived).
		const kw = rotorPowerKW(rotor, 1025, 2.5);
		expect(kw.div(1000).toNumber()).toBeCloseTo(1.006291, 6);
		expect(sweptAreaM2(rotor).toNumber()).toBeCloseTo(314.159265, 6);
	});

	it('is capped at rated power and zero outside cut-in and cut-out', () => {
		// Definitions of rated, cut-in and cut-out speeds (IEC TS 62600-200 vocabulary).
		expect(rotorPowerKW(rotor, 1025, 3.5).toString()).toBe('2000');
		expect(rotorPowerKW(rotor, 1025, 0.4).toString()).toBe('0');
		expect(rotorPowerKW(rotor, 1025, 4).toString()).toBe('0');
	});

	it('scales with drive-train efficiency and agrees with the precomputed form', () => {
		// P is linear in eta (definition P = 1/2 rho A Cp eta v^3).
		const withLoss = { ...rotor, driveTrainEfficiency: 0.9 };
		const full = rotorPowerKW(rotor, 1025, 2);
		expect(rotorPowerKW(withLoss, 1025, 2).div(full).toNumber()).toBeCloseTo(0.9, 15);
		expect(rotorPowerFunction(withLoss, 1025)(dec(2)).minus(rotorPowerKW(withLoss, 1025, 2)).abs().toNumber()).toBeLessThan(1e-20);
	});
});

describe('Betz limit', () => {
	it('is the maximum of the actuator-disc power coefficient 4a(1-a)^2', () => {
		// Lanchester-Betz (textbook): Cp(a) = 4a(1-a)^2 peaks at a = 1/3 with Cp = 16/27 = 0.592593.
		let best = 0;
		for (let i = 0; i <= 10000; i++) {
			const a = i / 20000;
			best = Math.max(best, 4 * a * (1 - a) ** 2);
		}
		expect(best).toBeCloseTo(BETZ_LIMIT, 8);
		expect(BETZ_LIMIT).toBeCloseTo(0.592593, 6);
	});
});

describe('powerCurveKW', () => {
	const points = [
		{ speedMPerS: 0.5, powerKW: 0 },
		{ speedMPerS: 1.5, powerKW: 300 },
		{ speedMPerS: 2.5, powerKW: 1000 },
		{ speedMPerS: 3.5, powerKW: 1000 }
	];
	it('interpolates linearly between points', () => {
		// Hand calculation: at 2.0 m/s, halfway between 300 and 1000 kW = 650 kW;
		// at 1.0 m/s, halfway between 0 and 300 = 150 kW.
		expect(powerCurveKW(points, 2).toString()).toBe('650');
		expect(powerCurveKW(points, 1).toString()).toBe('150');
		expect(powerCurveKW(points, 2.5).toString()).toBe('1000');
	});
	it('is zero outside the curve and rated at the curve maximum', () => {
		expect(powerCurveKW(points, 0.2).toString()).toBe('0');
		expect(powerCurveKW(points, 3.6).toString()).toBe('0');
		expect(flowDeviceRatedPowerKW({ kind: 'power-curve', points }).toString()).toBe('1000');
	});
});

describe('powerCurveDips and powerCurveDipWarning', () => {
	const curve = (pairs: [number, number][]) => pairs.map(([speedMPerS, powerKW]) => ({ speedMPerS, powerKW }));

	it('finds a fall followed by a rise below rated power and names its speeds', () => {
		// Read off by hand: 300 kW at 1.5 m/s falls to 250 kW at 1.75 m/s, rises to 600 kW at 2 m/s, rated 1000 kW at 2.5 m/s.
		const points = curve([[0.5, 0], [1.5, 300], [1.75, 250], [2, 600], [2.5, 1000], [3.5, 1000]]);
		expect(powerCurveDips(points)).toEqual([
			{ peak: { speedMPerS: 1.5, powerKW: 300 }, low: { speedMPerS: 1.75, powerKW: 250 }, rise: { speedMPerS: 2, powerKW: 600 } }
		]);
		const warning = powerCurveDipWarning(points);
		expect(warning).toContain('from 300 kW at 1.5 m/s down to 250 kW at 1.75 m/s, rising again by 2 m/s');
	});

	it('follows a dip over several points to its lowest, and lists each dip', () => {
		// By hand: 400 at 1.2 -> 380 at 1.4 -> 360 at 1.6 (lowest), rises at 1.8; then 700 at 2 -> 650 at 2.2, rises at 2.4.
		const points = curve([[0.6, 0], [1, 200], [1.2, 400], [1.4, 380], [1.6, 360], [1.8, 500], [2, 700], [2.2, 650], [2.4, 900], [2.6, 1000]]);
		const dips = powerCurveDips(points);
		expect(dips.map((d) => [d.peak.speedMPerS, d.low.speedMPerS, d.rise.speedMPerS])).toEqual([
			[1.2, 1.6, 1.8],
			[2, 2.2, 2.4]
		]);
		expect(powerCurveDipWarning(points)).toMatch(/at 1\.2 m\/s down to 360 kW at 1\.6 m\/s.*; from 700 kW at 2 m\/s down to 650 kW at 2\.2 m\/s/);
	});

	it('says nothing for a steady rise, a flat stretch, or a fall above rated power', () => {
		// Steady and flat: the shape IEC TS 62600-200 curves take; the fall after 2.5 m/s is above rated (easing towards cut-out).
		expect(powerCurveDipWarning(curve([[0.5, 0], [1.5, 300], [2, 300], [2.5, 1000], [3, 950], [3.5, 1000], [4, 0]]))).toBeNull();
		// A measured curve from the examples: monotonic to 1000 kW at 2.2 m/s.
		expect(powerCurveDipWarning(curve([[0.4, 0], [0.6, 20], [0.8, 60], [1, 125], [2.2, 1000], [3, 1000]]))).toBeNull();
		expect(powerCurveDipWarning(curve([[0.5, 0], [1, 0]]))).toBeNull();
	});

	it('stops at the given rated power, which can come before the curve maximum', () => {
		// Rated 800 kW given: it is reached at 2 m/s, so the wobble at 2.2 to 2.4 m/s lies above rated.
		const points = curve([[0.5, 0], [2, 800], [2.2, 850], [2.3, 820], [2.4, 900]]);
		expect(powerCurveDips(points, 800)).toEqual([]);
		expect(powerCurveDips(points)).toHaveLength(1);
	});
});
