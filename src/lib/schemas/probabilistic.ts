/**
 * A probabilistic run: which scenario drivers are drawn from which
 * distributions, how they are rank-correlated, whether the scenario's energy
 * uncertainty is drawn too, and the seed and number of draws. Client-safe
 * (imports nothing server-only), so the run form validates with it.
 *
 * Driver values mean what they mean in the sensitivity drivers
 * (src/lib/server/engine/sensitivity.ts): a multiplier of the base inputs
 * (1 = base) for capex, opex, resource, losses and tariff, the value itself
 * for the others.
 */
import { z } from 'zod';
import { correlatedIds, correlationFactor } from '../probabilistic/correlation';
import { DRIVER_IDS, type DriverId } from '../sensitivity-drivers';

/** The sensitivity drivers' ids: one list for the engine and the runs (src/lib/sensitivity-drivers.ts). */
export const PROBABILISTIC_DRIVER_IDS = DRIVER_IDS;
export type ProbabilisticDriverId = DriverId;

export const RUN_LIMITS = { drivers: 16, minDraws: 100, maxDraws: 50_000, maxSeed: 2 ** 31 - 1 } as const;

/** zod 4 numbers are finite already (Infinity and NaN are refused). */
const finite = (what: string) => z.number({ error: `${what} must be a finite number` }).describe(what);
const positive = (what: string) => finite(what).refine((x) => x > 0, `${what} must be greater than 0`);

const normalSchema = z
	.strictObject({ shape: z.literal('normal'), mean: finite('mean'), sd: positive('sd') })
	.describe('Normal with this mean and standard deviation');

const truncatedNormalSchema = z
	.strictObject({
		shape: z.literal('truncated-normal'),
		mean: finite('mean'),
		sd: positive('sd'),
		min: finite('min'),
		max: finite('max')
	})
	.refine((d) => d.min < d.max, { path: ['max'], message: 'max must be greater than min' })
	.refine((d) => d.mean > d.min && d.mean < d.max, { path: ['mean'], message: 'mean must lie strictly between min and max' })
	.describe('A normal (mean, sd of the untruncated normal) cut to [min, max] and rescaled');

const triangularSchema = z
	.strictObject({ shape: z.literal('triangular'), min: finite('min'), mode: finite('mode'), max: finite('max') })
	.refine((d) => d.min < d.max, { path: ['max'], message: 'max must be greater than min' })
	.refine((d) => d.mode >= d.min && d.mode <= d.max, { path: ['mode'], message: 'mode must lie between min and max' })
	.describe('Triangular from min through the most likely value (mode) to max');

const uniformSchema = z
	.strictObject({ shape: z.literal('uniform'), min: finite('min'), max: finite('max') })
	.refine((d) => d.min < d.max, { path: ['max'], message: 'max must be greater than min' })
	.describe('Every value between min and max equally likely');

const lognormalSchema = z
	.strictObject({ shape: z.literal('lognormal'), mean: positive('mean'), sd: positive('sd') })
	.describe('Lognormal with this mean and standard deviation of the value itself (not of its logarithm)');

export const distributionSchema = z
	.discriminatedUnion('shape', [normalSchema, truncatedNormalSchema, triangularSchema, uniformSchema, lognormalSchema])
	.describe('The distribution a driver is drawn from');
export type Distribution = z.infer<typeof distributionSchema>;
export type DistributionShape = Distribution['shape'];

const driverId = z.enum(PROBABILISTIC_DRIVER_IDS).describe('A sensitivity driver');

const drawnDriverSchema = z.strictObject({ driver: driverId, distribution: distributionSchema }).describe('A driver and its distribution');

const correlationSchema = z
	.strictObject({
		a: driverId,
		b: driverId,
		rankCorrelation: finite('rankCorrelation').refine((r) => r > -1 && r < 1, 'rankCorrelation must lie strictly between -1 and 1')
	})
	.describe("Spearman rank correlation between two drawn drivers, applied through a Gaussian copula");

