/**
 * The scenario document: everything the engine needs to evaluate one case of an
 * ocean-energy project. Shared by the editor forms, the JSON API and the engine.
 *
 * Conventions (see docs/scenario-format.md):
 * - Numbers are plain JSON numbers; the engine turns them into decimals.
 * - Fractions are 0..1 (0.05 means 5 %).
 * - Money inputs are in real terms, in prices of the commercial operation year
 *   (t = 0), in `currency` units. Power in kW, energy in MWh, speeds in m/s.
 * - Time: t = 0 is the commercial operation date (COD). The last construction
 *   year ends at t = 0, earlier ones at t = -1, -2, ...; their spend falls
 *   within each year as timeline.spendTiming says; operating year k sits at
 *   t = k (end of year).
 * - Every object is strict: an unknown key is refused, never dropped, so a
 *   misspelt field cannot fall back to its default unnoticed.
 * - Every list has an upper bound (./scenario-limits.ts).
 * - Money and shares never share a field: a share of capex is `fraction`.
 */
import { z } from 'zod';
import { atMost, SCENARIO_LIMITS } from './scenario-limits';
import { SCHEMA_VERSION, upgradeScenarioDocument } from './scenario-upgrades';
import { safeParseStrict } from './strict-parse';

export { SCHEMA_VERSION };

/** Lanchester-Betz limit: no open rotor extracts more than 16/27 of the kinetic power flux. */
export const BETZ_LIMIT = 16 / 27;

const fraction = (what: string) => z.number().min(0).max(1).describe(`${what} (fraction 0..1)`);
const positive = (what: string) => z.number().positive().describe(what);
const nonNegative = (what: string) => z.number().min(0).describe(what);
const wholeYears = (what: string, min: number) => z.number().int().min(min).describe(what);
const lineName = z.string().min(1).max(120).describe('Label shown in tables and charts');

// ---------------------------------------------------------------- site

const siteSchema = z
	.strictObject({
		name: z.string().max(200).optional().describe('Site name (free text)'),
		waterDensityKgPerM3: positive('Seawater density, kg/m^3').default(1025),
		gravityMPerS2: positive('Gravitational acceleration used in the wave energy flux, m/s^2').default(
			9.80665
		),
		waterDepthM: positive(
			'Still-water depth at the devices, m, for the wave energy flux at finite depth (linear dispersion). Leave out for deep water'
		).optional()
	})
	.describe('Physical constants of the site');

// ---------------------------------------------------------------- resource

const occurrenceBasis = z
	.enum(['hours', 'probability'])
	.describe(
		'How bin occurrences are given: hours in a year, or probabilities. Either way they are normalised to sum to 1'
	);

const speedHistogramSchema = z
	.strictObject({
		kind: z.literal('speed-histogram').describe('Resource kind'),
		occurrenceBasis: occurrenceBasis.default('probability'),
		bins: z
			.array(
				z.strictObject({
					speedMPerS: nonNegative('Bin centre flow speed, m/s'),
					occurrence: nonNegative('Hours in a year or probability of this speed bin')
				})
			)
			.min(1)
			.max(SCENARIO_LIMITS.speedBins, atMost('speedBins'))
			.describe('Flow speed histogram (IEC TS 62600-200 uses 0.1 m/s bins)')
	})
	.describe('Measured or modelled flow speed histogram at hub height');

const binWidth = positive('Width of the speed bins the distribution is turned into, m/s').default(0.1);

const weibullSchema = z
	.strictObject({
		kind: z.literal('weibull').describe('Resource kind'),
		scaleMPerS: positive('Weibull scale parameter c, m/s'),
		shape: positive('Weibull shape parameter k (dimensionless)'),
		binWidthMPerS: binWidth
	})
	.describe('Weibull distribution of flow speed, turned into bins');

const rayleighSchema = z
	.strictObject({
		kind: z.literal('rayleigh').describe('Resource kind'),
		meanSpeedMPerS: positive('Mean flow speed, m/s'),
		binWidthMPerS: binWidth
	})
	.describe('Rayleigh distribution (Weibull with k = 2) of flow speed, turned into bins');

const periodType = z
	.enum(['energy-period', 'peak-period'])
	.describe('Whether periods are energy periods Te or spectral peak periods Tp (converted with teOverTp)')
	.default('energy-period');

const teOverTp = z
	.number()
	.min(0.5)
	.max(1.2)
	.describe(
		'Te/Tp ratio used to convert peak periods: 0.9 is the usual rule; 0.8588 for a Pierson-Moskowitz spectrum, 0.9037 for JONSWAP with gamma 3.3'
	)
	.default(0.9);

const seaStateTableSchema = z
	.strictObject({
		kind: z.literal('sea-state-table').describe('Resource kind'),
		periodType,
		teOverTp,
		occurrenceBasis: occurrenceBasis.default('probability'),
		states: z
			.array(
				z.strictObject({
					hsM: nonNegative('Significant wave height Hs, m'),
					periodS: positive('Wave period (Te or Tp, see periodType), s'),
					occurrence: nonNegative('Hours in a year or probability of this sea state')
				})
			)
			.min(1)
			.max(SCENARIO_LIMITS.seaStates, atMost('seaStates'))
			.describe('Sea-state occurrence table (scatter diagram); IEC TS 62600-100 bins are Hs 0.5 m x Te 1 s')
	})
	.describe('Sea-state occurrence table (scatter diagram)');

