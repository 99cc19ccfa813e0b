import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { atbCase } from '../testing/fixtures';
import { energyFactor, estimateEnergy } from './yield';
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
		expect(e.warnings.join(' ')).toMatch(/: 25 % with Hs above it \(over 2\.5 m\)\./);
	});

	it('prices sea states with the flux at the site depth, in the bins and for capture-width power', () => {
		// CHECK-VALUES: Cg(T 10 s, h 20 m, g 9.81) = 9.27450 m/s; J = 1025 x 9.81 x 2^2 / 16 x 9.27450 = 23.3144 kW/m.
		const wave = (waterDepthM?: number) =>
			atbCase({
				technology: 'wave',
				site: { waterDensityKgPerM3: 1025, gravityMPerS2: 9.81, ...(waterDepthM === undefined ? {} : { waterDepthM }) },
				resource: { kind: 'sea-state', hsM: 2, periodS: 10 },
				device: { kind: 'capture-width', captureWidthRatio: 0.25, characteristicWidthM: 20, ratedPowerKW: 1000 }
			});
		const shelf = estimateEnergy(wave(20));
		expect(shelf.bins[0].fluxKWPerM!.toNumber()).toBeCloseTo(23.3144, 3);
		expect(shelf.meanDevicePowerKW.toNumber()).toBeCloseTo(23.3144 * 0.25 * 20, 2);
		// Deep water (no depth): the deep-water flux, 19.6242 kW/m; the ratio is Cg/Cg0 = 1.18804.
		const deep = estimateEnergy(wave());
		expect(deep.bins[0].fluxKWPerM!.toString()).toBe(waveEnergyFluxKWPerM(2, 10, 1025, 9.81).toString());
		expect(shelf.netAepMWh.div(deep.netAepMWh).toNumber()).toBeCloseTo(1.18804, 5);
	});

	it('widens Weibull bins too fine for the cap instead of losing the tail, and says so', () => {
		const flow = (binWidthMPerS: number) => estimateEnergy(atbCase({ resource: { kind: 'weibull', scaleMPerS: 2.2, shape: 2.2, binWidthMPerS } }));
		const usual = flow(0.1);
		for (const width of [0.0001, 0.00001]) {
			const fine = flow(width);
			// The same energy to 0.1 % (bin-centre error of the 0.1 m/s bins), where before most or all of it was lost.
			expect(Math.abs(fine.netAepMWh.div(usual.netAepMWh).toNumber() - 1)).toBeLessThan(1e-3);
			expect(fine.warnings.join(' ')).toMatch(new RegExp(`bins of ${width} m/s would take more than 10,000 bins .* were used instead`));
		}
		expect(usual.warnings.join(' ')).not.toMatch(/were used instead/);
	});
});

describe('estimateEnergy: exceedance horizons', () => {
	it('keeps the one-year levels and gives equal horizons when every uncertainty is long-term', () => {
		// Existing documents have no inter-annual component: P90 over ten years is P90 over one year.
		const e = estimateEnergy(atbCase({ uncertainty: { components: [{ name: 'Resource', sigma: 0.06 }, { name: 'Power', sigma: 0.08 }] } }));
		const [one, ten] = e.exceedancesByHorizon;
		expect([one.horizonYears, ten.horizonYears]).toEqual([1, 10]);
		expect(one.levels).toEqual(e.exceedances);
		expect(ten.levels.map((l) => l.aepMWh.toString())).toEqual(one.levels.map((l) => l.aepMWh.toString()));
		// RSS of 6 % and 8 % is 10 %; P90 = 30,660 x (1 - 1.2815515655 x 0.1) = 26,730.7629 MWh (z from the standard normal table).
		expect(e.combinedSigma.toString()).toBe('0.1');
		expect(e.p90AepMWh.toNumber()).toBeCloseTo(30_660 * (1 - 1.2815515655446004 * 0.1), 6);
	});

	it('lets the inter-annual part average out over ten years', () => {
		// sigma_LT 8 %, sigma_IAV 6 % (common practice: sigma_N = sqrt(sigma_LT^2 + sigma_IAV^2 / N)):
		// 1 year  sigma 0.1,          P90 = 30,660 x 0.8718448434 = 26,730.7629
		// 10 years sigma 0.0822192192, P90 = 30,660 x 0.8946318310 = 27,429.4119
		const e = estimateEnergy(
			atbCase({ uncertainty: { components: [{ name: 'Model', sigma: 0.08 }, { name: 'Year to year', sigma: 0.06, kind: 'inter-annual' }], exceedanceLevels: [75, 90] } })
		);
		const [one, ten] = e.exceedancesByHorizon;
		expect(one.sigma.toString()).toBe('0.1');
		expect(ten.sigma.toNumber()).toBeCloseTo(0.0822192191643779, 15);
		expect(one.levels.find((l) => l.levelPercent === 90)!.aepMWh.toNumber()).toBeCloseTo(26_730.7629, 3);
		expect(ten.levels.find((l) => l.levelPercent === 90)!.aepMWh.toNumber()).toBeCloseTo(27_429.4119, 3);
		expect(ten.levels.map((l) => l.levelPercent)).toEqual([75, 90]);
		expect(e.uncertaintySplit.longTerm.toString()).toBe('0.08');
		expect(e.uncertaintySplit.interAnnual.toString()).toBe('0.06');
	});
});

