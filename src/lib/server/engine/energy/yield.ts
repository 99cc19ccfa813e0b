/**
 * Annual energy of the array: the device's power over the resource
 * distribution, times hours, device count and losses; then P50, P90 and other
 * exceedance levels. Power in kW, energy in MWh.
 */
import { dec, Decimal, ZERO } from '../decimal';
import type { Scenario } from '../../../schemas/scenario';
import { energyPeriodFromPeakPeriod, normaliseOccurrences, rayleighBins, weibullBins, type FlowBin, type SeaStateBin } from './distributions';
import { flowDeviceRatedPowerKW, powerCurveDipWarning, powerCurveKW, rotorPowerFunction } from './current';
import { captureWidthPowerKW, matrixCoverageWarning, powerMatrixCoverage, powerMatrixFunction, powerMatrixRatedPowerKW, waveFluxFunction } from './wave';
import { netLossFactor } from './losses';
import {
	combinedSigma,
	EXCEEDANCE_HORIZON_YEARS,
	exceedanceFactor,
	horizonExceedanceFactor,
	horizonSigma,
	sigmaFromExceedance,
	splitSigmas,
	type UncertaintyKind,
	type UncertaintySplit
} from './uncertainty';

export type EnergyBin = {
	/** Flow bins: centre speed. */
	speedMPerS?: Decimal;
	/** Sea states: Hs, energy period and the flux at the site's water depth (deep water when none is given). */
	hsM?: Decimal;
	teS?: Decimal;
	fluxKWPerM?: Decimal;
	probability: Decimal;
	hours: Decimal;
	devicePowerKW: Decimal;
	/** Gross energy of the whole array from this bin, before losses, MWh/yr. */
	arrayGrossEnergyMWh: Decimal;
};

export type Exceedance = { levelPercent: number; factor: Decimal; aepMWh: Decimal };

/** Exceedance levels of the mean annual energy over a horizon of some years. */
export type HorizonExceedances = { horizonYears: number; sigma: Decimal; levels: Exceedance[] };

export type EnergyEstimate = {
	ratedPowerPerDeviceKW: Decimal;
	installedCapacityKW: Decimal;
	meanDevicePowerKW: Decimal;
	/** Array energy before losses, MWh/yr. */
	grossAepMWh: Decimal;
	lossFactor: Decimal;
	/** P50 net energy of operating year 1 (before degradation), MWh/yr. */
	netAepMWh: Decimal;
	/** One-year sigma: all components, root sum of squares. */
	combinedSigma: Decimal;
	/** Sigma of each kind, for exceedance over other horizons (see energyFactor). */
	uncertaintySplit: UncertaintySplit;
	/** One-year exceedance levels (the same as exceedancesByHorizon's first). */
	exceedances: Exceedance[];
	exceedancesByHorizon: HorizonExceedances[];
	p90AepMWh: Decimal;
	/** How the energy was found: from the resource and the device, or given by an assessment. */
	energySource: 'resource-and-device' | 'assessed';
	/** Net AEP over installed capacity x hours in a year. */
	capacityFactor: Decimal | null;
	bins: EnergyBin[];
	warnings: string[];
};

function flowBins(scenario: Scenario, warnings: string[]): FlowBin[] {
	const r = scenario.resource;
	if (r.kind === 'weibull') return weibullBins(r.scaleMPerS, r.shape, r.binWidthMPerS, warnings);
	if (r.kind === 'rayleigh') return rayleighBins(r.meanSpeedMPerS, r.binWidthMPerS, warnings);
	if (r.kind !== 'speed-histogram') return [];
	const probabilities = normaliseOccurrences(r.bins.map((b) => b.occurrence));
	if (!probabilities) {
		warnings.push('The speed histogram has no occurrences (all zero): energy is zero.');
		return [];
	}
	checkOccurrenceTotal(r.occurrenceBasis, r.bins.map((b) => b.occurrence), scenario.hoursPerYear, 'speed histogram', warnings);
	return r.bins.map((b, i) => ({ speedMPerS: dec(b.speedMPerS), probability: probabilities[i] }));
}

