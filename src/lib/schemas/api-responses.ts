/**
 * The JSON the /api/v1 routes answer with, stated as zod schemas so the
 * OpenAPI document can describe it. They mirror what
 * src/lib/server/workbench/serialize.ts and the engine return (dates as ISO
 * strings, money and energy as decimal strings); they describe the answers,
 * they do not produce them.
 */
import { z } from 'zod';
import { nextCursorSchema } from './paging';
import { scenarioSchema } from './scenario';
import { technologies, uploadKinds } from './workbench';

/** Same order as src/lib/server/auth/roles.ts (kept here so this module stays importable in the browser). */
export const workspaceRoleSchema = z.enum(['viewer', 'analyst', 'owner']).describe('Role in the workspace: viewer reads, analyst edits, owner also manages');

const isoDateTime = z.iso.datetime().describe('Date and time in UTC, ISO 8601');

export const decimalStringSchema = z
	.string()
	.regex(/^-?\d+(\.\d+)?$/)
	.describe('A decimal number written as a string, kept exact (rounded to at most 10 decimal places)');

export const personRefSchema = z
	.object({ id: z.uuid(), name: z.string() })
	.describe('A member of the workspace, as the history shows them');

export const workspaceJsonSchema = z.object({
	id: z.uuid(),
	name: z.string(),
	role: workspaceRoleSchema
});

export const workspaceWithPlanJsonSchema = workspaceJsonSchema.extend({
	plan: z.string().describe("The workspace's plan (free until billing sets another)")
});

export const projectJsonSchema = z.object({
	id: z.uuid(),
	workspaceId: z.uuid(),
	name: z.string(),
	technology: z.enum(technologies),
	siteName: z.string(),
	siteDescription: z.string(),
	currency: z.string().describe('Three-letter currency code, such as EUR'),
	createdAt: isoDateTime,
	updatedAt: isoDateTime,
	archivedAt: isoDateTime.nullable().describe('When the project was archived; null while it is live')
});

export const scenarioSummaryJsonSchema = z.object({
	id: z.uuid(),
	projectId: z.uuid(),
	name: z.string(),
	notes: z.string(),
	schemaVersion: z.number().int().describe('Version of the scenario document format'),
	revision: z.number().int().min(1).describe('Raised by one on every save; send it back when you save'),
	isBaseCase: z.boolean().describe("Whether this is the project's base case, the one compare measures against"),
	archivedAt: isoDateTime.nullable(),
	createdAt: isoDateTime,
	updatedAt: isoDateTime,
	createdBy: personRefSchema.nullable(),
	updatedBy: personRefSchema.nullable()
});

export const keyFiguresJsonSchema = z
	.object({
		currency: z.string(),
		values: z.record(z.string(), decimalStringSchema.nullable()).describe('A few headline metrics by key (lcoeReal, equityIrr, minDscr, netAepMWh)')
	})
	.describe('Headline figures of the saved revision from its stored result');

export const scenarioListItemJsonSchema = scenarioSummaryJsonSchema.extend({
	keyFigures: keyFiguresJsonSchema
		.nullable()
		.optional()
		.describe('Null when the revision has no stored result of the current engine yet (for example just after an engine change)')
});

export const projectListJsonSchema = z.object({
	workspace: workspaceJsonSchema,
	projects: z.array(projectJsonSchema).describe('By name, then id'),
	nextCursor: nextCursorSchema
});

export const scenarioListJsonSchema = z.object({
	project: projectJsonSchema,
	scenarios: z.array(scenarioListItemJsonSchema).describe('The base case first, then by name, then oldest first'),
	nextCursor: nextCursorSchema
});

export const scenarioJsonSchema = scenarioSummaryJsonSchema.extend({
	document: scenarioSchema.describe('The scenario document in the current format (an older stored one is upgraded in the answer, not in storage)'),
	upgradedFrom: z.number().int().nullable().describe('The format version the stored document was upgraded from for this answer; null when stored in the current format'),
	upgradeNotes: z.array(z.string()).describe('What the upgrade changed, field by field; empty when nothing was upgraded'),
	placeholderPaths: z
		.array(z.string())
		.describe(
			"Values of the document that are still the placeholders of the example (or blank defaults) the scenario started from, as paths such as capex.lines[0].amount; the editor marks them until they are edited. Read only: a save can only narrow it"
		)
});