describe('estimateEnergy on a power curve that dips', () => {
	it('warns once, naming the speeds of the dip, and not for the same curve without it', () => {
		// Hand-made curve: 300 kW at 1.5 m/s falls to 250 kW at 1.75 m/s before rising to 1000 kW (see current.ts powerCurveDips).
		const points = [
			{ speedMPerS: 0.5, powerKW: 0 },
			{ speedMPerS: 1.5, powerKW: 300 },
			{ speedMPerS: 1.75, powerKW: 250 },
			{ speedMPerS: 2.5, powerKW: 1000 },
			{ speedMPerS: 3.5, powerKW: 1000 }
		];
		const dipping = estimateEnergy(atbCase({ device: { kind: 'power-curve', points } }));
		const dipWarnings = dipping.warnings.filter((w) => w.startsWith('The power curve falls and rises again'));
		expect(dipWarnings).toHaveLength(1);
		expect(dipWarnings[0]).toContain('at 1.5 m/s down to 250 kW at 1.75 m/s');
		const steady = estimateEnergy(atbCase({ device: { kind: 'power-curve', points: points.map((p) => (p.speedMPerS === 1.75 ? { ...p, powerKW: 400 } : p)) } }));
		expect(steady.warnings.some((w) => w.includes('falls and rises again'))).toBe(false);
	});
});

describe('energyFactor', () => {
	it('gives the share of P50 for a level and a horizon, as the reported levels do', () => {
		const e = estimateEnergy(
			atbCase({ uncertainty: { components: [{ name: 'Model', sigma: 0.08 }, { name: 'Year to year', sigma: 0.06, kind: 'inter-annual' }] } })
		);
		// 1 - 1.2815515655 x 0.1 = 0.8718448434; 1 - 1.2815515655 x 0.0822192192 = 0.8946318310.
		expect(energyFactor(e, 90, 1).toNumber()).toBeCloseTo(0.8718448434, 10);
		expect(energyFactor(e, 90, 10).toNumber()).toBeCloseTo(0.894631831, 9);
		expect(energyFactor(e, 90, 10).times(e.netAepMWh).minus(e.exceedancesByHorizon[1].levels.find((l) => l.levelPercent === 90)!.aepMWh).abs().lt(1e-20)).toBe(true);
	});
});

describe('estimateEnergy: assessed energy', () => {
	const assessed = (resource: Record<string, unknown>, patch: Record<string, unknown> = {}) =>
		estimateEnergy(atbCase({ resource: { kind: 'assessed-energy', p50MWh: 30_000, ...resource }, device: { kind: 'power-curve', ratedPowerKW: 10_000, points: [{ speedMPerS: 0.5, powerKW: 0 }, { speedMPerS: 2, powerKW: 10_000 }] }, ...patch }));

	it('takes the given P50 as the net energy and the given P90 as it is', () => {
		// Given P50 30,000 MWh, P90 26,000 MWh: sigma = (1 - 26,000 / 30,000) / 1.2815515655 = 0.1040358;
		// capacity factor = 30,000 / (10,000 kW x 8760 h / 1000) = 30,000 / 87,600 = 0.3424658.
		const e = assessed({ p90MWh: 26_000 });
		expect(e.energySource).toBe('assessed');
		expect(e.netAepMWh.toString()).toBe('30000');
		expect(e.grossAepMWh.toString()).toBe('30000');
		expect(e.lossFactor.toString()).toBe('1');
		expect(e.p90AepMWh.toNumber()).toBeCloseTo(26_000, 9);
		expect(e.combinedSigma.toNumber()).toBeCloseTo((1 - 26 / 30) / 1.2815515655446004, 12);
		expect(e.capacityFactor!.toNumber()).toBeCloseTo(30_000 / 87_600, 14);
		expect(e.installedCapacityKW.toString()).toBe('10000');
		expect(e.bins).toEqual([]);
		// Mean net power of the one device: 30,000 MWh x 1000 / 8760 h = 3424.658 kW.
		expect(e.meanDevicePowerKW.toNumber()).toBeCloseTo(30_000_000 / 8760, 9);
	});

	it('takes a total sigma, or the split into inter-annual and long-term', () => {
		// sigma 10 %: P90 = 30,000 x (1 - 1.2815515655 x 0.1) = 26,155.3453 MWh, over both horizons.
		const total = assessed({ sigma: 0.1 });
		expect(total.p90AepMWh.toNumber()).toBeCloseTo(26_155.3453, 3);
		expect(total.exceedancesByHorizon[1].levels[0].aepMWh.eq(total.p90AepMWh)).toBe(true);
		// Split 6 % inter-annual and 8 % long-term: one year 26,155.3453, ten years 30,000 x 0.8946318310 = 26,838.9549.
		const split = assessed({ interAnnualSigma: 0.06, longTermSigma: 0.08 });
		expect(split.p90AepMWh.toNumber()).toBeCloseTo(26_155.3453, 3);
		expect(split.exceedancesByHorizon[1].levels[0].aepMWh.toNumber()).toBeCloseTo(26_838.9549, 3);
	});

	it("adds the scenario's own components to the assessment's, with a warning", () => {
		// RSS: sqrt(0.06^2 + 0.08^2) = 0.1 (the assessment's 6 % with a further 8 %).
		const e = assessed({ sigma: 0.06 }, { uncertainty: { components: [{ name: 'Lender adjustment', sigma: 0.08 }] } });
		expect(e.combinedSigma.toString()).toBe('0.1');
		expect(e.warnings.join(' ')).toMatch(/combined with the assessment's own uncertainty/);
	});

	it('warns when the P50 is more than the installed capacity can make', () => {
		// 10,000 kW x 8760 h = 87,600 MWh a year at most.
		expect(assessed({ p50MWh: 90_000, sigma: 0.1 }).warnings.join(' ')).toMatch(/capacity factor 102\.7 %/);
	});
});
