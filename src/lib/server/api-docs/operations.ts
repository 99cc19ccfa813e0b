/**
 * Every /api/v1 operation, stated once: what it does, who may call it, what
 * it reads and what it answers. The OpenAPI document (./openapi.ts) and the
 * API page are built from this list, and a test walks src/routes/api/v1 so a
 * route without an entry here (or an entry without a route) fails.
 */
import { z } from 'zod';
import type { WorkspaceRole } from '../auth/roles';
import { DRIVER_IDS } from '../engine/sensitivity';
import { csvTables, exportFormats } from '../workbench/export';
import { spiderBody, tornadoBody } from '../workbench/sensitivity-body';
import {
	apiErrorSchema,
	comparisonResponseSchema,
	decimalStringSchema,
	evaluationResponseSchema,
	evaluationResultSchema,
	healthResponseSchema,
	metricsJsonSchema,
	personRefSchema,
	projectJsonSchema,
	projectListJsonSchema,
	revisionJsonSchema,
	scenarioJsonSchema,
	scenarioListItemJsonSchema,
	scenarioListJsonSchema,
	spiderResponseSchema,
	tornadoResponseSchema,
	uploadJsonSchema,
	uploadListJsonSchema,
	uploadSummaryJsonSchema,
	workspaceJsonSchema,
	workspaceRoleSchema,
	workspaceWithPlanJsonSchema
} from '../../schemas/api-responses';
import { pageCursorSchema, pageLimitSchema } from '../../schemas/paging';
import { portfolioQueryFields, portfolioResponseSchema } from '../../schemas/portfolio';
import { scenarioSchema } from '../../schemas/scenario';
import { runInputSchema } from '../../schemas/probabilistic';
import {
	applyUploadBody,
	createProjectBody,
	createScenarioBody,
	duplicateScenarioBody,
	evaluateBody,
	updateProjectBody,
	updateScenarioBody,
	uploadKindSchema
} from '../../schemas/workbench';

export const httpMethods = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
export type HttpMethod = (typeof httpMethods)[number];

/** 'anyone': no sign-in; 'signed-in': any signed-in caller; otherwise the least workspace role. */
export type MinimumRole = 'anyone' | 'signed-in' | WorkspaceRole;

/**
 * Which personal API tokens may call: 'read-only' (any token), 'read-write'
 * (read-write tokens only), 'refused' (a browser session only) or
 * 'not-needed' (public).
 */
export type ApiTokenUse = 'read-only' | 'read-write' | 'refused' | 'not-needed';

export const apiTags = {
	Service: 'The state of the service and this description.',
	Workspaces: 'The workspaces you belong to and your role in each.',
	Projects: 'Projects: one site, one technology, many scenarios.',
	Scenarios: 'Scenarios: a document of assumptions, saved as numbered revisions.',
	Results: 'Figures calculated from a scenario: metrics, cash flows, sensitivity, comparison and exports.',
	Uploads: 'Resource and device data uploaded as CSV files and applied to scenarios.',
	Runs: 'Probabilistic runs: every chosen driver drawn at once, thousands of times, by worker processes; P10, P50 and P90 of the results.',
	Portfolio: "Every project of your workspaces with its base case's stored key figures, to read side by side.",
	Billing: "Stripe's event deliveries. Plans and seats are managed on the billing page in the browser, never with an API token."
} as const;
export type ApiTag = keyof typeof apiTags;

/** Refusals an operation can answer with, all in the one error shape. */
export type ErrorStatus = 400 | 401 | 402 | 403 | 404 | 409 | 413 | 415 | 422 | 429 | 503;

export interface ParameterSpec {
	description: string;
	schema: z.ZodType;
}

export interface QueryParameter extends ParameterSpec {
	name: string;
	required: boolean;
}

export interface RequestBodySpec {
	contentType: 'application/json' | 'multipart/form-data';
	/** Without a body the operation still works (for example: evaluate the saved scenario). */
	required: boolean;
	schema: z.ZodType;
}

export interface ResponseSpec {
	status: 200 | 201 | 202 | 204 | 503;
	description: string;
	/** The JSON answered; absent for files and empty answers. */
	json?: z.ZodType;
	/** Content types of a file answered instead of JSON. */
	fileTypes?: readonly string[];
}

