/**
 * Request bodies of the workbench API (projects, scenarios, uploads,
 * sensitivity), shared by the API routes and the pages that call them.
 * The scenario document itself is validated by ./scenario.ts.
 */
import { z } from 'zod';

export const technologies = ['tidal-stream', 'ocean-current', 'wave'] as const;
export type Technology = (typeof technologies)[number];

const projectName = z.string().trim().min(1, 'give the project a name').max(200);
const currency = z
	.string()
	.trim()
	.regex(/^[A-Z]{3}$/, 'currency must be a three-letter code such as EUR');

export const createProjectBody = z.strictObject({
	name: projectName.describe('Project name, as shown in lists'),
	technology: z
		.enum(technologies, { message: 'technology must be tidal-stream, ocean-current or wave' })
		.describe('The kind of device the project uses; it cannot change later'),
	siteName: z.string().trim().max(200).default('').describe('Name of the site, such as a sound or a stretch of coast'),
	siteDescription: z.string().trim().max(4000).default('').describe('Free text about the site: depth, seabed, grid connection, access'),
	currency: currency.default('EUR').describe("Three-letter currency code of the project's money figures")
});
export type CreateProjectBody = z.output<typeof createProjectBody>;

/** Digits with at most one decimal point, and no thousands separators: 1.0825, 17000. */
const plainDecimal = /^\d{1,12}(\.\d{1,15})?$/;
const MAX_CONVERSION_RATE = 10_000_000;

/**
 * How many units of the new currency one unit of the old one is worth, as
 * typed (1.0825 for USD per EUR): a JSON number or a plain decimal string.
 * Read as a decimal on the server, never through a float.
 */
export const conversionRate = z
	.union([z.number(), z.string().trim().regex(plainDecimal, 'type the rate as digits with a point for decimals and no thousands separators, such as 1.0825')])
	.refine((rate) => Number(rate) > 0 && Number(rate) <= MAX_CONVERSION_RATE, {
		message: `the rate must be above 0 and at most ${MAX_CONVERSION_RATE.toLocaleString('en')}`,
		when: (payload) => payload.issues.length === 0
	});

/**
 * The technology is fixed once a project exists: its scenarios are built for
 * it. A new currency for a project whose scenarios hold money needs a word
 * on those amounts: `amounts: "keep"` (the figures stay and are read in the
 * new currency) or a `conversionRate` (every money amount is multiplied by
 * it); the server refuses the change without one (422 naming `amounts`).
 */
export const updateProjectBody = z
	.strictObject({
		name: projectName.optional().describe('New project name, as shown in lists'),
		siteName: z.string().trim().max(200).optional().describe('New name of the site'),
		siteDescription: z.string().trim().max(4000).optional().describe('New free text about the site, replacing the old'),
		currency: currency.optional().describe("New three-letter currency code of the project's money figures"),
		amounts: z
			.literal('keep', { message: 'amounts can only be "keep"; to convert, send conversionRate instead' })
			.optional()
			.describe('With a new currency: keep every money amount of the scenarios as it is, to be read in the new currency (not converted)'),
		conversionRate: conversionRate
			.optional()
			.describe('With a new currency: units of the new currency per unit of the old (1.0825 for USD per EUR); every money amount of every scenario is multiplied by it and saved as a new revision')
	})
	.refine((body) => Object.values(body).some((v) => v !== undefined), {
		message: 'nothing to change: give at least one field',
		when: (payload) => payload.issues.length === 0
	})
	.refine((body) => body.amounts === undefined || body.conversionRate === undefined, {
		message: 'give amounts: "keep" or a conversionRate, not both',
		path: ['conversionRate'],
		when: (payload) => payload.issues.length === 0
	})
	.refine((body) => body.currency !== undefined || (body.amounts === undefined && body.conversionRate === undefined), {
		message: 'amounts and conversionRate go with a new currency: send currency too',
		path: ['currency'],
		when: (payload) => payload.issues.length === 0
	});