const seaStateSchema = z
	.strictObject({
		kind: z.literal('sea-state').describe('Resource kind'),
		periodType,
		teOverTp,
		hsM: positive('Significant wave height Hs, m'),
		periodS: positive('Wave period (Te or Tp, see periodType), s')
	})
	.describe('A single characteristic sea state occurring all year');

const assessedSigma = (what: string) =>
	z.number().min(0).max(1).optional().describe(`${what}, one standard deviation as a fraction of P50 (0..1)`);

const assessedEnergySchema = z
	.strictObject({
		kind: z.literal('assessed-energy').describe('Resource kind'),
		p50MWh: positive(
			'Net annual energy of the whole array at P50, MWh/yr, as the assessment gives it: after wake, availability, electrical and other losses, first operating year before degradation'
		),
		p90MWh: positive(
			'Net annual energy at P90 over one year, MWh/yr, at most p50MWh; its sigma (1 - P90/P50) / 1.2816 counts as long-term uncertainty. Give this, or sigma, or interAnnualSigma with longTermSigma'
		).optional(),
		sigma: assessedSigma('Total uncertainty of the assessed energy (counted as long-term); give this, or p90MWh, or interAnnualSigma with longTermSigma'),
		interAnnualSigma: assessedSigma('Year-to-year variability of the resource, which averages out over several years; give it with longTermSigma'),
		longTermSigma: assessedSigma('Long-term uncertainty of the assessment (measurement, model, losses); give it with interAnnualSigma'),
		assessedBy: z.string().max(200).optional().describe('Who made the assessment, and the report it is taken from (free text)')
	})
	.describe(
		"An independent yield assessment's figures taken as they are, for any technology: the device's power curve or matrix is not used for energy, only its rated power (for the installed capacity); losses must stay at their no-loss values because the figures are net; degradation still applies"
	);

export const resourceSchema = z
	.discriminatedUnion('kind', [
		speedHistogramSchema,
		weibullSchema,
		rayleighSchema,
		seaStateTableSchema,
		seaStateSchema,
		assessedEnergySchema
	])
	.describe('The resource: flow speeds for currents, sea states for waves, or a given net energy (assessed-energy) for either');

// ---------------------------------------------------------------- device

const rotorSchema = z
	.strictObject({
		kind: z.literal('rotor').describe('Device kind'),
		rotorDiameterM: positive('Rotor diameter, m (give this or sweptAreaM2)').optional(),
		sweptAreaM2: positive('Swept area per device, m^2 (overrides rotorDiameterM)').optional(),
		powerCoefficient: z
			.number()
			.positive()
			.max(BETZ_LIMIT, {
				message: `power coefficient exceeds the Betz limit 16/27 (${BETZ_LIMIT.toFixed(4)}): no open rotor can extract more`
			})
			.describe('Rotor power coefficient Cp (at most the Betz limit 16/27 = 0.5926)'),
		driveTrainEfficiency: z
			.number()
			.positive()
			.max(1)
			.describe('Drive-train efficiency from rotor shaft to grid connection (fraction 0..1)')
			.default(1),
		cutInSpeedMPerS: nonNegative('Cut-in flow speed, m/s').default(0),
		ratedPowerKW: positive('Rated electrical power per device, kW'),
		cutOutSpeedMPerS: positive('Cut-out flow speed, m/s (no power at or above it)')
	})
	.describe('Parametric rotor: P = 1/2 rho A Cp eta v^3, capped at rated power between cut-in and cut-out');

const powerCurveSchema = z
	.strictObject({
		kind: z.literal('power-curve').describe('Device kind'),
		ratedPowerKW: positive('Rated power per device, kW (defaults to the curve maximum)').optional(),
		points: z
			.array(
				z.strictObject({
					speedMPerS: nonNegative('Flow speed, m/s'),
					powerKW: nonNegative('Electrical power at this speed, kW')
				})
			)
			.min(2)
			.max(SCENARIO_LIMITS.powerCurvePoints, atMost('powerCurvePoints'))
			.describe('Measured power curve, speeds ascending; linear between points, zero outside them')
	})
	.describe('Measured power curve (IEC TS 62600-200 style: power against binned flow speed)');

const powerMatrixSchema = z
	.strictObject({
		kind: z.literal('power-matrix').describe('Device kind'),
		ratedPowerKW: positive('Rated power per device, kW (defaults to the matrix maximum)').optional(),
		periodType,
		teOverTp,
		hsM: z
			.array(nonNegative('Hs row value, m'))
			.min(1)
			.max(SCENARIO_LIMITS.powerMatrixHsValues, atMost('powerMatrixHsValues'))
			.describe('Row axis: significant wave heights, m, ascending'),
		periodS: z
			.array(positive('Period column value, s'))
			.min(1)
			.max(SCENARIO_LIMITS.powerMatrixPeriodValues, atMost('powerMatrixPeriodValues'))
			.describe('Column axis: periods (Te or Tp), s, ascending'),
		powerKW: z
			.array(
				z
					.array(nonNegative('Mean electrical power, kW'))
					.max(SCENARIO_LIMITS.powerMatrixPeriodValues, atMost('powerMatrixPeriodValues', 'cells in a row (one per period value)'))
			)
			.min(1)
			.max(SCENARIO_LIMITS.powerMatrixHsValues, atMost('powerMatrixHsValues', 'rows (one per Hs value)'))
			.describe('Mean electrical power per device, kW: one row per hsM value, one column per periodS value'),
		lookup: z
			.enum(['bilinear', 'nearest'])
			.describe('bilinear: interpolate between the four surrounding cells; nearest: take the nearest cell')
			.default('bilinear')
	})
	.describe('Wave power matrix over Hs and period (IEC TS 62600-100 style); zero outside its range');