export interface ApiOperation {
	operationId: string;
	method: HttpMethod;
	/** Under /api/v1, with `{param}` placeholders named as the route folders name them. */
	path: string;
	tag: ApiTag;
	summary: string;
	description?: string;
	minimumRole: MinimumRole;
	apiToken: ApiTokenUse;
	query?: QueryParameter[];
	requestBody?: RequestBodySpec;
	response: ResponseSpec;
	/** Other answers that are not refusals (the health check's 503). */
	otherResponses?: ResponseSpec[];
	/** Refusals beyond those that follow from the role, the body and the path (see errorStatusesOf). */
	otherErrors?: Exclude<ErrorStatus, 409>[];
	/** What a 409 means for this operation, in its own words; an operation without it never answers 409. */
	conflict?: string;
}

/** Path placeholders, the same wherever they appear. */
export const pathParameters: Record<string, ParameterSpec> = {
	workspaceId: { description: 'The workspace id (GET /api/v1/workspaces lists yours)', schema: z.guid() },
	projectId: { description: 'The project id', schema: z.guid() },
	scenarioId: { description: 'The scenario id', schema: z.guid() },
	uploadId: { description: 'The upload id', schema: z.guid() },
	revision: { description: 'A revision number of the scenario (1 is the first save)', schema: z.int().min(1) },
	runId: { description: 'The probabilistic run id', schema: z.guid() }
};

/** A JSON body whose `document` field is described as a scenario document (the route checks it separately). */
function withScenarioDocument<S extends z.ZodObject>(schema: S, description: string) {
	return schema.safeExtend({ document: scenarioSchema.optional().describe(description) });
}

function jsonBody(schema: z.ZodType, required: boolean): RequestBodySpec {
	return { contentType: 'application/json', required, schema };
}

const archivedQuery: QueryParameter = {
	name: 'archived',
	required: false,
	description: 'Send 1 to list the archived ones instead of the live ones',
	schema: z.enum(['1'])
};

/** Every list is paged: follow nextCursor until it is null. */
const pageQuery: QueryParameter[] = [
	{ name: 'limit', required: false, description: pageLimitSchema.description!, schema: pageLimitSchema },
	{ name: 'cursor', required: false, description: pageCursorSchema.description!, schema: pageCursorSchema }
];

const pagedDescription = 'A page at a time: send the answer\'s nextCursor back as ?cursor= for the next page, until it is null. A cursor this list did not give out is refused (422, cursor).';

const draftDocument =
	'An unsaved draft to calculate instead of the saved scenario (needs the analyst role, and with an API token a read-write one). Leave it out to use the saved scenario.';

/** The portfolio's filters and order, the same for its JSON and its CSV. */
const portfolioQuery: QueryParameter[] = (Object.keys(portfolioQueryFields) as (keyof typeof portfolioQueryFields)[]).map((name) => ({
	name,
	required: false,
	description: portfolioQueryFields[name].description!,
	schema: portfolioQueryFields[name]
}));

const portfolioDescription =
	"Each project, live and archived, with its base case (the live scenario marked so) and the figures of that base case's stored result for the current engine. A project without them is listed too, with the reason in missing and reason. A workspaceId you are not a member of answers 404, like any other workspace (an API token reaches its own workspace only).";

const projectEnvelope = z.object({ project: projectJsonSchema });