export const revisionJsonSchema = z.object({
	revision: z.number().int().min(1),
	name: z.string(),
	changedSections: z.array(z.string()).describe('Top-level sections of the document this save changed'),
	summary: z.string(),
	changedAt: isoDateTime,
	changedBy: personRefSchema.nullable()
});

export const uploadSummaryJsonSchema = z.object({
	id: z.uuid(),
	projectId: z.uuid(),
	kind: z.enum(uploadKinds),
	fileName: z.string(),
	contentType: z.string(),
	byteSize: z.number().int().min(0),
	sha256: z.string().regex(/^[0-9a-f]{64}$/),
	uploadedBy: personRefSchema.nullable(),
	createdAt: isoDateTime
});

export const uploadListJsonSchema = z.object({
	uploads: z.array(uploadSummaryJsonSchema).describe('Newest first'),
	nextCursor: nextCursorSchema
});

export const uploadJsonSchema = uploadSummaryJsonSchema.extend({
	data: z.unknown().describe('The parsed data: the part of a scenario document this file fills in'),
	summary: z.record(z.string(), z.unknown()).describe('Figures about the file for the preview (rows, ranges, totals)'),
	warnings: z.array(z.string())
});

export const metricsJsonSchema = z
	.record(z.string(), decimalStringSchema.nullable())
	.describe('Each metric by its key (lcoeReal, equityIrr, npv, minDscr, ...); null when the metric is undefined for this scenario');

const energyBinSchema = z
	.object({
		speedMPerS: decimalStringSchema.optional(),
		hsM: decimalStringSchema.optional(),
		teS: decimalStringSchema.optional(),
		fluxKWPerM: decimalStringSchema.optional(),
		probability: decimalStringSchema,
		hours: decimalStringSchema,
		devicePowerKW: decimalStringSchema,
		arrayGrossEnergyMWh: decimalStringSchema
	})
	.describe('One bin of the resource: a flow speed, or a sea state (Hs, Te)');

const cashFlowRowSchema = z
	.object({
		t: z.number().int().describe('Year: 0 is the commercial operation date, negative years are construction'),
		phase: z.enum(['construction', 'operation'])
	})
	.catchall(decimalStringSchema.nullable())
	.describe('One year of the cash-flow table; every other column (energyMWh, revenue, opex, cfads, dscr, ...) is a decimal string, or null where undefined');

const exceedanceRowSchema = z.object({ label: z.string(), levelPercent: z.number(), aepMWh: decimalStringSchema, shareOfP50: decimalStringSchema });