const captureWidthSchema = z
	.strictObject({
		kind: z.literal('capture-width').describe('Device kind'),
		captureWidthRatio: positive('Wave-to-wire capture width ratio (fraction of the flux across the characteristic width)'),
		characteristicWidthM: positive('Characteristic width of the device, m'),
		ratedPowerKW: positive('Rated electrical power per device, kW (cap)')
	})
	.describe('Parametric wave device: P = CWR x width x J, capped at rated power');

export const deviceSchema = z
	.discriminatedUnion('kind', [rotorSchema, powerCurveSchema, powerMatrixSchema, captureWidthSchema])
	.describe('The energy converter: rotor or power curve for currents, power matrix or capture width for waves');

// ---------------------------------------------------------------- array, losses, uncertainty

const arraySchema = z
	.strictObject({
		deviceCount: wholeYears('Number of devices in the array', 1),
		arrayLoss: fraction('Array (wake/blockage) loss').default(0),
		availability: fraction('Availability').default(1),
		electricalLoss: fraction('Electrical (cable, transformer) loss').default(0),
		otherLoss: fraction('Other losses').default(0),
		degradationPerYear: fraction('Performance degradation per operating year, geometric').default(0)
	})
	.describe('The array and its losses; losses multiply');

const uncertaintySchema = z
	.strictObject({
		components: z
			.array(
				z.strictObject({
					name: lineName,
					sigma: nonNegative('One standard deviation as a fraction of P50 energy'),
					kind: z
						.enum(['long-term', 'inter-annual'])
						.describe(
							'inter-annual: year-to-year variability of the resource, which averages out over an N-year horizon as 1/sqrt(N); long-term: everything else (measurement, model, losses), the same in every year'
						)
						.default('long-term')
				})
			)
			.max(SCENARIO_LIMITS.uncertaintyComponents, atMost('uncertaintyComponents'))
			.default([])
			.describe(
				'Independent yield uncertainties, combined as root sum of squares; over N years sigma_N = sqrt(sigma_long-term^2 + sigma_inter-annual^2 / N). With an assessed-energy resource they add to the assessment\'s own'
			),
		exceedanceLevels: z
			.array(z.number().gt(0).lt(100).describe('Exceedance probability, percent (90 for P90)'))
			.max(SCENARIO_LIMITS.exceedanceLevels, atMost('exceedanceLevels'))
			.default([90])
			.describe('Pxx levels reported besides P50 (P90 is always reported)')
	})
	.describe('Yield uncertainty for P90 and other exceedance levels (normal model)');

// ---------------------------------------------------------------- timeline and costs

const timelineSchema = z
	.strictObject({
		constructionYears: wholeYears('Construction years before COD (the last one ends at t = 0)', 1)
			.max(SCENARIO_LIMITS.constructionYears, atMost('constructionYears'))
			.default(1),
		operatingYears: wholeYears('Operating years after COD', 1).max(SCENARIO_LIMITS.operatingYears, atMost('operatingYears')),
		spendTiming: z
			.enum(['mid-year', 'quarterly', 'monthly', 'year-end'])
			.describe(
				"When each construction year's spend and debt draws fall: mid-year (one point in the middle of the year), quarterly or monthly (the year's share spread evenly, each at the middle of its quarter or month), or year-end (all at the year's end, the simplest annual convention)"
			)
			.default('mid-year')
	})
	.describe('Construction and operating periods');

const phasing = z
	.array(nonNegative('Share of spend in this construction year'))
	.max(SCENARIO_LIMITS.constructionYears, atMost('constructionYears', 'phasing shares (one per construction year)'))
	.describe('Share of spend per construction year, first year first; must sum to 1 and have one entry per construction year');

const capexLineSchema = z.strictObject({
	name: lineName,
	basis: z
		.enum(['lump-sum', 'per-kW', 'per-device'])
		.describe('lump-sum: amount for the project; per-kW: per kW installed; per-device: per device'),
	amount: nonNegative('Cost in currency units (per kW or per device where the basis says so), real'),
	phasing: phasing.optional()
});

const capexSchema = z
	.strictObject({
		lines: z.array(capexLineSchema).min(1).max(SCENARIO_LIMITS.capexLines, atMost('capexLines')).describe('Capital cost lines'),
		phasing: phasing.optional().describe('Default phasing for lines without their own (even spread when omitted)'),
		contingency: fraction('Contingency added to every capex line').default(0)
	})
	.describe('Capital costs, in real money of the COD year');

const escalation = z
	.number()
	.min(-0.5)
	.max(0.5)
	.describe('Real escalation per year above inflation (fraction)')
	.default(0);

const opexLineSchema = z.discriminatedUnion('basis', [
	z.strictObject({
		name: lineName,
		basis: z.literal('fixed-per-year').describe('How the line is priced'),
		amount: nonNegative('Cost per year, currency units, real'),
		escalation
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('per-kW-year').describe('How the line is priced'),
		amount: nonNegative('Cost per kW installed per year, currency units, real'),
		escalation
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('per-MWh').describe('How the line is priced'),
		amount: nonNegative('Cost per MWh delivered, currency units, real'),
		escalation
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('percent-of-capex').describe('How the line is priced'),
		fraction: fraction('Share of total capex (with contingency) per year, e.g. insurance'),
		escalation
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('percent-of-revenue').describe('How the line is priced'),
		fraction: fraction('Share of revenue in the same year, e.g. a seabed lease')
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('periodic-overhaul').describe('How the line is priced'),
		amount: nonNegative('Cost of one overhaul, currency units, real (per device when perDevice)'),
		perDevice: z.boolean().describe('Amount is per device rather than for the whole array').default(true),
		intervalYears: wholeYears('An overhaul every this many operating years (not in the final year)', 1),
		escalation
	})
]);