const runProgressSchema = z.object({
	drawsDone: z.int(),
	draws: z.int(),
	fraction: z.number(),
	etaSeconds: z.number().nullable().describe('Seconds left at the rate so far; null before the first chunk is in or once the run has ended')
});
const runFields = {
	id: z.guid(),
	workspaceId: z.guid(),
	projectId: z.guid(),
	scenarioId: z.guid(),
	scenarioRevision: z.int().describe('The revision the run drew on'),
	engineVersion: z.string(),
	seed: z.int(),
	draws: z.int(),
	chunkSize: z.int(),
	state: z.enum(['queued', 'running', 'done', 'cancelled', 'failed']),
	drawsDone: z.int(),
	failure: z.string().nullable(),
	createdBy: z.guid().nullable(),
	createdAt: z.iso.datetime(),
	startedAt: z.iso.datetime().nullable(),
	finishedAt: z.iso.datetime().nullable(),
	progress: runProgressSchema
};
const runJsonSchema = z.object({
	...runFields,
	input: runInputSchema,
	summary: z
		.record(z.string(), z.unknown())
		.nullable()
		.describe(
			'Once done: per output (lcoeReal, projectIrrPostTax, equityIrr, npv, minDscr) the statistics (mean, sd, min, max, p10, p50, p90: P90 is the value reached or bettered in 90 % of the draws), a histogram and a cumulative curve; the probabilities of the minimum DSCR below the lock-up level and below 1 and of the equity IRR below the hurdle; the rank correlation of each drawn input with each output'
		)
});
const runListItemJsonSchema = z.object({ ...runFields, scenarioName: z.string(), projectName: z.string(), createdByName: z.string().nullable() });
const scenarioEnvelope = z.object({ scenario: scenarioJsonSchema });

/** Shared schemas and the names the OpenAPI document gives them; anything else is named after its operation. */
export const namedResponseSchemas: Record<string, z.ZodType> = {
	Error: apiErrorSchema,
	PersonRef: personRefSchema,
	DecimalString: decimalStringSchema,
	WorkspaceRole: workspaceRoleSchema,
	Workspace: workspaceJsonSchema,
	Project: projectJsonSchema,
	ProjectEnvelope: projectEnvelope,
	ScenarioListItem: scenarioListItemJsonSchema,
	Scenario: scenarioJsonSchema,
	ScenarioEnvelope: scenarioEnvelope,
	ScenarioDocument: scenarioSchema,
	Revision: revisionJsonSchema,
	UploadSummary: uploadSummaryJsonSchema,
	Upload: uploadJsonSchema,
	Metrics: metricsJsonSchema,
	EvaluationResult: evaluationResultSchema
};

export const namedRequestSchemas: Record<string, z.ZodType> = {
	ScenarioDocumentInput: scenarioSchema
};

const webhookAnswer = z.object({
	received: z.literal(true),
	handled: z.boolean().describe('False for an event handled before (a replay) or of a type Tidewright does not use'),
	note: z.string()
});

