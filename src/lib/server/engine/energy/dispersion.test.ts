import { describe, expect, it } from 'vitest';
import { groupVelocityDepthFactor, groupVelocityMPerS, waveNumberTimesDepth } from './dispersion';

describe('waveNumberTimesDepth', () => {
	it('matches the published wave numbers of a coastal wave toolbox', () => {
		// Deltares-research/wave-toolbox, tests/core_dispersion_test.py (validation data, g 9.81, to 1e-4 rad/m):
		// w 0.2, 0.3, 0.4, 0.5 rad/s at h 20 m: k 0.0145, 0.0221, 0.0302, 0.0390; at h 10 m: 0.0203, 0.0308, 0.0415, 0.0527.
		const published: [number, number[]][] = [
			[20, [0.0145, 0.0221, 0.0302, 0.039]],
			[10, [0.0203, 0.0308, 0.0415, 0.0527]]
		];
		for (const [h, ks] of published) {
			[0.2, 0.3, 0.4, 0.5].forEach((w, i) => {
				const k = waveNumberTimesDepth((2 * Math.PI) / w, h, 9.81) / h;
				expect(Math.abs(k - ks[i])).toBeLessThanOrEqual(0.5e-4 + 1e-12);
			});
		}
	});

	it('matches the published k of an oceanographic library and its inverse case', () => {
		// pyoceans/python-oceans, oceans/sw_extras/waves.py (doctest, g 9.81): h 10 m, T 5 s gives
		// k = 0.17170284445431747 rad/m; and the 100 m wave in 10 m of water has T = 10.724311778163298 s.
		expect(waveNumberTimesDepth(5, 10, 9.81) / 10).toBeCloseTo(0.17170284445431747, 12);
		expect(waveNumberTimesDepth(10.724311778163298, 10, 9.81)).toBeCloseTo((2 * Math.PI * 10) / 100, 12);
	});

	it('satisfies the dispersion relation to rounding in deep, intermediate and shallow water', () => {
		for (const [t, h] of [
			[4, 500],
			[10, 20],
			[12, 5],
			[600, 1],
			[0.5, 10000]
		]) {
			const x = waveNumberTimesDepth(t, h, 9.80665);
			const y = ((2 * Math.PI) / t) ** 2 * (h / 9.80665);
			expect(Math.abs(x * Math.tanh(x) - y) / y).toBeLessThan(1e-13);
		}
	});

	it('refuses a period or depth that is not positive', () => {
		expect(() => waveNumberTimesDepth(0, 10, 9.81)).toThrow(RangeError);
		expect(() => waveNumberTimesDepth(8, -1, 9.81)).toThrow(/water depth/);
	});
});

describe('groupVelocityMPerS', () => {
	it('gives 9.27450 m/s for 10 s waves in 20 m of water and 7.80655 m/s in deep water', () => {
		// CHECK-VALUES (derived from w^2 = g k tanh kh, g 9.81): Cg(T 10 s, h 20 m) = 9.27450; deep gT/(4 pi) = 7.80655.
		expect(groupVelocityMPerS(10, 20, 9.81).toNumber()).toBeCloseTo(9.2745, 5);
		expect(groupVelocityMPerS(10, undefined, 9.81).toNumber()).toBeCloseTo(7.80655, 5);
		// Hand calculation of the deep value: 9.81 x 10 / (4 x 3.14159265) = 98.1 / 12.5663706 = 7.806550.
		expect(groupVelocityMPerS(10, undefined, 9.81).toDecimalPlaces(6).toString()).toBe('7.80655');
	});

	it('matches the published group velocity of an oceanographic library', () => {
		// pyoceans/python-oceans, oceans/sw_extras/waves.py (doctest, g 9.81): h 10 m, T 5 s gives Cg = 4.470858193067349 m/s;
		// L 100 m in h 10 m (T 10.724311778163298 s) gives Cg = 8.291208888683515 m/s.
		expect(groupVelocityMPerS(5, 10, 9.81).toNumber()).toBeCloseTo(4.470858193067349, 10);
		expect(groupVelocityMPerS(10.724311778163298, 10, 9.81).toNumber()).toBeCloseTo(8.291208888683515, 10);
	});

	it('tends to sqrt(g h) in shallow water', () => {
		// Linear wave theory's long-wave limit: Cg = C = sqrt(g h) when kh -> 0. 1 m of water, 1000 s: sqrt(9.81) = 3.13209.
		const cg = groupVelocityMPerS(1000, 1, 9.81).toNumber();
		expect(Math.abs(cg - Math.sqrt(9.81)) / Math.sqrt(9.81)).toBeLessThan(1e-5);
		expect(groupVelocityMPerS(600, 4, 9.80665).toNumber()).toBeCloseTo(Math.sqrt(9.80665 * 4), 3);
	});
});

describe('groupVelocityDepthFactor', () => {
	it('is exactly 1 without a depth, and tends to 1 in deep water', () => {
		expect(groupVelocityDepthFactor(10, undefined, 9.81).toString()).toBe('1');
		// 8 s waves in 4000 m of water: kh = 251, tanh = 1 and 2kh/sinh 2kh = 0 in double precision.
		expect(groupVelocityDepthFactor(8, 4000, 9.81).toNumber()).toBeCloseTo(1, 15);
	});

	it('is within 2 % of deep water where h = L0/2, the usual deep-water rule', () => {
		// 10 s, g 9.81: L0 = g T^2 / (2 pi) = 156.131 m; at h = 78.066 m kh = 3.1531 and
		// Cg/Cg0 = tanh(3.1531) (1 + 6.3062 / sinh 6.3062) = 0.996357 x 1.023018 = 1.019291.
		const factor = groupVelocityDepthFactor(10, (9.81 * 100) / (4 * Math.PI), 9.81).toNumber();
		expect(factor).toBeCloseTo(1.019291, 6);
	});

	it('is 1.1997 at kh 1.2, near its peak', () => {
		// tanh(1.2) (1 + 2.4 / sinh 2.4) = 0.833655 x 1.439060 = 1.199679 (hand calculation; near the maximum of Cg/Cg0).
		const g = 9.81;
		const t = 10;
		const omega = (2 * Math.PI) / t;
		const h = (1.2 * Math.tanh(1.2) * g) / omega ** 2; // the depth at which kh = 1.2 for 10 s waves
		expect(waveNumberTimesDepth(t, h, g)).toBeCloseTo(1.2, 12);
		expect(groupVelocityDepthFactor(t, h, g).toNumber()).toBeCloseTo(1.199679, 6);
	});
});
