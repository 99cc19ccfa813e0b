/**
 * The response schemas describe what the API really answers: each is checked
 * against the output of the function the route sends (engine, compare,
 * serializers, the error helper), so the OpenAPI document cannot drift from it.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { workspaceRoles } from '../server/auth/roles';
import { apiError } from '../server/api';
import { evaluateScenario } from '../server/engine/evaluate';
import { defaultDrivers, spider, tornado } from '../server/engine/sensitivity';
import { compareScenarios } from '../server/workbench/compare';
import { inputDifferences } from '../server/workbench/input-differences';
import { sensitivityChoices } from '../server/analysis/sensitivity-choices';
import { projectJson, scenarioJson, scenarioSummaryJson, uploadJson } from '../server/workbench/serialize';
import type { KeyFigures } from '../server/workbench/stored-results';
import { asJson } from '../workbench/api-types';
import {
	apiErrorSchema,
	comparisonResponseSchema,
	evaluationResponseSchema,
	evaluationResultSchema,
	projectJsonSchema,
	scenarioJsonSchema,
	scenarioListItemJsonSchema,
	spiderResponseSchema,
	tornadoResponseSchema,
	uploadJsonSchema,
	workspaceRoleSchema,
	workspaceWithPlanJsonSchema
} from './api-responses';
import { parseScenario, type Scenario } from './scenario';

const examplesDir = fileURLToPath(new URL('../../../examples/', import.meta.url));
const examples: Scenario[] = readdirSync(examplesDir)
	.filter((name) => name.endsWith('.json'))
	.sort()
	.map((name) => {
		const parsed = parseScenario(JSON.parse(readFileSync(examplesDir + name, 'utf8')));
		if (!parsed.ok) throw new Error(`examples/${name} does not parse: ${JSON.stringify(parsed.issues)}`);
		return parsed.scenario;
	});

/** Parses as the client would receive it (after JSON), reporting the paths that do not fit. */
function fits(schema: z.ZodType, value: unknown): string[] {
	const result = schema.safeParse(asJson(value));
	return result.success ? [] : result.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
}

const uuid = (n: number) => `00000000-0000-4000-8000-00000000000${n}`;
const when = new Date('2026-03-01T09:30:00.000Z');

describe('workspaceRoleSchema', () => {
	it('lists the same roles as the roles module', () => {
		expect(workspaceRoleSchema.options).toEqual([...workspaceRoles]);
	});
});

describe('evaluationResultSchema', () => {
	it('fits the engine result of every example scenario', () => {
		expect(examples.length).toBeGreaterThanOrEqual(3);
		for (const scenario of examples) expect(fits(evaluationResultSchema, evaluateScenario(scenario))).toEqual([]);
	});

	it('refuses a metric written as a number instead of a decimal string', () => {
		const result = asJson<Record<string, unknown>>(evaluateScenario(examples[0]));
		expect(fits(evaluationResultSchema, { ...result, metrics: { lcoeReal: 123.4 } })).not.toEqual([]);
	});
});

describe('evaluationResponseSchema', () => {
	it('fits the answer of the evaluate route for a draft', () => {
		const answer = { scenarioId: uuid(1), revision: 3, source: 'draft', engineVersion: '1', result: evaluateScenario(examples[0]) };
		expect(fits(evaluationResponseSchema, answer)).toEqual([]);
	});
});

describe('comparisonResponseSchema', () => {
	it('fits a comparison against a base case', () => {
		const [first, second] = examples;
		const entry = (scenario: Scenario, n: number, isBaseCase: boolean) => ({
			id: uuid(n),
			name: scenario.name,
			revision: 1,
			isBaseCase,
			result: evaluateScenario(scenario)
		});
		const base = entry(first, 1, true);
		const other = entry(second, 2, false);
		const answer = {
			projectId: uuid(9),
			currency: 'EUR',
			...compareScenarios([base, other], base),
			inputDifferences: inputDifferences([
				{ document: first, result: base.result },
				{ document: second, result: other.result }
			]),
			screeningDrivers: { [base.id]: sensitivityChoices(first).filter((c) => c.usual), [other.id]: sensitivityChoices(second).filter((c) => c.usual) }
		};
		expect(answer.inputDifferences.length).toBeGreaterThan(0);
		expect(fits(comparisonResponseSchema, answer)).toEqual([]);
		expect(fits(comparisonResponseSchema, { ...answer, inputDifferences: null })).toEqual([]);
	});
});

