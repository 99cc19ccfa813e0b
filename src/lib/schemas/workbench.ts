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
	name: projectName,
	technology: z.enum(technologies, { message: 'technology must be tidal-stream, ocean-current or wave' }),
	siteName: z.string().trim().max(200).default(''),
	siteDescription: z.string().trim().max(4000).default(''),
	currency: currency.default('EUR')
});
export type CreateProjectBody = z.output<typeof createProjectBody>;

/** The technology is fixed once a project exists: its scenarios are built for it. */
export const updateProjectBody = z
	.strictObject({
		name: projectName.optional(),
		siteName: z.string().trim().max(200).optional(),
		siteDescription: z.string().trim().max(4000).optional(),
		currency: currency.optional()
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
	name: scenarioName,
	notes: notes.default(''),
	document: z.unknown().optional()
});

export const updateScenarioBody = z
	.strictObject({
		revision: z.number({ message: 'revision is required: the revision you were editing' }).int().min(1),
		name: scenarioName.optional(),
		notes: notes.optional(),
		document: z.unknown().optional()
	})
	.refine((body) => body.name !== undefined || body.notes !== undefined || body.document !== undefined, {
		message: 'nothing to save: give name, notes or document',
		when: (payload) => payload.issues.length === 0
	});

export const duplicateScenarioBody = z.strictObject({
	name: scenarioName.optional(),
	notes: notes.optional()
});

export const evaluateBody = z.strictObject({ document: z.unknown().optional() });

export const applyUploadBody = z.strictObject({
	revision: z.number().int().min(1).optional()
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
