import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from './openapi';
import { apiOperations } from './operations';
import { apiReference, objectFields, plainSchemaName, schemaRules, schemaTypeLabel } from './reference';

const document = buildOpenApiDocument(apiOperations, { origin: 'https://tidewright.example', version: '1.0.0', sessionCookie: 'tw_session' });

describe('plainSchemaName', () => {
	it('writes a component name in words, without the Input suffix', () => {
		expect(plainSchemaName('ScenarioDocumentInput')).toBe('scenario document');
		expect(plainSchemaName('DecimalString')).toBe('decimal string');
	});
});

describe('schemaTypeLabel', () => {
	it('names types, enums, lists, references and nullable values in words', () => {
		expect(schemaTypeLabel({ type: 'integer' })).toBe('whole number');
		expect(schemaTypeLabel({ type: 'string', enum: ['csv', 'xlsx'] })).toBe('one of: csv, xlsx');
		expect(schemaTypeLabel({ type: 'array', items: { type: 'number' } })).toBe('list of number');
		expect(schemaTypeLabel({ type: 'array', items: { type: 'object', properties: { low: { type: 'number' } } } })).toBe('list of objects');
		expect(schemaTypeLabel({ $ref: '#/components/schemas/ScenarioDocumentInput' })).toBe('scenario document');
		expect(schemaTypeLabel({ anyOf: [{ $ref: '#/components/schemas/DecimalString' }, { type: 'null' }] })).toBe('decimal string or null');
		expect(schemaTypeLabel({ type: 'string', format: 'binary' })).toBe('file');
		expect(schemaTypeLabel({})).toBe('any JSON value');
	});
});

describe('schemaRules', () => {
	it('states lengths, counts, bounds and the default, leaving out the safe-integer ceiling', () => {
		expect(schemaRules({ type: 'string', minLength: 1, maxLength: 200 })).toBe('1 to 200 characters');
		expect(schemaRules({ type: 'array', minItems: 2, maxItems: 21 })).toBe('2 to 21 items');
		expect(schemaRules({ type: 'integer', minimum: 1, maximum: Number.MAX_SAFE_INTEGER })).toBe('at least 1');
		expect(schemaRules({ type: 'string', default: 'EUR' })).toBe('default: "EUR"');
		expect(schemaRules({ type: 'string' })).toBe('');
	});
});

describe('objectFields', () => {
	it('lists the fields of a request body with whether each is required, following its $ref', () => {
		const fields = objectFields({ $ref: '#/components/schemas/CreateProjectRequest' }, document.components.schemas);
		expect(fields.map((f) => [f.name, f.required])).toEqual([
			['name', true],
			['technology', true],
			['siteName', false],
			['siteDescription', false],
			['currency', false]
		]);
		expect(fields.find((f) => f.name === 'technology')!.type).toBe('one of: tidal-stream, ocean-current, wave');
	});

	it('takes the description of a field from the schema', () => {
		const fields = objectFields({ $ref: '#/components/schemas/EvaluateScenarioRequest' }, document.components.schemas);
		expect(fields).toHaveLength(1);
		expect(fields[0]).toMatchObject({ name: 'document', type: 'scenario document', required: false });
		expect(fields[0].description).toMatch(/unsaved draft/);
	});

	it('writes out the fields of each item of a list of objects', () => {
		const fields = objectFields({ $ref: '#/components/schemas/RunTornadoRequest' }, document.components.schemas);
		const drivers = fields.find((f) => f.name === 'drivers')!;
		expect(drivers.type).toBe('list of objects');
		expect(drivers.itemFields.map((f) => [f.name, f.type, f.required])).toEqual([
			['driver', expect.stringMatching(/^one of: capex, opex, /), true],
			['low', 'number', true],
			['high', 'number', true]
		]);
		expect(drivers.itemFields.every((f) => f.description !== '')).toBe(true);
		expect(fields.find((f) => f.name === 'metric')!.itemFields).toEqual([]);
	});

	it('leaves no field of any request body without a description', () => {
		const bodies = Object.values(document.paths).flatMap((item) =>
			Object.values(item).flatMap((op) => (op.requestBody ? [{ id: op.operationId, schema: Object.values(op.requestBody.content)[0].schema }] : []))
		);
		expect(bodies.length).toBeGreaterThan(8);
		const undescribed = (fields: ReturnType<typeof objectFields>, prefix: string): string[] =>
			fields.flatMap((f) => [...(f.description === '' ? [`${prefix}${f.name}`] : []), ...undescribed(f.itemFields, `${prefix}${f.name}[].`)]);
		expect(bodies.flatMap(({ id, schema }) => undescribed(objectFields(schema, document.components.schemas), `${id}: `))).toEqual([]);
	});
});

describe('apiReference', () => {
	const groups = apiReference(apiOperations, document);

	it('shows every operation once, grouped by tag', () => {
		expect(groups.flatMap((g) => g.operations.map((op) => op.operationId)).sort()).toEqual(apiOperations.map((op) => op.operationId).sort());
		expect(groups.every((g) => g.operations.length > 0)).toBe(true);
	});

	it('writes access, parameters, body and refusals in words', () => {
		const save = groups.flatMap((g) => g.operations).find((op) => op.operationId === 'saveScenario')!;
		expect(save.role).toBe('Analyst or owner');
		expect(save.tokens).toBe('Read-write API tokens only');
		expect(save.parameters).toEqual([expect.objectContaining({ name: 'scenarioId', where: 'path', type: 'id (uuid)', required: true })]);
		expect(save.body?.fields.find((f) => f.name === 'revision')).toMatchObject({ type: 'whole number', required: true });
		expect(save.errors.find((e) => e.status === 409)?.description).toMatch(/saved the scenario since the revision you sent/);

		const exported = groups.flatMap((g) => g.operations).find((op) => op.operationId === 'exportScenario')!;
		expect(exported.parameters.map((p) => [p.name, p.where, p.type])).toEqual([
			['scenarioId', 'path', 'id (uuid)'],
			['format', 'query', 'one of: csv, xlsx'],
			['table', 'query', 'one of: cash-flow, metrics, assumptions']
		]);
		expect(exported.body).toBeNull();
	});

	it("gives each operation's 409 its own words", () => {
		const conflicts = groups.flatMap((g) => g.operations).flatMap((op) => op.errors.filter((e) => e.status === 409).map((e) => [op.operationId, e.description]));
		expect(Object.fromEntries(conflicts)).toEqual({
			updateProject: expect.stringMatching(/project is archived/),
			createScenario: expect.stringMatching(/project is archived/),
			createUpload: expect.stringMatching(/project is archived/),
			saveScenario: expect.stringMatching(/currentRevision.*its project is archived/),
			deleteScenario: expect.stringMatching(/archive it first.*its project is archived/),
			archiveScenario: expect.stringMatching(/project is archived/),
			markBaseCase: expect.stringMatching(/restore it before making it the base case.*its project is archived/),
			downloadRunDraws: expect.stringMatching(/not done yet/),
			cancelRun: expect.stringMatching(/already ended/),
			duplicateScenario: expect.stringMatching(/project is archived/),
			restoreScenario: expect.stringMatching(/project is archived/),
			applyUpload: expect.stringMatching(/currentRevision.*its project is archived/)
		});
		expect(new Set(conflicts.map(([, text]) => text)).size).toBe(conflicts.length);
	});
});