const opexSchema = z
	.strictObject({
		lines: z.array(opexLineSchema).max(SCENARIO_LIMITS.opexLines, atMost('opexLines')).default([]).describe('Operating cost lines')
	})
	.describe('Operating costs, in real money of the COD year, escalated with inflation plus their own escalation');

const decommissioningBasis = 'lump-sum for the project, per device, per kW installed, or a share of capex';

const decommissioningSchema = z
	.discriminatedUnion('basis', [
		z.strictObject({
			basis: z.literal('lump-sum').describe(decommissioningBasis),
			amount: nonNegative('Decommissioning cost for the project, currency units, real').default(0)
		}),
		z.strictObject({
			basis: z.literal('per-device').describe(decommissioningBasis),
			amount: nonNegative('Decommissioning cost per device, currency units, real').default(0)
		}),
		z.strictObject({
			basis: z.literal('per-kW').describe(decommissioningBasis),
			amount: nonNegative('Decommissioning cost per kW installed, currency units, real').default(0)
		}),
		z.strictObject({
			basis: z.literal('percent-of-capex').describe(decommissioningBasis),
			fraction: fraction('Share of total capex (with contingency)').default(0)
		})
	])
	.describe('Decommissioning cost, paid at the end of the final operating year: an amount of money, or a fraction for percent-of-capex');

// ---------------------------------------------------------------- revenue

const grantBasis = 'lump-sum: an amount of money; percent-of-capex: a share of capex';

const grantSchema = z.discriminatedUnion('basis', [
	z.strictObject({
		name: lineName,
		basis: z.literal('lump-sum').describe(grantBasis),
		amount: nonNegative('Grant amount, currency units, real')
	}),
	z.strictObject({
		name: lineName,
		basis: z.literal('percent-of-capex').describe(grantBasis),
		fraction: fraction('Share of total capex (with contingency) granted')
	})
]);

const revenueSchema = z
	.strictObject({
		tariffPerMWh: nonNegative('Support tariff or PPA price, currency per MWh, real (COD-year prices)'),
		supportYears: wholeYears('Operating years the tariff applies, then the merchant price', 0),
		tariffIndexation: fraction(
			'How much of the tariff is indexed (1 = fully indexed, 0 = flat nominal); its meaning between 0 and 1 is set by indexationMethod'
		).default(1),
		indexationMethod: z
			.enum(['indexed-share', 'scaled-inflation'])
			.describe(
				'indexed-share: a share tariffIndexation of the price grows with the tariff inflation and the rest stays fixed in money; scaled-inflation: the whole price grows at tariffIndexation x the tariff inflation'
			)
			.default('indexed-share'),
		indexationBaseYearsBeforeCod: wholeYears(
			'Whole years from the indexation base year (the year whose prices the tariff is given in) to COD; the tariff is indexed from that year',
			0
		)
			.max(SCENARIO_LIMITS.indexationBaseYears, atMost('indexationBaseYears'))
			.default(0),
		tariffInflation: z
			.number()
			.min(-0.05)
			.max(0.5)
			.optional()
			.describe('Inflation of the index the tariff and merchant price follow, per year (fraction); absent = finance.inflation'),
		curtailment: fraction('Share of the net energy the grid does not take and nobody pays for').default(0),
		merchantPricePerMWh: nonNegative('Merchant price after the support period, currency per MWh, real').default(0),
		merchantEscalation: escalation,
		grants: z
			.array(grantSchema)
			.max(SCENARIO_LIMITS.grants, atMost('grants'))
			.default([])
			.describe('Capital grants, received in step with capex spend; not taxed, they reduce the depreciable cost')
	})
	.describe('Revenue');

// ---------------------------------------------------------------- finance

const loanTerms = {
	interestRate: z.number().min(0).max(0.5).describe('Nominal interest rate per year (fraction)'),
	tenorYears: wholeYears('Loan tenor from COD, years (including grace years)', 1),
	graceYears: wholeYears('Interest-only years at the start of the tenor', 0).default(0),
	upfrontFee: fraction('Upfront fee as a share of the debt amount, paid by equity at financial close').default(0),
	repayment: z
		.enum(['annuity', 'straight-line', 'sculpted'])
		.describe('Repayment profile: level payments, level principal, or sculpted to CFADS')
		.default('annuity'),
	capitalizeInterestDuringConstruction: z
		.boolean()
		.describe('Roll interest during construction into the loan (true) or pay it from equity (false)')
		.default(true),
	fundingOrder: z
		.enum(['equity-first', 'pro-rata'])
		.describe('How construction spend is funded: all equity first, then debt; or debt and equity in step with each payment')
		.default('equity-first'),
	commitmentFee: fraction('Commitment fee per year on the undrawn part of the loan during construction').default(0)
};