export const apiOperations: ApiOperation[] = [
	{
		operationId: 'getHealth',
		method: 'GET',
		path: '/api/v1/health',
		tag: 'Service',
		summary: 'Check that the service and its database answer',
		minimumRole: 'anyone',
		apiToken: 'not-needed',
		response: { status: 200, description: 'The service and its database are up', json: healthResponseSchema },
		otherResponses: [{ status: 503, description: 'The database does not answer', json: healthResponseSchema }]
	},
	{
		operationId: 'receiveBillingEvent',
		method: 'POST',
		path: '/api/v1/billing/webhook',
		tag: 'Billing',
		summary: "Stripe's webhook: subscription, checkout and invoice events",
		description:
			'Called by Stripe, not by you. The Stripe-Signature header is checked against the raw body with the endpoint secret (older than 300 s, tampered or wrongly signed: 400). Each event is handled once; a failure answers 500 so Stripe delivers it again.',
		minimumRole: 'anyone',
		apiToken: 'not-needed',
		response: { status: 200, description: 'The event was received', json: webhookAnswer },
		otherErrors: [400]
	},
	{
		operationId: 'getOpenApiDocument',
		method: 'GET',
		path: '/api/v1/openapi.json',
		tag: 'Service',
		summary: 'This description of the API, as OpenAPI 3.1',
		minimumRole: 'anyone',
		apiToken: 'not-needed',
		response: { status: 200, description: 'The OpenAPI 3.1 document', json: z.record(z.string(), z.unknown()) }
	},
	{
		operationId: 'listWorkspaces',
		method: 'GET',
		path: '/api/v1/workspaces',
		tag: 'Workspaces',
		summary: 'List the workspaces you belong to',
		description: "With an API token: only the token's own workspace.",
		minimumRole: 'signed-in',
		apiToken: 'read-only',
		response: {
			status: 200,
			description: 'Your workspaces with your role and the plan of each',
			json: z.object({ workspaces: z.array(workspaceWithPlanJsonSchema) })
		}
	},
	{
		operationId: 'listProjects',
		method: 'GET',
		path: '/api/v1/workspaces/{workspaceId}/projects',
		tag: 'Projects',
		summary: "List a workspace's projects",
		description: pagedDescription,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [archivedQuery, ...pageQuery],
		response: { status: 200, description: 'The workspace and a page of its projects, by name', json: projectListJsonSchema },
		otherErrors: [422]
	},
	{
		operationId: 'createProject',
		method: 'POST',
		path: '/api/v1/workspaces/{workspaceId}/projects',
		tag: 'Projects',
		summary: 'Create a project',
		description: 'The technology is fixed once the project exists: its scenarios are built for it.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(createProjectBody, true),
		response: { status: 201, description: 'The new project', json: projectEnvelope },
		otherErrors: [402]
	},
	{
		operationId: 'getProject',
		method: 'GET',
		path: '/api/v1/projects/{projectId}',
		tag: 'Projects',
		summary: 'Read one project and your role in its workspace',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The project', json: z.object({ project: projectJsonSchema, role: workspaceRoleSchema }) }
	},
	{
		operationId: 'updateProject',
		method: 'PATCH',
		path: '/api/v1/projects/{projectId}',
		tag: 'Projects',
		summary: "Change a project's name, site or currency",
		description:
			'Send only the fields to change; the technology cannot change. Changing the currency never relabels money unasked: when scenarios of the project hold money in its currency, send amounts: "keep" (every figure stays and is read in the new currency) or a conversionRate (new currency per old; every money amount of those scenarios is multiplied by it, in decimal arithmetic), else the answer is 422 naming amounts and nothing changes. Either way each such scenario, archived ones too, is saved as a new revision that says what happened, and the change is in the audit log.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(updateProjectBody, true),
		response: { status: 200, description: 'The project as changed', json: projectEnvelope },
		conflict: 'The project is archived: restore it first; nothing was changed'
	},
	{
		operationId: 'archiveProject',
		method: 'DELETE',
		path: '/api/v1/projects/{projectId}',
		tag: 'Projects',
		summary: 'Archive a project',
		description: 'Its scenarios and uploads are kept; restoreProject brings it back.',
		minimumRole: 'owner',
		apiToken: 'read-write',
		response: { status: 200, description: 'The archived project', json: projectEnvelope }
	},
	{
		operationId: 'restoreProject',
		method: 'POST',
		path: '/api/v1/projects/{projectId}/restore',
		tag: 'Projects',
		summary: 'Bring an archived project back',
		minimumRole: 'owner',
		apiToken: 'read-write',
		response: { status: 200, description: 'The restored project', json: projectEnvelope },
		otherErrors: [402]
	},
	{
		operationId: 'listScenarios',
		method: 'GET',
		path: '/api/v1/projects/{projectId}/scenarios',
		tag: 'Scenarios',
		summary: "List a project's scenarios with their key figures (without their documents)",
		description: pagedDescription,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [archivedQuery, ...pageQuery],
		response: { status: 200, description: 'The project and a page of its scenarios, the base case first', json: scenarioListJsonSchema },
		otherErrors: [422]
	},
	{
		operationId: 'createScenario',
		method: 'POST',
		path: '/api/v1/projects/{projectId}/scenarios',
		tag: 'Scenarios',
		summary: 'Create a scenario',
		description:
			"From the document sent, or without one from the example scenario of the project's technology. The first scenario of a project becomes its base case.",
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(
			withScenarioDocument(createScenarioBody, "The scenario document; leave it out to start from the example of the project's technology."),
			true
		),
		response: { status: 201, description: 'The new scenario at revision 1', json: scenarioEnvelope },
		conflict: 'The project is archived: restore it before adding scenarios; nothing was created'
	},
	{
		operationId: 'listUploads',
		method: 'GET',
		path: '/api/v1/projects/{projectId}/uploads',
		tag: 'Uploads',
		summary: "List a project's uploads, newest first",
		description: pagedDescription,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: pageQuery,
		response: { status: 200, description: 'A page of the uploads, without their data', json: uploadListJsonSchema },
		otherErrors: [422]
	},
	{
		operationId: 'createUpload',
		method: 'POST',
		path: '/api/v1/projects/{projectId}/uploads',
		tag: 'Uploads',
		summary: 'Upload a resource or device data file (CSV)',
		description:
			'A file with any bad row is refused with every row and column problem (issues carry row and column) and nothing is stored; a good file is stored with its parsed data.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: {
			contentType: 'multipart/form-data',
			required: true,
			schema: z.object({
				kind: uploadKindSchema.describe('What the file holds; each kind has a template under /templates/'),
				file: z.file().describe('The CSV file, at most 20 MB')
			})
		},
		response: { status: 201, description: 'The stored upload with its parsed preview', json: z.object({ upload: uploadJsonSchema }) },
		otherErrors: [413, 415],
		conflict: 'The project is archived: restore it before uploading files to it; nothing was stored'
	},
	{
		operationId: 'compareScenarios',
		method: 'GET',
		path: '/api/v1/projects/{projectId}/compare',
		tag: 'Results',
		summary: 'Compare saved scenarios side by side',
		description:
			"Each scenario's metrics and its differences from the project's base case, words for the metrics without a value, the inputs that differ between the scenarios, and each scenario's usual sensitivity drivers with its own screening ranges (to send to the tornado route).",
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [
			{
				name: 'ids',
				required: false,
				description: "Scenario ids separated by commas, at most 12; without it, the project's live scenarios",
				schema: z.string()
			}
		],
		response: { status: 200, description: 'The scenarios with their metrics and differences', json: comparisonResponseSchema },
		otherErrors: [422]
	},
	{
		operationId: 'getScenario',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}',
		tag: 'Scenarios',
		summary: 'Read a scenario with its document',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: {
			status: 200,
			description: 'The scenario, its project and your role',
			json: z.object({ scenario: scenarioJsonSchema, project: projectJsonSchema, role: workspaceRoleSchema })
		}
	},
	{
		operationId: 'saveScenario',
		method: 'PUT',
		path: '/api/v1/scenarios/{scenarioId}',
		tag: 'Scenarios',
		summary: 'Save a new revision of a scenario',
		description:
			'Send the revision you were editing with the name, notes, document and/or placeholderPaths. When someone saved since, the answer is 409 with currentRevision and nothing is written. A save that only narrows placeholderPaths (the values were checked and stand) writes no new revision.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(withScenarioDocument(updateScenarioBody, 'The whole scenario document as it should be saved.'), true),
		response: { status: 200, description: 'The scenario at its new revision', json: scenarioEnvelope },
		conflict:
			'Someone saved the scenario since the revision you sent (currentRevision says where it is now), or the scenario or its project is archived and must be restored first; nothing was saved'
	},
	{
		operationId: 'deleteScenario',
		method: 'DELETE',
		path: '/api/v1/scenarios/{scenarioId}',
		tag: 'Scenarios',
		summary: 'Delete an archived scenario for good, with its history',
		description: 'Only a scenario archived first (409 otherwise).',
		minimumRole: 'owner',
		apiToken: 'read-write',
		response: { status: 204, description: 'Deleted' },
		conflict: 'The scenario is not archived: archive it first, then delete it; or its project is archived and must be restored first'
	},
	{
		operationId: 'archiveScenario',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/archive',
		tag: 'Scenarios',
		summary: 'Archive a scenario',
		description: 'An archived scenario is no longer the base case.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		response: { status: 200, description: 'The archived scenario', json: scenarioEnvelope },
		conflict: 'The project is archived: restore it before archiving its scenarios'
	},
	{
		operationId: 'markBaseCase',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/base-case',
		tag: 'Scenarios',
		summary: "Make a scenario its project's base case",
		description: 'The previous base case loses the mark. An archived scenario cannot be the base case (409).',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		response: { status: 200, description: 'The scenario, now the base case', json: scenarioEnvelope },
		conflict: 'The scenario is archived: restore it before making it the base case; or its project is archived and must be restored first'
	},
	{
		operationId: 'duplicateScenario',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/duplicate',
		tag: 'Scenarios',
		summary: 'Copy a saved scenario',
		description: 'The copy starts at revision 1; without a name it is called after the original with "(copy)".',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(duplicateScenarioBody, false),
		response: { status: 201, description: 'The copy', json: scenarioEnvelope },
		conflict: 'The project is archived: restore it before copying its scenarios; nothing was copied'
	},
	{
		operationId: 'evaluateScenario',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/evaluate',
		tag: 'Results',
		summary: 'Calculate the results of a scenario',
		description:
			'Energy, costs, the annual cash-flow table and the metrics of the saved scenario (empty body, open to viewers: the result stored for its revision) or of an unsaved draft (analysts and owners: calculated now, never stored).',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		requestBody: jsonBody(withScenarioDocument(evaluateBody, draftDocument), false),
		response: { status: 200, description: 'The results', json: evaluationResponseSchema },
		otherErrors: [403]
	},
	{
		operationId: 'exportScenario',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/export',
		tag: 'Results',
		summary: "Download a saved scenario's results as a spreadsheet",
		description:
			"XLSX: every table on its own sheet (About, Assumptions, Annual table, Metrics, Warnings, Cautions): the inputs in words with value and unit apart, numbers as numbers with number formats at the app's precision, header rows frozen. CSV: one table (the cash-flow table, the metrics or the assumptions), figures at the same precision, the cautions after a blank line. The file is named for the project, the scenario and the day (UTC), as skerrow-sound-base-case-2026-01-15.xlsx; a CSV file adds its table, as skerrow-sound-base-case-2026-01-15-metrics.csv.",
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [
			{ name: 'format', required: false, description: 'File format (xlsx when left out)', schema: z.enum(exportFormats) },
			{ name: 'table', required: false, description: 'For CSV: which table, the annual cash flows, the metrics or the inputs (cash-flow when left out)', schema: z.enum(csvTables) }
		],
		response: {
			status: 200,
			description: 'The file, as an attachment',
			fileTypes: ['application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'text/csv']
		},
		otherErrors: [422]
	},
	{
		operationId: 'getScenarioSummaryPdf',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/summary.pdf',
		tag: 'Results',
		summary: "Download a saved scenario's PDF summary",
		description:
			'The team copy: cover, key metrics, assumptions, the annual cash-flow table, charts (energy, cash flows, DSCR, a tornado of the real LCOE), the latest finished probabilistic run of the saved revision when there is one and the plan shows runs, and the method notes, with the cautions on every page.',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [{ name: 'run', required: false, description: 'none: leave the probabilistic run out', schema: z.enum(['none']) }],
		response: { status: 200, description: 'The PDF, as an attachment', fileTypes: ['application/pdf'] },
		otherErrors: [422]
	},
	{
		operationId: 'restoreScenario',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/restore',
		tag: 'Scenarios',
		summary: 'Bring an archived scenario back to the live list',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		response: { status: 200, description: 'The restored scenario', json: scenarioEnvelope },
		conflict: 'The project is archived: restore the project before restoring its scenarios'
	},
	{
		operationId: 'listScenarioRevisions',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/revisions',
		tag: 'Scenarios',
		summary: "List a scenario's revisions, newest first",
		description: 'Who changed which sections, and when.',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The history', json: z.object({ revisions: z.array(revisionJsonSchema) }) }
	},
	{
		operationId: 'getScenarioRevision',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/revisions/{revision}',
		tag: 'Scenarios',
		summary: 'Read the document as it was saved at one revision',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The document at that revision', json: z.object({ revision: z.int(), document: scenarioSchema }) }
	},
	{
		operationId: 'runSpider',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/spider',
		tag: 'Results',
		summary: 'Spider chart: one metric as each driver moves by the same relative steps',
		description: `Steps of -20 % to +20 % unless changes are sent; without drivers, all of them (${DRIVER_IDS.join(', ')}). Nothing is saved.`,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		requestBody: jsonBody(withScenarioDocument(spiderBody, draftDocument), false),
		response: { status: 200, description: 'One series of points for each driver', json: spiderResponseSchema },
		otherErrors: [403]
	},
	{
		operationId: 'runTornado',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/tornado',
		tag: 'Results',
		summary: 'Tornado chart: one metric at each driver’s low and high value',
		description: 'Without drivers, the usual screening ranges (capex and opex ±20 % and so on). Rows come sorted by swing, largest first. Nothing is saved.',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		requestBody: jsonBody(withScenarioDocument(tornadoBody, draftDocument), false),
		response: { status: 200, description: 'The rows of the tornado chart', json: tornadoResponseSchema },
		otherErrors: [403]
	},
	{
		operationId: 'listScenarioRuns',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/runs',
		tag: 'Runs',
		summary: "The scenario's probabilistic runs, newest first, with their progress",
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The runs (the latest 50)', json: z.object({ scenarioId: z.guid(), runs: z.array(runListItemJsonSchema) }) },
		otherErrors: [402]
	},
	{
		operationId: 'startRun',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/runs',
		tag: 'Runs',
		summary: 'Start a probabilistic run of the saved scenario',
		description:
			'Draws the chosen drivers from their distributions (with rank correlations) and the energy uncertainty; the debt is sized on the estimate and the years deliver the energy drawn. The same seed, input and revision give the same results. Paid plans; at most 4 runs waiting or running in a workspace, 10 starts a minute per user.',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		requestBody: jsonBody(runInputSchema, true),
		response: { status: 202, description: 'The queued run; GET it for its progress and, once done, its summary', json: z.object({ run: runJsonSchema }) },
		otherErrors: [402, 429]
	},
	{
		operationId: 'getRun',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/runs/{runId}',
		tag: 'Runs',
		summary: 'One run: input, state, progress and, once done, its summary',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The run', json: z.object({ run: runJsonSchema }) },
		otherErrors: [402]
	},
	{
		operationId: 'cancelRun',
		method: 'POST',
		path: '/api/v1/scenarios/{scenarioId}/runs/{runId}/cancel',
		tag: 'Runs',
		summary: 'Cancel a run that is waiting or drawing',
		minimumRole: 'analyst',
		apiToken: 'read-write',
		response: { status: 200, description: 'The cancelled run', json: z.object({ run: runJsonSchema }) },
		otherErrors: [402],
		conflict: 'The run has already ended (done, cancelled or failed); nothing was changed'
	},
	{
		operationId: 'downloadRunDraws',
		method: 'GET',
		path: '/api/v1/scenarios/{scenarioId}/runs/{runId}/draws.csv',
		tag: 'Runs',
		summary: "Download every draw of a finished run as CSV",
		description: 'One row per draw: its index, each drawn driver value, the energy factor and each output, in engine units (rates as fractions).',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The CSV file, as an attachment', fileTypes: ['text/csv'] },
		otherErrors: [402],
		conflict: 'The run is not done yet'
	},
	{
		operationId: 'listWorkspaceRuns',
		method: 'GET',
		path: '/api/v1/workspaces/{workspaceId}/runs',
		tag: 'Runs',
		summary: "The workspace's probabilistic runs, newest first",
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: [{ name: 'live', required: false, description: '1: only runs waiting or running', schema: z.enum(['1']) }],
		response: {
			status: 200,
			description: 'The runs (the latest 50)',
			json: z.object({ workspace: z.object({ id: z.guid(), name: z.string() }), runs: z.array(runListItemJsonSchema) })
		},
		otherErrors: [402]
	},
	{
		operationId: 'getUpload',
		method: 'GET',
		path: '/api/v1/uploads/{uploadId}',
		tag: 'Uploads',
		summary: "Read an upload's parsed data, summary and warnings",
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The upload', json: z.object({ upload: uploadJsonSchema }) }
	},
	{
		operationId: 'applyUpload',
		method: 'POST',
		path: '/api/v1/uploads/{uploadId}/apply',
		tag: 'Uploads',
		summary: "Put an upload's data into a scenario",
		description:
			"The parsed data replaces the scenario's resource or device, saved as a new revision. Send the revision you looked at to refuse the change when the scenario moved on since (409).",
		minimumRole: 'analyst',
		apiToken: 'read-write',
		query: [{ name: 'scenarioId', required: true, description: 'The scenario, in the same project, to apply the upload to', schema: z.guid() }],
		requestBody: jsonBody(applyUploadBody, false),
		response: {
			status: 200,
			description: 'The scenario at its new revision and the section that changed',
			json: z.object({ scenario: scenarioJsonSchema, section: z.enum(['resource', 'device']) })
		},
		conflict:
			'The scenario moved on since the revision you sent (currentRevision says where it is now), or the scenario or its project is archived and must be restored first; nothing was changed'
	},
	{
		operationId: 'getPortfolio',
		method: 'GET',
		path: '/api/v1/portfolio',
		tag: 'Portfolio',
		summary: 'Every project of your workspaces with its base case’s key figures',
		description: `${portfolioDescription} Figures are numbers in the engine’s units (rates and the capacity factor as fractions), money in the row’s currency.`,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: portfolioQuery,
		response: { status: 200, description: 'The rows, filtered and ordered as asked, with their counts', json: portfolioResponseSchema },
		otherErrors: [404, 422]
	},
	{
		operationId: 'exportPortfolio',
		method: 'GET',
		path: '/api/v1/portfolio.csv',
		tag: 'Portfolio',
		summary: 'Download the portfolio table as CSV',
		description: `${portfolioDescription} The rows of getPortfolio with the same query, figures rounded as the app shows them in their display units (per cent figures as per cent), units in the headers, the currency of each row beside its money, and the cautions after a blank line.`,
		minimumRole: 'viewer',
		apiToken: 'read-only',
		query: portfolioQuery,
		response: { status: 200, description: 'The CSV file, as an attachment', fileTypes: ['text/csv'] },
		otherErrors: [404, 422]
	},
	{
		operationId: 'downloadUploadFile',
		method: 'GET',
		path: '/api/v1/uploads/{uploadId}/file',
		tag: 'Uploads',
		summary: 'Download the file as it was uploaded',
		description:
			'Byte for byte, except that a cell a spreadsheet would run as a formula (starting with =, +, -, @, a tab or a carriage return, and not a number) gets a leading apostrophe, as in the exports.',
		minimumRole: 'viewer',
		apiToken: 'read-only',
		response: { status: 200, description: 'The CSV file, as an attachment', fileTypes: ['text/csv'] }
	}
];