export const evaluationResultSchema = z.object({
	schemaVersion: z.number().int(),
	scenarioName: z.string(),
	technology: z.enum(technologies),
	currency: z.string(),
	timeConvention: z.string(),
	energy: z.object({
		deviceCount: z.number().int(),
		ratedPowerPerDeviceKW: decimalStringSchema,
		installedCapacityKW: decimalStringSchema,
		meanDevicePowerKW: decimalStringSchema,
		grossAepMWh: decimalStringSchema,
		lossFactor: decimalStringSchema,
		netAepMWh: decimalStringSchema,
		curtailment: decimalStringSchema.describe('Share of the net energy curtailed (revenue.curtailment): neither delivered nor paid for'),
		curtailedAepMWh: decimalStringSchema.describe('Year-1 energy curtailed, MWh (net AEP x curtailment)'),
		deliveredAepMWh: decimalStringSchema.describe('Year-1 energy delivered and sold, MWh (net AEP less curtailment): what revenue, per-MWh opex and the LCOE use'),
		combinedSigma: decimalStringSchema,
		exceedances: z
			.array(exceedanceRowSchema)
			.describe('One-year exceedance levels (P90 and the levels asked for)'),
		energySource: z
			.enum(['resource-and-device', 'assessed'])
			.describe("resource-and-device: the device's power over the resource, less losses; assessed: an assessment's net P50 as given"),
		sigmaLongTerm: decimalStringSchema.describe('Long-term uncertainty, one standard deviation as a fraction of P50'),
		sigmaInterAnnual: decimalStringSchema.describe('Year-to-year variability, one standard deviation as a fraction of P50'),
		exceedancesByHorizon: z
			.array(z.object({ horizonYears: z.number().int(), sigma: decimalStringSchema, levels: z.array(exceedanceRowSchema) }))
			.describe('Exceedance levels of the mean annual energy over one and ten years; sigma_N = sqrt(sigma_LT^2 + sigma_IAV^2 / N)'),
		capacityFactor: decimalStringSchema.nullable(),
		bins: z.array(energyBinSchema)
	}),
	costs: z.object({
		capexRealTotal: decimalStringSchema,
		capexLines: z.array(z.object({ name: z.string(), realTotal: decimalStringSchema })),
		grantsRealTotal: decimalStringSchema,
		decommissioningNominal: decimalStringSchema
	}),
	rates: z.object({
		inflation: decimalStringSchema,
		tariffInflation: decimalStringSchema.describe('Inflation the tariff and merchant price follow (revenue.tariffInflation, else inflation)'),
		realDiscountRate: decimalStringSchema,
		nominalDiscountRate: decimalStringSchema
	}),
	financing: z
		.object({
			sizedBy: z.enum(['gearing', 'target-dscr', 'gearing-cap']),
			governingCase: z.string().nullable().describe('The energy case (P50, P90...) whose target DSCR set the debt, when sized by DSCR'),
			gearing: decimalStringSchema.describe('Debt over the total funding need'),
			debtAmount: decimalStringSchema.describe('Balance at COD, capitalised interest included'),
			debtDrawn: decimalStringSchema.describe('Cash drawn from the lenders during construction'),
			interestDuringConstruction: decimalStringSchema.describe('Interest accrued on the debt drawn, to COD (capitalised or paid by equity)'),
			commitmentFees: decimalStringSchema.describe('Commitment fees on the undrawn loan during construction'),
			upfrontFee: decimalStringSchema,
			totalFundingNeed: decimalStringSchema.describe('Spend net of grants, financing costs of construction and reserves funded at COD'),
			equityInvested: decimalStringSchema.describe('Equity paid in during construction'),
			fundingOrder: z.enum(['equity-first', 'pro-rata']),
			sizingCases: z
				.array(
					z.object({
						label: z.string(),
						targetDscr: z.number(),
						debtCapacity: decimalStringSchema.describe('Balance at COD this case alone would allow'),
						limitedBy: z.enum(['repayment', 'grace', 'cfads']).describe('What binds the case on its own: repayment years, interest-only grace years, or CFADS not positive'),
						bindsInYears: z.array(z.number().int()).describe('A loan sculpted on several cases: the operating years whose debt service this case sets (its DSCR equals its target there)'),
						minDscr: decimalStringSchema.nullable(),
						dscr: z.array(decimalStringSchema.nullable()).describe("DSCR each operating year under this case's energy, with the debt as sized")
					})
				)
				.describe('Each energy case the debt was sized on (empty when sized by gearing)')
		})
		.nullable()
		.describe('How the debt was sized; null when the scenario has no debt'),
	cashFlow: z.array(cashFlowRowSchema),
	metrics: metricsJsonSchema,
	coverShortfalls: z
		.object({
			negativeCfadsYears: z.array(z.number().int()).describe('Operating years of the loan with negative CFADS (the minimum DSCR leaves them out)'),
			dscrBelowOneYears: z.array(z.number().int()).describe('Operating years whose DSCR is below 1')
		})
		.describe('Years a lender asks about beside the minimum DSCR'),
	warnings: z.array(z.string())
});

const evaluationSource = z.enum(['saved', 'draft']).describe('saved: the scenario as saved; draft: the document sent in the body');

export const evaluationResponseSchema = z.object({
	scenarioId: z.uuid(),
	revision: z.number().int(),
	source: evaluationSource,
	engineVersion: z.string().describe('The version of the calculation engine that produced the result'),
	computedAt: isoDateTime.optional().describe('For the saved scenario: when its stored result was calculated'),
	result: evaluationResultSchema
});

const metricDifferenceSchema = z.object({
	absolute: decimalStringSchema.describe('scenario minus base case, in the unit of the metric'),
	relative: decimalStringSchema.nullable().describe('(scenario minus base case) / |base case|; null when the base case is 0')
});