function seaStateBins(scenario: Scenario, warnings: string[]): SeaStateBin[] {
	const r = scenario.resource;
	if (r.kind === 'sea-state') {
		const te = r.periodType === 'peak-period' ? energyPeriodFromPeakPeriod(r.periodS, r.teOverTp) : dec(r.periodS);
		return [{ hsM: dec(r.hsM), teS: te, probability: dec(1) }];
	}
	if (r.kind !== 'sea-state-table') return [];
	const probabilities = normaliseOccurrences(r.states.map((s) => s.occurrence));
	if (!probabilities) {
		warnings.push('The sea-state table has no occurrences (all zero): energy is zero.');
		return [];
	}
	checkOccurrenceTotal(r.occurrenceBasis, r.states.map((s) => s.occurrence), scenario.hoursPerYear, 'sea-state table', warnings);
	// A table repeats a dozen heights and periods: each is made a decimal once (and shared, so the flux and the
	// matrix lookup can keep what they work out per value).
	const once = <K>(make: (key: K) => Decimal) => {
		const made = new Map<K, Decimal>();
		return (key: K) => {
			let value = made.get(key);
			if (value === undefined) made.set(key, (value = make(key)));
			return value;
		};
	};
	const height = once((hs: number) => dec(hs));
	const period = once((p: number) => (r.periodType === 'peak-period' ? energyPeriodFromPeakPeriod(p, r.teOverTp) : dec(p)));
	return r.states.map((s, i) => ({ hsM: height(s.hsM), teS: period(s.periodS), probability: probabilities[i] }));
}

function checkOccurrenceTotal(basis: 'hours' | 'probability', values: number[], hoursPerYear: number, what: string, warnings: string[]) {
	const total = values.reduce((a, b) => a + b, 0);
	const expected = basis === 'hours' ? hoursPerYear : 1;
	if (Math.abs(total - expected) > 0.01 * expected) {
		warnings.push(`The ${what} occurrences sum to ${total} rather than ${expected} ${basis}; they were normalised to sum to 1.`);
	}
}

/** Evaluate the device over the resource: power per bin, then energy per bin. */
function binsWithPower(scenario: Scenario, warnings: string[]): { bins: EnergyBin[]; ratedKW: Decimal } {
	const hours = dec(scenario.hoursPerYear);
	const devicesPerThousand = dec(scenario.array.deviceCount).div(1000);
	const withEnergy = (bin: Omit<EnergyBin, 'hours' | 'arrayGrossEnergyMWh'>): EnergyBin => {
		const binHours = bin.probability.times(hours);
		return { ...bin, hours: binHours, arrayGrossEnergyMWh: bin.devicePowerKW.times(binHours).times(devicesPerThousand) };
	};
	const { device, site } = scenario;
	if (device.kind === 'rotor' || device.kind === 'power-curve') {
		const power = device.kind === 'rotor' ? rotorPowerFunction(device, site.waterDensityKgPerM3) : (v: Decimal) => powerCurveKW(device.points, v);
		const bins = flowBins(scenario, warnings).map((b) =>
			withEnergy({ speedMPerS: b.speedMPerS, probability: b.probability, devicePowerKW: power(b.speedMPerS) })
		);
		const dip = device.kind === 'power-curve' ? powerCurveDipWarning(device.points, device.ratedPowerKW) : null;
		if (dip) warnings.push(dip);
		return { bins, ratedKW: flowDeviceRatedPowerKW(device) };
	}
	const teAxis =
		device.kind !== 'power-matrix'
			? []
			: device.periodType === 'peak-period'
				? device.periodS.map((p) => energyPeriodFromPeakPeriod(p, device.teOverTp))
				: device.periodS;
	const fluxOf = waveFluxFunction(site.waterDensityKgPerM3, site.gravityMPerS2, site.waterDepthM);
	const lookup = device.kind === 'power-matrix' ? powerMatrixFunction(device, teAxis) : null;
	const states = seaStateBins(scenario, warnings);
	const bins = states.map((s) => {
		const flux = fluxOf(s.hsM, s.teS);
		let powerKW: Decimal;
		if (device.kind === 'capture-width') powerKW = captureWidthPowerKW(device, flux);
		else powerKW = (lookup ? lookup(s.hsM, s.teS) : null) ?? ZERO;
		return withEnergy({ hsM: s.hsM, teS: s.teS, fluxKWPerM: flux, probability: s.probability, devicePowerKW: powerKW });
	});
	const uncovered = device.kind === 'power-matrix' ? matrixCoverageWarning(powerMatrixCoverage(device, teAxis, states)) : null;
	if (uncovered) warnings.push(uncovered);
	const ratedKW = device.kind === 'power-matrix' ? powerMatrixRatedPowerKW(device) : dec(device.ratedPowerKW);
	return { bins, ratedKW };
}

