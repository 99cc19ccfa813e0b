import { describe, expect, it } from 'vitest';
import { dec } from '../decimal';
import { captureWidthPowerKW, powerMatrixKW, powerMatrixRatedPowerKW, waveEnergyFluxKWPerM } from './wave';

describe('waveEnergyFluxKWPerM', () => {
	it('matches the IEC TS 62600-101 deep-water flux check values with g = 9.81', () => {
		// J = rho g^2 Hs^2 Te / (64 pi), rho 1025, g 9.81 (CHECK-VALUES, derived):
		// Hs 2, Te 8: 1025 x 96.2361 x 4 x 8 / 201.0619 = 15699.4 W/m.
		expect(waveEnergyFluxKWPerM(2, 8, 1025, 9.81).toNumber()).toBeCloseTo(15.6994, 4);
		expect(waveEnergyFluxKWPerM(3, 10, 1025, 9.81).toNumber()).toBeCloseTo(44.1545, 4);
		expect(waveEnergyFluxKWPerM(1, 6, 1025, 9.81).toNumber()).toBeCloseTo(2.94363, 5);
	});
	it('gives 15.6886 kW/m with standard gravity 9.80665', () => {
		// CHECK-VALUES: the same Hs 2, Te 8 sea state with g = 9.80665 m/s^2.
		const flux = waveEnergyFluxKWPerM(2, 8, 1025, 9.80665);
		expect(flux.toNumber()).toBeCloseTo(15.6886, 4);
		// Hand calculation written out: 9.80665^2 = 96.17038422; x 1025 x 4 x 8 = 3,154,388.6;
		// / (64 pi = 201.0619298) = 15,688.6 W/m.
		expect((1025 * 9.80665 ** 2 * 4 * 8) / (64 * Math.PI) / 1000).toBeCloseTo(flux.toNumber(), 10);
	});
});

describe('powerMatrixKW', () => {
	const matrix = {
		hsM: [1, 2],
		powerKW: [
			[10, 30],
			[50, 90]
		],
		lookup: 'bilinear' as const
	};
	const te = [6, 8];
	it('interpolates bilinearly inside the matrix', () => {
		// Hand calculation: at Hs 1.5, Te 7: low row 10..30 -> 20, high row 50..90 -> 70; halfway -> 45.
		expect(powerMatrixKW(matrix, te, 1.5, 7)!.toString()).toBe('45');
		// At Hs 1.25, Te 6.5: low 10 + 0.25 x 20 = 15; high 50 + 0.25 x 40 = 60; 15 + 0.25 x 45 = 26.25.
		expect(powerMatrixKW(matrix, te, 1.25, 6.5)!.toString()).toBe('26.25');
	});
	it('takes the nearest cell in nearest mode', () => {
		expect(powerMatrixKW({ ...matrix, lookup: 'nearest' }, te, 1.2, 7.9)!.toString()).toBe('30');
		expect(powerMatrixKW({ ...matrix, lookup: 'nearest' }, te, 1.6, 6.2)!.toString()).toBe('50');
	});
	it('clamps within half a cell of the edge and gives null beyond', () => {
		expect(powerMatrixKW(matrix, te, 2.4, 8.5)!.toString()).toBe('90');
		expect(powerMatrixKW(matrix, te, 2.6, 7)).toBeNull();
		expect(powerMatrixKW(matrix, te, 1.5, 4.9)).toBeNull();
		expect(powerMatrixRatedPowerKW({ kind: 'power-matrix', periodType: 'energy-period', teOverTp: 0.9, periodS: te, ...matrix }).toString()).toBe('90');
	});
});

describe('captureWidthPowerKW', () => {
	it('is CWR x width x J, capped at rated', () => {
		// Definition (IEC TS 62600-100 capture width ratio): 0.2 x 20 m x 15 kW/m = 60 kW.
		const device = { kind: 'capture-width' as const, captureWidthRatio: 0.2, characteristicWidthM: 20, ratedPowerKW: 100 };
		expect(captureWidthPowerKW(device, dec(15)).toString()).toBe('60');
		expect(captureWidthPowerKW(device, dec(40)).toString()).toBe('100');
	});
});