const downsideCaseSchema = z.strictObject({
	exceedancePercent: z
		.number()
		.gt(50)
		.lt(100)
		.describe('Exceedance level of the energy the debt is also sized on, percent (90 for P90, 99 for P99)'),
	targetDscr: z.number().min(1).max(5).describe('Target DSCR in every debt-service year under that energy'),
	horizonYears: z
		.union([z.literal(1), z.literal(10)])
		.describe('Horizon of the exceedance value: one year (the usual cover test) or ten years')
		.default(1)
});

const debtSchema = z
	.discriminatedUnion('sizing', [
		z.strictObject({ sizing: z.literal('none').describe('How the debt is sized') }),
		z.strictObject({
			sizing: z.literal('gearing').describe('How the debt is sized'),
			gearing: fraction('Debt as a share of the total funding need: spend net of grants, financing costs during construction and reserves funded then'),
			...loanTerms
		}),
		z.strictObject({
			sizing: z.literal('target-dscr').describe('How the debt is sized'),
			targetDscr: z.number().min(1).max(5).describe('Target debt service cover ratio in every repayment year'),
			maxGearing: fraction('Cap on the debt as a share of the total funding need (spend net of grants, financing costs during construction and reserves funded then)').default(0.8),
			downsideCases: z
				.array(downsideCaseSchema)
				.max(SCENARIO_LIMITS.downsideCases, atMost('downsideCases'))
				.default([])
				.describe('Further energy cases the debt is sized on, each with its own target (e.g. P90 at 1.20); the least debt of all cases governs'),
			...loanTerms
		})
	])
	.describe('Senior debt: none, sized by gearing, or sized by a target DSCR (the lesser of that and the gearing cap)');

const reservesSchema = z
	.strictObject({
		debtService: z
			.strictObject({
				months: z.number().min(0).max(24).describe("Target balance: this many months of the next year's debt service (0..24)").default(6),
				funding: z
					.enum(['from-funding', 'from-cash-flow'])
					.describe(
						'from-funding: filled in full at COD as a use of the construction funding; from-cash-flow: filled from the cash left after debt service, before any distribution'
					)
					.default('from-funding')
			})
			.optional()
			.describe('Debt service reserve account: drawn when CFADS falls short of the debt service, topped up after, released as its target falls and at final maturity'),
		maintenance: z
			.strictObject({
				fundingYears: wholeYears(
					'Each periodic overhaul is funded in equal nominal contributions over this many operating years, ending in its own year (default: the overhaul interval)',
					1
				)
					.max(SCENARIO_LIMITS.operatingYears, atMost('operatingYears'))
					.optional()
			})
			.optional()
			.describe('Maintenance reserve account for the periodic-overhaul opex lines: its contributions and draws are netted in CFADS'),
		decommissioning: z
			.strictObject({
				fundingYears: wholeYears('The decommissioning cost is funded in equal nominal contributions over the last this many operating years', 1).max(
					SCENARIO_LIMITS.operatingYears,
					atMost('operatingYears')
				)
			})
			.optional()
			.describe('Decommissioning reserve account: funded ahead, drawn to pay the decommissioning in the final year; netted in CFADS')
	})
	.describe('Reserve accounts, left out when absent; they earn no interest');

const covenantsSchema = z
	.strictObject({
		lockUpDscr: z
			.number()
			.min(1)
			.max(5)
			.optional()
			.describe('Distribution lock-up: no distributions in a year whose DSCR is below this; the cash is held and released in the first later year at or above it, or at final maturity'),
		defaultDscr: z
			.number()
			.min(1)
			.max(5)
			.optional()
			.describe('Default covenant: a year whose DSCR is below this is flagged as an event of default (at most the lock-up DSCR)'),
		cashSweep: z
			.strictObject({
				share: fraction('Share of the cash swept to prepay the loan'),
				when: z
					.enum(['always', 'in-lock-up'])
					.describe('always: that share of the cash otherwise distributable, every year; in-lock-up: that share of the cash trapped in lock-up years')
					.default('always')
			})
			.optional()
			.describe('Cash sweep: prepays the loan from cash that would otherwise reach equity, so it is repaid sooner')
	})
	.describe('Covenants on the yearly DSCR while the loan is outstanding, left out when absent');

/** How a part of the depreciable base is written off: the top-level rule, or an asset class's own. */
const depreciationRuleFields = {
	method: z
		.enum(['straight-line', 'declining-balance', 'schedule'])
		.describe('Straight line; declining balance switching to straight line when that is larger; or a schedule of shares per year (a published tax table)')
		.default('straight-line'),
	lifeYears: wholeYears('Tax depreciation life, years (defaults to the operating life; not used by schedule)', 1)
		.max(SCENARIO_LIMITS.depreciationLifeYears, atMost('depreciationLifeYears'))
		.optional(),
	decliningBalanceFactor: positive('Declining-balance factor (2 = double declining, 1.5 = 150 %)').default(2),
	firstYearConvention: z
		.enum(['full-year', 'half-year'])
		.optional()
		.describe(
			"full-year (absent): a whole year's charge in operating year 1; half-year: half a year's charge in year 1 and in the year after the life, as the US MACRS tables (not used by schedule)"
		),
	schedule: z
		.array(fraction('Share of the depreciable base written off in this operating year'))
		.max(SCENARIO_LIMITS.depreciationScheduleYears, atMost('depreciationScheduleYears'))
		.optional()
		.describe('For the schedule method: the share written off in each operating year, year 1 first; must sum to 1')
};

const depreciationAssetClassSchema = z
	.strictObject({
		name: lineName,
		share: fraction('Share of the depreciable base in this class; leave it out on one class to give that class the rest').optional(),
		...depreciationRuleFields
	})
	.describe('An asset class: a share of the depreciable base written off by its own rule');

