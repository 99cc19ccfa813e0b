import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { atbCase } from '../testing/fixtures';
import { estimateEnergy } from './yield';
import { waveEnergyFluxKWPerM } from './wave';

describe('estimateEnergy', () => {
	it('doubles the energy when the device count doubles', () => {
		// CHECK-VALUES property: AEP is proportional to the number of identical devices (array loss held).
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 50 }), fc.double({ min: 0.8, max: 3.5, noNaN: true }), fc.double({ min: 1.2, max: 4, noNaN: true }), (count, meanSpeed, shape) => {
				const device = { kind: 'rotor', rotorDiameterM: 18, powerCoefficient: 0.4, ratedPowerKW: 1000, cutOutSpeedMPerS: 5 };
				const resource = { kind: 'weibull', scaleMPerS: meanSpeed, shape };
				const one = estimateEnergy(atbCase({ device, resource, array: { deviceCount: count } }));
				const two = estimateEnergy(atbCase({ device, resource, array: { deviceCount: 2 * count } }));
				// Equal to decimal rounding (30 significant digits).
				return two.netAepMWh.div(one.netAepMWh).minus(2).abs().lt(1e-25) && two.installedCapacityKW.eq(one.installedCapacityKW.times(2));
			}),
			{ numRuns: 40 }
		);
	});

	it('never puts P90 above P50', () => {
		// CHECK-VALUES property: P90 <= P50 for any combined sigma.
		fc.assert(
			fc.property(fc.array(fc.double({ min: 0, max: 0.5, noNaN: true }), { maxLength: 5 }), (sigmas) => {
				const e = estimateEnergy(atbCase({ uncertainty: { components: sigmas.map((sigma, i) => ({ name: `u${i}`, sigma })) } }));
				return e.p90AepMWh.lte(e.netAepMWh);
			}),
			{ numRuns: 40 }
		);
	});

	it('uses the distribution, not the cube of the mean speed', () => {
		// Rayleigh EPF 6/pi (CHECK-VALUES): below rated power, mean power = EPF x power at the mean speed.
		const device = { kind: 'rotor', rotorDiameterM: 20, powerCoefficient: 0.4, ratedPowerKW: 100000, cutOutSpeedMPerS: 50 };
		const e = estimateEnergy(atbCase({ device, resource: { kind: 'rayleigh', meanSpeedMPerS: 1, binWidthMPerS: 0.002 } }));
		const atMean = 0.5 * 1025 * Math.PI * 100 * 0.4 / 1000; // kW at 1 m/s
		expect(e.meanDevicePowerKW.toNumber() / atMean).toBeCloseTo(6 / Math.PI, 4);
	});

	it('turns a peak-period scatter into energy periods and prices the sea states with the flux', () => {
		// Te = 0.9 Tp (the usual rule, CHECK-VALUES); capture width: P = CWR x B x J (IEC TS 62600-100).
		const s = atbCase({
			technology: 'wave',
			resource: { kind: 'sea-state-table', periodType: 'peak-period', teOverTp: 0.9, states: [{ hsM: 2, periodS: 10, occurrence: 1 }] },
			device: { kind: 'capture-width', captureWidthRatio: 0.25, characteristicWidthM: 20, ratedPowerKW: 1000 }
		});
		const e = estimateEnergy(s);
		const flux = waveEnergyFluxKWPerM(2, 9, 1025, 9.80665);
		expect(e.bins[0].teS!.toString()).toBe('9');
		expect(e.meanDevicePowerKW.toNumber()).toBeCloseTo(flux.toNumber() * 0.25 * 20, 10);
		expect(e.netAepMWh.toNumber()).toBeCloseTo((flux.toNumber() * 5 * 8760) / 1000, 8);
	});

	it('warns about sea states outside the power matrix and gives them no power', () => {
		const s = atbCase({
			technology: 'wave',
			resource: {
				kind: 'sea-state-table',
				states: [
					{ hsM: 1, periodS: 7, occurrence: 0.75 },
					{ hsM: 8, periodS: 7, occurrence: 0.25 }
				]
			},
			device: { kind: 'power-matrix', hsM: [1, 2], periodS: [6, 8], powerKW: [[100, 100], [200, 200]] }
		});
		const e = estimateEnergy(s);
		expect(e.meanDevicePowerKW.toString()).toBe('75');
		expect(e.warnings.join(' ')).toMatch(/25 % of the time falls in sea states outside the power matrix/);
	});
});
