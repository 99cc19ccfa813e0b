/**
 * Starting values for the editor: a blank scenario per technology (round
 * placeholder figures that evaluate, to be replaced by the user's own), and
 * the first values of each resource, device, opex and debt variant when the
 * user switches to it.
 */
import {
	SCHEMA_VERSION,
	type DebtSpec,
	type Decommissioning,
	type DeviceSpec,
	type Grant,
	type OpexLine,
	type Resource,
	type ScenarioInput
} from '../schemas/scenario';
import type { Technology } from '../technology';

type Device = DeviceSpec;
type Debt = DebtSpec;

export const resourceKindsFor: Record<Technology, Resource['kind'][]> = {
	'tidal-stream': ['speed-histogram', 'weibull', 'rayleigh', 'assessed-energy'],
	'ocean-current': ['speed-histogram', 'weibull', 'rayleigh', 'assessed-energy'],
	wave: ['sea-state-table', 'sea-state', 'assessed-energy']
};

export const deviceKindsFor: Record<Technology, Device['kind'][]> = {
	'tidal-stream': ['rotor', 'power-curve'],
	'ocean-current': ['rotor', 'power-curve'],
	wave: ['capture-width', 'power-matrix']
};

export const resourceKindLabels: Record<Resource['kind'], string> = {
	'speed-histogram': 'Speed histogram',
	weibull: 'Weibull distribution',
	rayleigh: 'Rayleigh distribution',
	'sea-state-table': 'Sea-state table (scatter diagram)',
	'sea-state': 'Single sea state',
	'assessed-energy': 'Assessed net energy (P50 and P90 given)'
};

export const deviceKindLabels: Record<Device['kind'], string> = {
	rotor: 'Parametric rotor',
	'power-curve': 'Measured power curve',
	'capture-width': 'Capture-width ratio',
	'power-matrix': 'Power matrix'
};

export function resourceOfKind(kind: Resource['kind']): Resource {
	switch (kind) {
		case 'speed-histogram':
			return {
				kind,
				occurrenceBasis: 'probability',
				bins: [0.5, 1, 1.5, 2, 2.5, 3].map((speedMPerS, i) => ({ speedMPerS, occurrence: [0.2, 0.22, 0.2, 0.17, 0.13, 0.08][i] }))
			};
		case 'weibull':
			return { kind, scaleMPerS: 1.8, shape: 2, binWidthMPerS: 0.1 };
		case 'rayleigh':
			return { kind, meanSpeedMPerS: 1.5, binWidthMPerS: 0.1 };
		case 'sea-state-table':
			return {
				kind,
				periodType: 'energy-period',
				teOverTp: 0.9,
				occurrenceBasis: 'probability',
				states: [
					{ hsM: 1, periodS: 6, occurrence: 0.3 },
					{ hsM: 2, periodS: 8, occurrence: 0.4 },
					{ hsM: 3, periodS: 9, occurrence: 0.2 },
					{ hsM: 4, periodS: 10, occurrence: 0.1 }
				]
			};
		case 'sea-state':
			return { kind, periodType: 'energy-period', teOverTp: 0.9, hsM: 2, periodS: 8 };
		case 'assessed-energy':
			return { kind, p50MWh: 20000, p90MWh: 17500 };
	}
}

export function deviceOfKind(kind: Device['kind']): Device {
	switch (kind) {
		case 'rotor':
			return { kind, rotorDiameterM: 18, powerCoefficient: 0.4, driveTrainEfficiency: 0.9, cutInSpeedMPerS: 0.7, ratedPowerKW: 1000, cutOutSpeedMPerS: 4.5 };
		case 'power-curve':
			return {
				kind,
				points: [
					{ speedMPerS: 0.7, powerKW: 0 },
					{ speedMPerS: 1.5, powerKW: 300 },
					{ speedMPerS: 2.5, powerKW: 1000 },
					{ speedMPerS: 4.5, powerKW: 1000 }
				]
			};
		case 'capture-width':
			return { kind, captureWidthRatio: 0.2, characteristicWidthM: 20, ratedPowerKW: 750 };
		case 'power-matrix':
			return {
				kind,
				periodType: 'energy-period',
				teOverTp: 0.9,
				lookup: 'bilinear',
				hsM: [1, 2, 3],
				periodS: [6, 8, 10],
				powerKW: [
					[40, 60, 50],
					[160, 240, 200],
					[360, 540, 450]
				]
			};
	}
}

export const opexBasisLabels: Record<OpexLine['basis'], string> = {
	'fixed-per-year': 'Fixed per year',
	'per-kW-year': 'Per kW-year',
	'per-MWh': 'Per MWh',
	'percent-of-capex': 'Share of capex',
	'percent-of-revenue': 'Share of revenue',
	'periodic-overhaul': 'Periodic overhaul'
};