const runInputObject = z.strictObject({
	drivers: z
		.array(drawnDriverSchema)
		.max(RUN_LIMITS.drivers, `drivers: at most ${RUN_LIMITS.drivers}`)
		.describe('The drivers drawn, each from its own distribution; the others stay at their base values'),
	energyUncertainty: z
		.boolean()
		.default(true)
		.describe("Draw the scenario's energy uncertainty components too (independent of the drivers)"),
	correlations: z
		.array(correlationSchema)
		.max((RUN_LIMITS.drivers * (RUN_LIMITS.drivers - 1)) / 2, 'correlations: at most one per pair of drivers')
		.default([])
		.describe('Rank correlations between drawn drivers; pairs not given are independent'),
	seed: z
		.number()
		.int('seed must be a whole number')
		.min(0, 'seed must be at least 0')
		.max(RUN_LIMITS.maxSeed, `seed must be at most ${RUN_LIMITS.maxSeed}`)
		.default(1)
		.describe('The same seed, inputs and scenario give the same draws'),
	draws: z
		.number()
		.int('draws must be a whole number')
		.min(RUN_LIMITS.minDraws, `draws must be at least ${RUN_LIMITS.minDraws}`)
		.max(RUN_LIMITS.maxDraws, `draws must be at most ${RUN_LIMITS.maxDraws}`)
		.default(10_000)
		.describe('Number of draws'),
	hurdleRate: finite('hurdleRate')
		.refine((r) => r > -1 && r <= 1, 'hurdleRate must be a fraction per year above -1 and at most 1')
		.describe('Return the IRRs are compared with: nominal like them, fraction per year (0.10 for 10 %)')
});

export const runInputSchema = runInputObject
	.superRefine(
		(input, ctx) => {
			checkDrivers(input, ctx);
			checkCorrelations(input, ctx);
		},
		// The cross-field checks need every field valid first.
		{ when: (payload) => payload.issues.length === 0 }
	)
	.describe('A probabilistic (Monte Carlo) run over the scenario drivers');
export type RunInput = z.output<typeof runInputSchema>;
/** What a client sends: fields with a default may be left out. */
export type RunInputDraft = z.input<typeof runInputSchema>;

type RefineCtx = z.core.$RefinementCtx<unknown>;
type RunInputFields = z.output<typeof runInputObject>;

function checkDrivers(input: RunInputFields, ctx: RefineCtx): void {
	const seen = new Set<string>();
	input.drivers.forEach((d, i) => {
		if (seen.has(d.driver)) ctx.addIssue({ code: 'custom', path: ['drivers', i, 'driver'], message: `driver: ${d.driver} is drawn twice` });
		seen.add(d.driver);
	});
	if (input.drivers.length === 0 && !input.energyUncertainty)
		ctx.addIssue({ code: 'custom', path: ['drivers'], message: 'drivers: draw at least one driver, or the energy uncertainty' });
}

const pairName = (a: string, b: string) => `${a}-${b}`;

function checkCorrelations(input: RunInputFields, ctx: RefineCtx): void {
	const drawn = new Set<string>(input.drivers.map((d) => d.driver));
	const pairs = new Set<string>();
	let usable = true;
	input.correlations.forEach((c, i) => {
		for (const end of ['a', 'b'] as const) {
			if (!drawn.has(c[end])) {
				ctx.addIssue({ code: 'custom', path: ['correlations', i, end], message: `${end}: ${c[end]} is not among the drawn drivers` });
				usable = false;
			}
		}
		if (c.a === c.b) {
			ctx.addIssue({ code: 'custom', path: ['correlations', i, 'b'], message: `b must be another driver than a (${c.a})` });
			usable = false;
		}
		const key = [c.a, c.b].sort().join('|');
		if (pairs.has(key)) {
			ctx.addIssue({ code: 'custom', path: ['correlations', i], message: `correlations: the pair ${pairName(c.a, c.b)} is given twice` });
			usable = false;
		}
		pairs.add(key);
	});
	if (!usable || input.correlations.length === 0) return;
	const factor = correlationFactor(correlatedIds(PROBABILISTIC_DRIVER_IDS, input.correlations), input.correlations);
	if (!factor.ok) {
		const named = factor.pairs.map((c) => `${pairName(c.a, c.b)} ${c.rankCorrelation}`).join(', ');
		ctx.addIssue({
			code: 'custom',
			path: ['correlations'],
			message: `correlations: ${named} cannot all hold together (their correlation matrix is not positive definite); weaken one of them`
		});
	}
}
