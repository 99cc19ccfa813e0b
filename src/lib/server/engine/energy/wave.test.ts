import { describe, expect, it } from 'vitest';
import { dec } from '../decimal';
import { captureWidthPowerKW, matrixCoverageWarning, powerMatrixCoverage, powerMatrixKW, powerMatrixRatedPowerKW, waveEnergyFluxKWPerM, waveFluxFunction } from './wave';

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

describe('waveEnergyFluxKWPerM at a finite depth', () => {
	it('is rho g (Hs^2/16) Cg with the finite-depth group velocity', () => {
		// CHECK-VALUES: Cg(T 10 s, h 20 m, g 9.81) = 9.27450 m/s. Hand calculation, Hs 2 m, rho 1025:
		// 1025 x 9.81 x 4 / 16 x 9.27450 = 2513.8125 x 9.27450 = 23,314.4 W/m.
		expect(waveEnergyFluxKWPerM(2, 10, 1025, 9.81, 20).toNumber()).toBeCloseTo(23.3144, 3);
		// Without a depth it is the deep-water form exactly: 2513.8125 x 7.806550 = 19,624.2 W/m.
		expect(waveEnergyFluxKWPerM(2, 10, 1025, 9.81).toNumber()).toBeCloseTo(19.6242, 4);
	});

	it('shows the deep form 16 % low for 10 s waves at 20 m and 23 % high at 5 m', () => {
		// The figures from linear theory (g 9.81): J_finite/J_deep = Cg/Cg0 = 9.27450/7.80655 = 1.18804 at 20 m,
		// so J_deep = 0.8417 J_finite (15.8 % low); at 5 m kh = 0.4642, Cg = 6.32675 m/s, ratio 0.81044,
		// so J_deep = 1.2339 J_finite (23.4 % high).
		const ratio = (h: number) => waveEnergyFluxKWPerM(1, 10, 1025, 9.81, h).div(waveEnergyFluxKWPerM(1, 10, 1025, 9.81)).toNumber();
		expect(ratio(20)).toBeCloseTo(1.18804, 5);
		expect(1 - 1 / ratio(20)).toBeCloseTo(0.158, 3);
		expect(ratio(5)).toBeCloseTo(0.81044, 5);
		expect(1 / ratio(5) - 1).toBeCloseTo(0.234, 3);
	});

	it('keeps existing deep-water numbers unchanged to the last digit when no depth is given', () => {
		const deep = waveFluxFunction(1025, 9.80665);
		const noDepth = waveFluxFunction(1025, 9.80665, undefined);
		expect(noDepth(dec(2.5), dec(9.3)).toString()).toBe(deep(dec(2.5), dec(9.3)).toString());
		// In 4000 m of water an 8 s sea is deep: the same flux to 1e-12 relative.
		const veryDeep = waveFluxFunction(1025, 9.80665, 4000)(dec(2), dec(8)).toNumber();
		expect(Math.abs(veryDeep / deep(dec(2), dec(8)).toNumber() - 1)).toBeLessThan(1e-12);
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

describe('powerMatrixCoverage', () => {
	const matrix = { hsM: [1, 2, 3] };
	const te = [6, 7, 8];
	const state = (hsM: number, teS: number, p: number) => ({ hsM: dec(hsM), teS: dec(teS), probability: dec(p) });
	it('splits the uncovered share by side, counting a corner state on both', () => {
		// Cells reach half a spacing beyond the centres: Hs 0.5..3.5 m, Te 5.5..8.5 s.
		const c = powerMatrixCoverage(matrix, te, [state(2, 7, 0.9), state(4, 7, 0.05), state(2, 5, 0.02), state(4, 9, 0.01), state(0.2, 7, 0.02)]);
		expect(c.outside.toString()).toBe('0.1');
		expect(c.hsAbove.toString()).toBe('0.06');
		expect(c.hsBelow.toString()).toBe('0.02');
		expect(c.periodBelow.toString()).toBe('0.02');
		expect(c.periodAbove.toString()).toBe('0.01');
		expect(c.edges).toEqual({ hsLow: 0.5, hsHigh: 3.5, teLow: 5.5, teHigh: 8.5 });
		// Within the half-cell margin counts as covered.
		expect(powerMatrixCoverage(matrix, te, [state(3.5, 8.5, 1)]).outside.toString()).toBe('0');
	});
});

describe('matrixCoverageWarning', () => {
	const matrix = { hsM: [1, 2, 3] };
	const te = [6, 7, 8];
	const state = (hsM: number, teS: number, p: number) => ({ hsM: dec(hsM), teS: dec(teS), probability: dec(p) });
	it('names the share and the sides, largest first, above 1 % of the hours', () => {
		const warning = matrixCoverageWarning(powerMatrixCoverage(matrix, te, [state(2, 7, 0.95), state(4, 7, 0.03), state(2, 5, 0.02)]));
		expect(warning).toBe(
			'5 % of the time falls in sea states outside the power matrix, which give no power: 3 % with Hs above it (over 3.5 m), 2 % with energy periods Te below it (under 5.5 s).'
		);
	});
	it('stays quiet at 1 % or less and speaks just above', () => {
		expect(matrixCoverageWarning(powerMatrixCoverage(matrix, te, [state(2, 7, 0.99), state(4, 7, 0.01)]))).toBeNull();
		expect(matrixCoverageWarning(powerMatrixCoverage(matrix, te, [state(2, 7, 0.989), state(2, 9, 0.011)]))).toMatch(
			/^1\.1 % of the time .*: 1\.1 % with energy periods Te above it \(over 8\.5 s\)\.$/
		);
	});
});