describe('tornadoResponseSchema and spiderResponseSchema', () => {
	it('fit the sensitivity routes answers', () => {
		const scenario = examples[0];
		const drivers = defaultDrivers(scenario);
		const common = { scenarioId: uuid(1), revision: 2, source: 'saved' };
		expect(fits(tornadoResponseSchema, { ...common, drivers, tornado: tornado(scenario, drivers, 'lcoeReal') })).toEqual([]);
		const ids = drivers.map((d) => d.driver);
		expect(fits(spiderResponseSchema, { ...common, spider: spider(scenario, ids, 'npv') })).toEqual([]);
	});
});

describe('workspaceWithPlanJsonSchema', () => {
	it('fits a workspace as the workspaces route lists it, and refuses a made-up role', () => {
		const workspace = { id: uuid(2), name: 'Orrin Tidal Partners', role: 'analyst', plan: 'free' };
		expect(fits(workspaceWithPlanJsonSchema, workspace)).toEqual([]);
		expect(fits(workspaceWithPlanJsonSchema, { ...workspace, role: 'admin' })).not.toEqual([]);
	});
});

describe('projectJsonSchema, scenarioJsonSchema, scenarioListItemJsonSchema and uploadJsonSchema', () => {
	it('fit what the serializers make of stored rows', () => {
		const project = projectJson({
			id: uuid(1),
			workspace_id: uuid(2),
			name: 'Kestle Narrows array',
			technology: 'tidal-stream',
			site_name: 'Kestle Narrows',
			site_description: '',
			currency: 'EUR',
			created_at: when,
			updated_at: when,
			archived_at: null
		} as Parameters<typeof projectJson>[0]);
		expect(fits(projectJsonSchema, project)).toEqual([]);

		const person = { id: uuid(3), name: 'Ilse Varga' };
		const summary = {
			id: uuid(4),
			projectId: uuid(1),
			name: examples[0].name,
			notes: '',
			schemaVersion: examples[0].schemaVersion,
			revision: 2,
			isBaseCase: true,
			archivedAt: null,
			createdAt: when,
			updatedAt: when,
			createdBy: person,
			updatedBy: null
		};
		expect(fits(scenarioJsonSchema, scenarioJson({ ...summary, document: examples[0], placeholderPaths: ['capex.lines[0].amount'] }))).toEqual([]);
		const keyFigures: KeyFigures = { currency: 'EUR', values: { lcoeReal: '212.5', equityIrr: null, minDscr: '1.35', netAepMWh: '40150' } };
		expect(fits(scenarioListItemJsonSchema, { ...scenarioSummaryJson(summary), keyFigures })).toEqual([]);
		expect(fits(scenarioListItemJsonSchema, { ...scenarioSummaryJson(summary), keyFigures: null })).toEqual([]);

		const upload = uploadJson({
			id: uuid(5),
			projectId: uuid(1),
			kind: 'power-curve',
			fileName: 'curve.csv',
			contentType: 'text/csv',
			byteSize: 120,
			sha256: 'a'.repeat(64),
			uploadedBy: person,
			createdAt: when,
			parsed: { data: { kind: 'power-curve', points: [] }, summary: { rows: 0 }, warnings: [] }
		});
		expect(fits(uploadJsonSchema, upload)).toEqual([]);
	});
});

describe('apiErrorSchema', () => {
	it('fits what apiError answers, extra facts included', async () => {
		const response = apiError(409, 'The scenario changed.', [{ path: 'revision', message: 'now at 4' }], { currentRevision: 4 });
		const body = await response.json();
		expect(fits(apiErrorSchema, body)).toEqual([]);
		expect(fits(apiErrorSchema, { message: 'flat' })).not.toEqual([]);
	});
});