/** Rated power of one device, kW: the given rating, or the curve or matrix maximum. */
function deviceRatedPowerKW(device: Scenario['device']): Decimal {
	if (device.kind === 'rotor' || device.kind === 'power-curve') return flowDeviceRatedPowerKW(device);
	if (device.kind === 'power-matrix') return powerMatrixRatedPowerKW(device);
	return dec(device.ratedPowerKW);
}

type AssessedEnergy = Extract<Scenario['resource'], { kind: 'assessed-energy' }>;

/**
 * The uncertainty components: the scenario's own, and for an assessed energy
 * the assessment's (a given P90 or total sigma counts as long-term; see
 * sigmaFromExceedance for a P90).
 */
export function uncertaintyComponents(
	scenario: Scenario,
	assessed: AssessedEnergy | null = scenario.resource.kind === 'assessed-energy' ? scenario.resource : null
): { sigma: Decimal; kind: UncertaintyKind }[] {
	const components = scenario.uncertainty.components.map((c) => ({ sigma: dec(c.sigma), kind: c.kind }));
	if (!assessed) return components;
	const own: { sigma: Decimal; kind: UncertaintyKind }[] = [];
	if (assessed.p90MWh !== undefined) own.push({ sigma: sigmaFromExceedance(assessed.p50MWh, assessed.p90MWh, 90), kind: 'long-term' });
	if (assessed.sigma !== undefined) own.push({ sigma: dec(assessed.sigma), kind: 'long-term' });
	if (assessed.longTermSigma !== undefined) own.push({ sigma: dec(assessed.longTermSigma), kind: 'long-term' });
	if (assessed.interAnnualSigma !== undefined) own.push({ sigma: dec(assessed.interAnnualSigma), kind: 'inter-annual' });
	return [...own, ...components];
}

/**
 * Annual energy estimate.
 *
 *     gross AEP = N_devices x hours/yr x sum_i p_i P(bin_i) / 1000        (MWh)
 *               = the assessed P50 for an assessed-energy resource (already net)
 *     net AEP (P50) = gross AEP x loss factor
 *     Pxx,N = P50 x max(0, 1 - z_xx sigma_N),  sigma_N = sqrt(sigma_LT^2 + sigma_IAV^2 / N)
 *     capacity factor = net AEP / (installed kW x hours / 1000)
 *
 * For an assessed energy the schema holds the losses at their no-loss values,
 * so the loss factor is 1; a sensitivity run that lowers availability still
 * scales the assessed energy. Source: IEC TS 62600-100 / -200 (mean annual
 * energy from power matrix or power curve times the resource occurrence);
 * losses and exceedance levels as in ./losses and ./uncertainty.
 */