export const comparisonResponseSchema = z.object({
	projectId: z.uuid(),
	currency: z.string(),
	metrics: z.array(z.object({ key: z.string(), unit: z.string() })),
	baseCase: z.object({ id: z.uuid(), name: z.string(), revision: z.number().int(), metrics: metricsJsonSchema }).nullable(),
	scenarios: z.array(
		z.object({
			id: z.uuid(),
			name: z.string(),
			revision: z.number().int(),
			isBaseCase: z.boolean(),
			metrics: metricsJsonSchema,
			differences: z
				.record(z.string(), metricDifferenceSchema.nullable())
				.nullable()
				.describe('Against the base case, by metric key; null when the project has no base case'),
			coverShortfalls: z
				.object({ negativeCfadsYears: z.array(z.number().int()), dscrBelowOneYears: z.array(z.number().int()) })
				.describe('Operating years of the loan with negative CFADS, and with a DSCR below 1, shown beside the minimum DSCR (empty for a result stored before they were reported)'),
			missingValues: z
				.record(z.string(), z.string())
				.describe('For each metric without a value, by key, why in words ("no IRR: cash flows never change sign …"), the engine’s own reason where the result has one'),
			warnings: z.array(z.string())
		})
	),
	inputDifferences: z
		.array(
			z.object({
				title: z.string().describe('A section of the assumptions, in the editor’s order'),
				rows: z.array(
					z.object({
						table: z.string().nullable().describe('The table of the section the input sits in; null for a single fact'),
						label: z.string().describe('The input, or a table cell as "row, column"'),
						unit: z.string().describe('The unit every value is in; empty when the values are words or carry their own units'),
						values: z.array(z.string().nullable()).describe('One value a scenario, in the order of scenarios; null where a scenario has no such input')
					})
				)
			})
		)
		.nullable()
		.describe('The inputs whose values differ between the chosen scenarios, in the words and units of the assumptions summary, without figures the engine worked out; empty when they agree, null when a saved document no longer reads'),
	screeningDrivers: z
		.record(
			z.uuid(),
			z.array(
				z.object({
					driver: z.string(),
					label: z.string(),
					unit: z.string(),
					baseInput: z.number(),
					low: z.number().describe('The low value for the tornado route: a multiplier of the base or the value itself'),
					high: z.number(),
					usual: z.boolean()
				})
			)
		)
		.describe('By scenario id: the usual sensitivity drivers with that scenario’s own screening ranges (multiplier ranges are the same for every scenario)')
});

const driverRangeSchema = z.object({ driver: z.string(), low: z.number(), high: z.number() });

export const tornadoResponseSchema = z.object({
	scenarioId: z.uuid(),
	revision: z.number().int(),
	source: evaluationSource,
	drivers: z.array(driverRangeSchema).describe('The drivers and ranges used'),
	tornado: z.object({
		metric: z.string(),
		unit: z.string(),
		baseOutput: decimalStringSchema.nullable(),
		rows: z.array(
			z.object({
				driver: z.string(),
				label: z.string(),
				unit: z.string(),
				baseInput: z.number(),
				lowInput: z.number(),
				highInput: z.number(),
				lowOutput: decimalStringSchema.nullable(),
				highOutput: decimalStringSchema.nullable(),
				swing: decimalStringSchema.nullable()
			})
		),
		warnings: z.array(z.string())
	})
});

export const spiderResponseSchema = z.object({
	scenarioId: z.uuid(),
	revision: z.number().int(),
	source: evaluationSource,
	spider: z.object({
		metric: z.string(),
		unit: z.string(),
		series: z.array(
			z.object({
				driver: z.string(),
				label: z.string(),
				points: z.array(z.object({ change: z.number(), input: z.number(), output: decimalStringSchema.nullable() }))
			})
		),
		warnings: z.array(z.string()).describe('Energy warnings the moved runs raise and the base case does not, each after the run it came from')
	})
});

export const healthResponseSchema = z.object({
	status: z.enum(['ok', 'degraded']),
	db: z.enum(['ok', 'down'])
});

export const apiIssueSchema = z
	.object({
		path: z.string().describe('The field the issue concerns, such as document.capex.lines[0].amount, or (body)'),
		message: z.string(),
		row: z.number().int().nullable().optional().describe('For uploaded files: the row of the file (null when the problem is not in one row)'),
		column: z.string().nullable().optional().describe('For uploaded files: the column of the file (null when the problem is not in one column)')
	})
	.describe('One problem with one field');

export const apiErrorSchema = z
	.object({
		error: z
			.object({
				message: z.string().describe('What went wrong, in words for people'),
				issues: z.array(apiIssueSchema)
			})
			.catchall(z.unknown())
			.describe('Some refusals carry more facts, such as currentRevision on a stale save')
	})
	.describe('Every refusal of the API has this shape');