/** The same line under another basis, keeping its name (and amount or escalation where both have one). */
export function opexLineWithBasis(line: OpexLine, basis: OpexLine['basis']): OpexLine {
	const name = line.name;
	const amount = 'amount' in line ? line.amount : 0;
	const escalation = 'escalation' in line ? line.escalation : 0;
	switch (basis) {
		case 'fixed-per-year':
		case 'per-kW-year':
		case 'per-MWh':
			return { name, basis, amount, escalation };
		case 'percent-of-capex':
			return { name, basis, fraction: 'fraction' in line ? line.fraction : 0.01, escalation };
		case 'percent-of-revenue':
			return { name, basis, fraction: 'fraction' in line ? line.fraction : 0.02 };
		case 'periodic-overhaul':
			return { name, basis, amount, perDevice: true, intervalYears: 5, escalation };
	}
}

export const decommissioningBasisLabels: Record<Decommissioning['basis'], string> = {
	'lump-sum': 'Lump sum',
	'per-device': 'Per device',
	'per-kW': 'Per kW',
	'percent-of-capex': 'Share of capex'
};

/**
 * Decommissioning under another basis: an amount of money stays between the
 * money bases; a share of capex starts at 0 (money is never read as a share).
 */
export function decommissioningWithBasis(spec: Decommissioning, basis: Decommissioning['basis']): Decommissioning {
	if (basis === spec.basis) return spec;
	if (basis === 'percent-of-capex') return { basis, fraction: 0 };
	return { basis, amount: 'amount' in spec ? spec.amount : 0 };
}

export const grantBasisLabels: Record<Grant['basis'], string> = {
	'lump-sum': 'Lump sum',
	'percent-of-capex': 'Share of capex'
};

/** The same grant under another basis, keeping its name; the figure starts at 0 (money and shares do not convert). */
export function grantWithBasis(grant: Grant, basis: Grant['basis']): Grant {
	if (basis === grant.basis) return grant;
	return basis === 'percent-of-capex' ? { name: grant.name, basis, fraction: 0 } : { name: grant.name, basis, amount: 0 };
}

export const debtSizingLabels: Record<Debt['sizing'], string> = {
	none: 'No debt',
	gearing: 'Sized by gearing',
	'target-dscr': 'Sized by a target DSCR'
};

const loanTerms = {
	interestRate: 0.06,
	tenorYears: 15,
	graceYears: 0,
	upfrontFee: 0.02,
	repayment: 'annuity' as const,
	capitalizeInterestDuringConstruction: true,
	fundingOrder: 'equity-first' as const,
	commitmentFee: 0
};

/** The debt under another sizing, keeping the loan terms already entered. */
export function debtWithSizing(debt: Debt, sizing: Debt['sizing']): Debt {
	const terms = debt.sizing === 'none' ? loanTerms : { ...loanTerms, ...debt };
	const { interestRate, tenorYears, graceYears, upfrontFee, repayment, capitalizeInterestDuringConstruction, fundingOrder, commitmentFee } = terms;
	const kept = { interestRate, tenorYears, graceYears, upfrontFee, repayment, capitalizeInterestDuringConstruction, fundingOrder, commitmentFee };
	switch (sizing) {
		case 'none':
			return { sizing };
		case 'gearing':
			return { sizing, gearing: debt.sizing === 'target-dscr' ? debt.maxGearing : 0.7, ...kept };
		case 'target-dscr':
			return { sizing, targetDscr: 1.3, maxGearing: debt.sizing === 'gearing' ? debt.gearing : 0.8, downsideCases: [], ...kept, repayment: 'sculpted' };
	}
}

/** A blank scenario for a technology: evaluates as it stands, every figure a placeholder. */
export function blankDocument(technology: Technology, options: { name: string; currency: string }): ScenarioInput {
	const wave = technology === 'wave';
	return {
		schemaVersion: SCHEMA_VERSION,
		name: options.name,
		description: 'Started from blank defaults: replace each placeholder figure with your own.',
		technology,
		currency: options.currency,
		hoursPerYear: 8760,
		site: { waterDensityKgPerM3: 1025, gravityMPerS2: 9.80665 },
		resource: resourceOfKind(wave ? 'sea-state-table' : 'rayleigh'),
		device: deviceOfKind(wave ? 'capture-width' : 'rotor'),
		array: { deviceCount: 5, arrayLoss: 0.03, availability: 0.95, electricalLoss: 0.03, otherLoss: 0, degradationPerYear: 0 },
		uncertainty: { components: [{ name: 'Resource', sigma: 0.08 }], exceedanceLevels: [90] },
		timeline: { constructionYears: 2, operatingYears: 20 },
		capex: {
			lines: [
				{ name: 'Devices', basis: 'per-device', amount: wave ? 3_000_000 : 4_000_000 },
				{ name: 'Balance of plant', basis: 'lump-sum', amount: 10_000_000 }
			],
			phasing: [0.4, 0.6],
			contingency: 0.1
		},
		opex: { lines: [{ name: 'Operations and maintenance', basis: 'per-kW-year', amount: 150, escalation: 0 }] },
		decommissioning: { basis: 'per-device', amount: 500_000 },
		revenue: { tariffPerMWh: 250, supportYears: 15, tariffIndexation: 1, merchantPricePerMWh: 90, merchantEscalation: 0, grants: [] },
		finance: {
			inflation: 0.02,
			realDiscountRate: 0.07,
			taxRate: 0.25,
			depreciation: { method: 'straight-line', decliningBalanceFactor: 2 },
			taxLossCarryForward: true,
			debt: { sizing: 'none' }
		}
	};
}