export type UpdateProjectBody = z.output<typeof updateProjectBody>;

const scenarioName = z.string().trim().min(1, 'give the scenario a name').max(200);
const notes = z.string().max(10_000);

/**
 * `document` is checked separately against the scenario schema so its issues
 * carry paths such as `document.capex.lines[0].amount`. Without a document the
 * project's starter document for its technology is used.
 */
/** Document paths as the API writes issue paths: `capex.lines[0].amount`, `resource.bins`. */
const placeholderPaths = z.array(z.string().max(200)).max(1000);

export const createScenarioBody = z.strictObject({
	name: scenarioName.describe('Scenario name, as shown in lists and comparisons'),
	notes: notes.default('').describe('Free-text notes: sources, assumptions, open questions'),
	document: z.unknown().optional().describe("The scenario document; leave it out to start from the example of the project's technology"),
	placeholderPaths: placeholderPaths
		.optional()
		.describe(
			"With a document made from a template (such as the editor's blank defaults): the values still the template's placeholders, marked in the editor until edited. Without a document, the example's placeholders are marked"
		)
});

export const updateScenarioBody = z
	.strictObject({
		revision: z
			.number({ message: 'revision is required: the revision you were editing' })
			.int()
			.min(1)
			.describe('The revision you were editing; a save against an older one is refused with 409'),
		name: scenarioName.optional().describe('New scenario name'),
		notes: notes.optional().describe('New notes, replacing the old'),
		document: z.unknown().optional().describe('The whole scenario document as it should be saved'),
		placeholderPaths: placeholderPaths
			.optional()
			.describe(
				'The placeholder marks still to show (a subset of the scenario\'s placeholderPaths); leave it out to keep them all. Marks whose values the save changes go either way; a save never adds one'
			)
	})
	.refine((body) => body.name !== undefined || body.notes !== undefined || body.document !== undefined || body.placeholderPaths !== undefined, {
		message: 'nothing to save: give name, notes, document or placeholderPaths',
		when: (payload) => payload.issues.length === 0
	});

export const duplicateScenarioBody = z.strictObject({
	name: scenarioName.optional().describe('Name of the copy; without it, the original name followed by "(copy)"'),
	notes: notes.optional().describe("Notes of the copy; without them, the original's notes")
});

export const evaluateBody = z.strictObject({
	document: z.unknown().optional().describe('An unsaved draft to calculate instead of the saved scenario; leave it out to use the saved one')
});

export const applyUploadBody = z.strictObject({
	revision: z
		.number()
		.int()
		.min(1)
		.optional()
		.describe('The revision of the scenario you looked at; when it has moved on since, the change is refused with 409')
});

export const uploadKinds = [
	'current-speed-time-series',
	'speed-histogram',
	'power-curve',
	'sea-state-table',
	'power-matrix'
] as const;
export type UploadKind = (typeof uploadKinds)[number];

export const uploadKindSchema = z.enum(uploadKinds, {
	message: `kind must be one of ${uploadKinds.join(', ')}`
});

/** What each kind of upload fills in the scenario document, and for which technologies. */
export const uploadKindInfo: Record<UploadKind, { label: string; section: 'resource' | 'device'; technologies: readonly Technology[] }> = {
	'current-speed-time-series': { label: 'Current-speed time series', section: 'resource', technologies: ['tidal-stream', 'ocean-current'] },
	'speed-histogram': { label: 'Speed histogram', section: 'resource', technologies: ['tidal-stream', 'ocean-current'] },
	'power-curve': { label: 'Power curve', section: 'device', technologies: ['tidal-stream', 'ocean-current'] },
	'sea-state-table': { label: 'Sea-state table', section: 'resource', technologies: ['wave'] },
	'power-matrix': { label: 'Power matrix', section: 'device', technologies: ['wave'] }
};