const financeSchema = z
	.strictObject({
		inflation: z.number().min(-0.05).max(0.5).describe('Inflation per year (fraction)').default(0.02),
		realDiscountRate: z.number().min(0).max(0.5).describe('Real discount rate per year (fraction); nominal by Fisher'),
		taxRate: fraction('Corporate tax rate').default(0),
		depreciation: z
			.strictObject({
				...depreciationRuleFields,
				assetClasses: z
					.array(depreciationAssetClassSchema)
					.max(SCENARIO_LIMITS.depreciationAssetClasses, atMost('depreciationAssetClasses'))
					.optional()
					.describe('Asset classes, each a share of the depreciable base with its own rule; when given, the rule fields above are not used')
			})
			.default({ method: 'straight-line', decliningBalanceFactor: 2 })
			.describe('Tax depreciation of capex net of grants'),
		taxLossCarryForward: z.boolean().describe('Carry tax losses forward against later profits').default(true),
		taxLossCarryForwardCap: fraction(
			"Share of a year's taxable profit that losses brought forward may offset, e.g. 0.6 for a 60 % rule; absent = no cap"
		).optional(),
		debt: debtSchema.default({ sizing: 'none' }),
		reserves: reservesSchema.optional(),
		covenants: covenantsSchema.optional()
	})
	.describe('Rates, tax and debt');

// ---------------------------------------------------------------- the document

const technology = z
	.enum(['tidal-stream', 'ocean-current', 'wave'])
	.describe('tidal-stream and ocean-current use flow speeds; wave uses sea states');

const speedResources = new Set(['speed-histogram', 'weibull', 'rayleigh']);
const speedDevices = new Set(['rotor', 'power-curve']);

const scenarioObject = z
	.strictObject({
		schemaVersion: z
			.literal(SCHEMA_VERSION)
			.describe(`Version of this document format; older versions are upgraded when read (see scenario-upgrades.ts)`),
		name: z.string().min(1).max(200).describe('Scenario name'),
		description: z.string().max(4000).optional().describe('Free-text notes'),
		technology,
		currency: z
			.string()
			.regex(/^[A-Z]{3}$/, 'currency must be a three-letter code such as EUR')
			.describe('ISO 4217 currency code of every money amount')
			.default('EUR'),
		hoursPerYear: z
			.number()
			.min(8000)
			.max(9000)
			.describe('Hours in a year for annual energy: 8760 (default) or 8766 (IEC TS 62600-100, 365.25 days)')
			.default(8760),
		site: siteSchema.default({ waterDensityKgPerM3: 1025, gravityMPerS2: 9.80665 }),
		resource: resourceSchema,
		device: deviceSchema,
		array: arraySchema,
		uncertainty: uncertaintySchema.default({ components: [], exceedanceLevels: [90] }),
		timeline: timelineSchema,
		capex: capexSchema,
		opex: opexSchema.default({ lines: [] }),
		decommissioning: decommissioningSchema.default({ basis: 'lump-sum', amount: 0 }),
		revenue: revenueSchema,
		finance: financeSchema
	})
	.describe('A Tidewright scenario: one case of an ocean-energy project');

export const scenarioSchema = scenarioObject.superRefine(
	(s, ctx) => {
		checkTechnologyFit(s, ctx);
		checkDevice(s.device, ctx);
		checkPhasing(s, ctx);
		checkFinance(s, ctx);
		checkDepreciation(s, ctx);
		checkReservesAndCovenants(s, ctx);
	},
	// Cross-field checks need a structurally valid document; they run once the field errors are fixed.
	{ when: (payload) => payload.issues.length === 0 }
);

type RefineCtx = z.core.$RefinementCtx<unknown>;
type Device = z.output<typeof deviceSchema>;

function flag(ctx: RefineCtx, path: (string | number)[], message: string) {
	ctx.addIssue({ code: 'custom', path, message });
}

function checkTechnologyFit(s: z.output<typeof scenarioObject>, ctx: RefineCtx) {
	const flow = s.technology !== 'wave';
	if (s.resource.kind === 'assessed-energy') checkAssessedEnergy(s, s.resource, ctx);
	else if (flow !== speedResources.has(s.resource.kind)) {
		ctx.addIssue({
			code: 'custom',
			path: ['resource', 'kind'],
			message: flow
				? `${s.technology} needs a flow-speed resource (speed-histogram, weibull or rayleigh) or assessed-energy, not ${s.resource.kind}`
				: `wave needs a sea-state resource (sea-state-table or sea-state) or assessed-energy, not ${s.resource.kind}`
		});
	}
	if (flow !== speedDevices.has(s.device.kind)) {
		ctx.addIssue({
			code: 'custom',
			path: ['device', 'kind'],
			message: flow
				? `${s.technology} needs a rotor or power-curve device, not ${s.device.kind}`
				: `wave needs a power-matrix or capture-width device, not ${s.device.kind}`
		});
	}
}

type AssessedEnergy = Extract<z.output<typeof resourceSchema>, { kind: 'assessed-energy' }>;

/**
 * An assessed energy (valid for every technology) comes with exactly one form
 * of its uncertainty, is net of losses (so the array's losses must stay at
 * their no-loss values, else they would be applied twice), and the device
 * must state its rated power, the one thing taken from it.
 */