export function estimateEnergy(scenario: Scenario): EnergyEstimate {
	const warnings: string[] = [];
	const assessed = scenario.resource.kind === 'assessed-energy' ? scenario.resource : null;
	const { bins, ratedKW } = assessed ? { bins: [] as EnergyBin[], ratedKW: deviceRatedPowerKW(scenario.device) } : binsWithPower(scenario, warnings);
	let grossAep = assessed ? dec(assessed.p50MWh) : ZERO;
	let meanPower = ZERO;
	for (const b of bins) {
		grossAep = grossAep.plus(b.arrayGrossEnergyMWh);
		meanPower = meanPower.plus(b.devicePowerKW.times(b.probability));
	}
	// Assessed: the mean (net) power of one device that delivers the P50.
	if (assessed) meanPower = grossAep.times(1000).div(dec(scenario.hoursPerYear).times(scenario.array.deviceCount));
	const lossFactor = netLossFactor(scenario.array);
	const netAep = grossAep.times(lossFactor);

	const components = uncertaintyComponents(scenario, assessed);
	// The one-year sigma is the plain root sum of squares of every component (the same number as before horizons).
	const sigma = combinedSigma(components.map((c) => c.sigma));
	const split = splitSigmas(components);
	const levels = [...new Set([90, ...scenario.uncertainty.exceedanceLevels])].sort((a, b) => a - b);
	const exceedancesByHorizon = EXCEEDANCE_HORIZON_YEARS.map((horizonYears) => {
		const sigmaN = horizonYears === 1 ? sigma : horizonSigma(split, horizonYears);
		const atLevels = levels.map((levelPercent) => {
			const factor = exceedanceFactor(levelPercent, sigmaN);
			return { levelPercent, factor, aepMWh: netAep.times(factor) };
		});
		return { horizonYears, sigma: sigmaN, levels: atLevels };
	});
	const exceedances = exceedancesByHorizon[0].levels;

	const installedKW = ratedKW.times(scenario.array.deviceCount);
	const capacityMWhPerYear = installedKW.times(scenario.hoursPerYear).div(1000);
	const capacityFactor = capacityMWhPerYear.isZero() ? null : netAep.div(capacityMWhPerYear);
	if (netAep.isZero()) warnings.push('Net annual energy is zero: LCOE and energy-based metrics are undefined.');
	if (assessed && capacityFactor?.gt(1)) {
		warnings.push(
			`The assessed P50 is more than the installed capacity can deliver in a year (capacity factor ${capacityFactor.times(100).toDecimalPlaces(1).toString()} %): check the P50, the rated power and the device count.`
		);
	}
	if (assessed && scenario.uncertainty.components.length > 0) {
		warnings.push(
			`The ${scenario.uncertainty.components.length === 1 ? 'uncertainty component is' : `${scenario.uncertainty.components.length} uncertainty components are`} combined with the assessment's own uncertainty: list only what the assessment leaves out.`
		);
	}
	return {
		ratedPowerPerDeviceKW: ratedKW,
		installedCapacityKW: installedKW,
		meanDevicePowerKW: meanPower,
		grossAepMWh: grossAep,
		lossFactor,
		netAepMWh: netAep,
		combinedSigma: sigma,
		uncertaintySplit: split,
		exceedances,
		exceedancesByHorizon,
		p90AepMWh: exceedances.find((e) => e.levelPercent === 90)!.aepMWh,
		energySource: assessed ? 'assessed' : 'resource-and-device',
		capacityFactor,
		bins,
		warnings
	};
}

/**
 * Share of the P50 energy exceeded with probability `levelPercent` % by the
 * mean annual energy over `horizonYears`: what debt sizing multiplies each
 * year's P50 energy by to size on, say, the one-year P90.
 *
 *     f = max(0, 1 - z_xx sqrt(sigma_LT^2 + sigma_IAV^2 / N))
 *
 * Source: ./uncertainty horizonExceedanceFactor. Example: sigma_LT 8 %,
 * sigma_IAV 6 %: P90 over 1 year 0.871845, over 10 years 0.894632.
 */
export function energyFactor(energy: Pick<EnergyEstimate, 'uncertaintySplit'>, levelPercent: number, horizonYears: number): Decimal {
	return horizonExceedanceFactor(levelPercent, horizonYears, energy.uncertaintySplit);
}
