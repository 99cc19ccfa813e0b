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

/** The technology is fixed once a project exists: its scenarios are built for it. */
export const updateProjectBody = z
	.strictObject({
		name: projectName.optional().describe('New project name, as shown in lists'),
		siteName: z.string().trim().max(200).optional().describe('New name of the site'),
		siteDescription: z.string().trim().max(4000).optional().describe('New free text about the site, replacing the old'),
		currency: currency.optional().describe("New three-letter currency code of the project's money figures")
	})
	.refine((body) => Object.values(body).some((v) => v !== undefined), {
		message: 'nothing to change: give at least one field',
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
export const createScenarioBody = z.strictObject({
	name: scenarioName.describe('Scenario name, as shown in lists and comparisons'),
	notes: notes.default('').describe('Free-text notes: sources, assumptions, open questions'),
	document: z.unknown().optional().describe("The scenario document; leave it out to start from the example of the project's technology")
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
		document: z.unknown().optional().describe('The whole scenario document as it should be saved')
	})
	.refine((body) => body.name !== undefined || body.notes !== undefined || body.document !== undefined, {
		message: 'nothing to save: give name, notes or document',
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