function checkAssessedEnergy(s: z.output<typeof scenarioObject>, r: AssessedEnergy, ctx: RefineCtx) {
	const split = r.interAnnualSigma !== undefined || r.longTermSigma !== undefined;
	// One field of each form given, in the order named; a second form is flagged at its field.
	const forms = [
		r.p90MWh !== undefined ? 'p90MWh' : null,
		r.sigma !== undefined ? 'sigma' : null,
		split ? (r.interAnnualSigma !== undefined ? 'interAnnualSigma' : 'longTermSigma') : null
	].filter((f) => f !== null);
	const choice = 'p90MWh, or sigma, or interAnnualSigma with longTermSigma';
	if (forms.length === 0) flag(ctx, ['resource', 'p90MWh'], `give the assessment's uncertainty: ${choice}`);
	if (forms.length > 1) flag(ctx, ['resource', forms[1]], `give only one form of the uncertainty: ${choice}`);
	if (split && r.interAnnualSigma === undefined) flag(ctx, ['resource', 'interAnnualSigma'], 'give interAnnualSigma with longTermSigma (0 when the assessment has none)');
	if (split && r.longTermSigma === undefined) flag(ctx, ['resource', 'longTermSigma'], 'give longTermSigma with interAnnualSigma (0 when the assessment has none)');
	if (r.p90MWh !== undefined && r.p90MWh > r.p50MWh) flag(ctx, ['resource', 'p90MWh'], `P90 (${r.p90MWh} MWh) must not exceed P50 (${r.p50MWh} MWh)`);

	const net = 'with an assessed-energy resource, because the assessed P50 is already net of losses and would be reduced twice';
	for (const loss of ['arrayLoss', 'electricalLoss', 'otherLoss'] as const) {
		if (s.array[loss] !== 0) flag(ctx, ['array', loss], `must be 0 ${net}`);
	}
	if (s.array.availability !== 1) flag(ctx, ['array', 'availability'], `must be 1 ${net}`);
	if ((s.device.kind === 'power-curve' || s.device.kind === 'power-matrix') && s.device.ratedPowerKW === undefined) {
		flag(
			ctx,
			['device', 'ratedPowerKW'],
			`give the rated power per device: with an assessed-energy resource it sets the installed capacity (capacity factor, per-kW costs), and the ${s.device.kind === 'power-curve' ? 'power curve' : 'power matrix'} is not used`
		);
	}
}

function ascending(values: readonly number[]): boolean {
	return values.every((v, i) => i === 0 || v > values[i - 1]);
}

function checkDevice(device: Device, ctx: RefineCtx) {
	if (device.kind === 'rotor') {
		if (device.rotorDiameterM === undefined && device.sweptAreaM2 === undefined) {
			flag(ctx, ['device', 'rotorDiameterM'], 'give rotorDiameterM or sweptAreaM2');
		}
		if (device.cutOutSpeedMPerS <= device.cutInSpeedMPerS) {
			flag(ctx, ['device', 'cutOutSpeedMPerS'], 'cut-out speed must be above cut-in speed');
		}
	}
	if (device.kind === 'power-curve' && !ascending(device.points.map((p) => p.speedMPerS))) {
		flag(ctx, ['device', 'points'], 'power curve speeds must be strictly ascending');
	}
	if (device.kind === 'power-matrix') {
		if (!ascending(device.hsM)) flag(ctx, ['device', 'hsM'], 'Hs values must be strictly ascending');
		if (!ascending(device.periodS)) flag(ctx, ['device', 'periodS'], 'periods must be strictly ascending');
		if (device.powerKW.length !== device.hsM.length) {
			flag(ctx, ['device', 'powerKW'], `power matrix needs ${device.hsM.length} rows (one per hsM value), has ${device.powerKW.length}`);
		}
		device.powerKW.forEach((row, i) => {
			if (row.length !== device.periodS.length) {
				flag(ctx, ['device', 'powerKW', i], `row needs ${device.periodS.length} values (one per periodS value), has ${row.length}`);
			}
		});
	}
}

function checkPhasing(s: z.output<typeof scenarioObject>, ctx: RefineCtx) {
	const years = s.timeline.constructionYears;
	const check = (values: number[] | undefined, path: (string | number)[]) => {
		if (!values) return;
		if (values.length !== years) {
			flag(ctx, path, `phasing needs ${years} entries (one per construction year), has ${values.length}`);
			return;
		}
		const total = values.reduce((a, b) => a + b, 0);
		if (Math.abs(total - 1) > 1e-6) flag(ctx, path, `phasing must sum to 1, sums to ${total}`);
	};
	check(s.capex.phasing, ['capex', 'phasing']);
	s.capex.lines.forEach((line, i) => check(line.phasing, ['capex', 'lines', i, 'phasing']));
}

function checkFinance(s: z.output<typeof scenarioObject>, ctx: RefineCtx) {
	const debt = s.finance.debt;
	if (debt.sizing === 'none') return;
	if (debt.tenorYears > s.timeline.operatingYears) {
		flag(ctx, ['finance', 'debt', 'tenorYears'], `tenor (${debt.tenorYears} years) must not exceed the operating life (${s.timeline.operatingYears} years)`);
	}
	if (debt.graceYears >= debt.tenorYears) {
		flag(ctx, ['finance', 'debt', 'graceYears'], 'grace years must be fewer than the tenor');
	}
}