const roleRank: Record<MinimumRole, number> = { anyone: 0, 'signed-in': 1, viewer: 2, analyst: 3, owner: 4 };

/** The placeholders of a path, in order: `/a/{x}/b/{y}` -> ['x', 'y']. */
export function pathPlaceholders(path: string): string[] {
	return [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
}

/** Operations whose work runs on the compute pool under per-user limits (src/lib/server/compute/limits.ts). */
const computeOperations = new Set(['evaluateScenario', 'runTornado', 'runSpider', 'compareScenarios', 'exportScenario', 'getScenarioSummaryPdf', 'createUpload']);

/**
 * The refusals an operation can answer with: 401 once sign-in is needed,
 * 404 for anything named in the path, 403 for a role above viewer or a
 * read-write token, 400/422 for a body, 429 for token rate limits, 409 where
 * the operation says what a conflict means, and the operation's own.
 */
export function errorStatusesOf(op: ApiOperation): ErrorStatus[] {
	const statuses = new Set<ErrorStatus>(op.otherErrors ?? []);
	if (op.conflict !== undefined) statuses.add(409);
	if (op.minimumRole !== 'anyone') statuses.add(401);
	if (roleRank[op.minimumRole] > roleRank.viewer || op.apiToken === 'read-write') statuses.add(403);
	if (pathPlaceholders(op.path).length > 0) statuses.add(404);
	if (op.requestBody) {
		statuses.add(400);
		statuses.add(422);
	}
	if (op.apiToken === 'read-only' || op.apiToken === 'read-write') statuses.add(429);
	// Work on the compute pool: per-user limits (429) and a time limit or full queue (503); see src/lib/server/compute.
	if (computeOperations.has(op.operationId)) {
		statuses.add(429);
		statuses.add(503);
	}
	// A state-changing call from a browser page on another site is refused (hooks.server.ts, cross-site.ts).
	if (op.method !== 'GET') statuses.add(403);
	return [...statuses].sort((a, b) => a - b);
}