function checkReservesAndCovenants(s: z.output<typeof scenarioObject>, ctx: RefineCtx) {
	const { reserves, covenants } = s.finance;
	const life = s.timeline.operatingYears;
	for (const account of ['maintenance', 'decommissioning'] as const) {
		const years = reserves?.[account]?.fundingYears;
		if (years !== undefined && years > life) {
			flag(ctx, ['finance', 'reserves', account, 'fundingYears'], `funding years (${years}) must not exceed the operating life (${life} years)`);
		}
	}
	if (!covenants) return;
	const { lockUpDscr, defaultDscr, cashSweep } = covenants;
	if (lockUpDscr !== undefined && defaultDscr !== undefined && defaultDscr > lockUpDscr) {
		flag(ctx, ['finance', 'covenants', 'defaultDscr'], `the default DSCR (${defaultDscr}) must not exceed the lock-up DSCR (${lockUpDscr})`);
	}
	if (cashSweep?.when === 'in-lock-up' && lockUpDscr === undefined) {
		flag(ctx, ['finance', 'covenants', 'cashSweep', 'when'], 'a sweep in lock-up needs a lock-up DSCR (finance.covenants.lockUpDscr)');
	}
}

type DepreciationRuleFields = { method: string; schedule?: number[] };

/** Schedules sum to 1 and asset-class shares add up to the base (the engine's tolerance, finance/depreciation.ts). */
function checkDepreciation(s: z.output<typeof scenarioObject>, ctx: RefineCtx) {
	const base = ['finance', 'depreciation'];
	const checkSchedule = (rule: DepreciationRuleFields, path: (string | number)[]) => {
		if (rule.method !== 'schedule') return;
		if (!rule.schedule || rule.schedule.length === 0) {
			flag(ctx, [...path, 'schedule'], 'the schedule method needs a schedule: the share written off in each operating year, summing to 1');
			return;
		}
		const total = rule.schedule.reduce((a, b) => a + b, 0);
		if (Math.abs(total - 1) > 1e-6) flag(ctx, [...path, 'schedule'], `schedule must sum to 1, sums to ${total}`);
	};
	const dep = s.finance.depreciation;
	const classes = dep.assetClasses ?? [];
	if (classes.length === 0) {
		checkSchedule(dep, base);
		return;
	}
	classes.forEach((c, i) => checkSchedule(c, [...base, 'assetClasses', i]));
	const open = classes.map((c, i) => (c.share === undefined ? i : -1)).filter((i) => i >= 0);
	open.slice(1).forEach((i) => flag(ctx, [...base, 'assetClasses', i, 'share'], 'only one asset class may leave its share empty (it takes the rest)'));
	const given = classes.reduce((a, c) => a + (c.share ?? 0), 0);
	if (open.length === 0 && Math.abs(given - 1) > 1e-6) {
		flag(ctx, [...base, 'assetClasses'], `asset-class shares must sum to 1, sum to ${given}; or leave one share empty to take the rest`);
	} else if (open.length === 1 && given > 1 + 1e-6) {
		flag(ctx, [...base, 'assetClasses'], `the asset-class shares given sum to ${given}, more than 1, leaving nothing for the class without a share`);
	}
}

export type Scenario = z.output<typeof scenarioSchema>;
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type Resource = Scenario['resource'];
export type DeviceSpec = Scenario['device'];
export type OpexLine = Scenario['opex']['lines'][number];
export type Decommissioning = Scenario['decommissioning'];
export type Grant = Scenario['revenue']['grants'][number];
export type DebtSpec = Scenario['finance']['debt'];
export type ReservesSpec = NonNullable<Scenario['finance']['reserves']>;
export type CovenantsSpec = NonNullable<Scenario['finance']['covenants']>;

/** The DSCR the debt is sized to, when it is sized to one (charts draw it as the target line). */
export function targetDscrOf(debt: DebtSpec): number | null {
	return debt.sizing === 'target-dscr' ? debt.targetDscr : null;
}

export type ScenarioIssue = { path: string; message: string };
/**
 * `upgradedFrom`: the version the document was written in when it was older
 * than SCHEMA_VERSION (else null), with a note for each value an upgrade step moved.
 */
export type ParseScenarioResult =
	| { ok: true; scenario: Scenario; upgradedFrom: number | null; upgradeNotes: string[] }
	| { ok: false; issues: ScenarioIssue[]; upgradedFrom: number | null };

/** `['capex', 'lines', 2, 'amount']` -> `capex.lines[2].amount`. */
export function formatIssuePath(path: readonly PropertyKey[]): string {
	let out = '';
	for (const key of path) {
		if (typeof key === 'number') out += `[${key}]`;
		else out += out === '' ? String(key) : `.${String(key)}`;
	}
	return out === '' ? '(document)' : out;
}

/**
 * Validate an untrusted JSON value as a scenario, filling defaults. A document
 * of an older schemaVersion is upgraded first (scenario-upgrades.ts), then
 * checked against the current schema; issues then name the current fields.
 * Unknown keys are refused, each with the key probably meant.
 */
export function parseScenario(input: unknown): ParseScenarioResult {
	const upgraded = upgradeScenarioDocument(input);
	if (!upgraded.ok) {
		return { ok: false, issues: [{ path: upgraded.path ?? '(document)', message: upgraded.message }], upgradedFrom: null };
	}
	const result = safeParseStrict(scenarioSchema, upgraded.document);
	if (result.success) return { ok: true, scenario: result.data, upgradedFrom: upgraded.upgradedFrom, upgradeNotes: upgraded.notes };
	return {
		ok: false,
		issues: result.issues.map((issue) => ({ path: formatIssuePath(issue.path), message: issue.message })),
		upgradedFrom: upgraded.upgradedFrom
	};
}
